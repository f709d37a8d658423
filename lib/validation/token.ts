// Shared zod schemas for personal API tokens and the hash lookup the command line asks before uploading.
import { z } from "zod";
import { idParam, roleSchema } from "./studio";

export const TOKEN_LIFETIMES_DAYS = [7, 30, 90, 365] as const;

/** Create a token: a name to tell it apart, its studio, its role there (at most mine), a lifetime or none. */
export const createTokenSchema = z.strictObject({
  name: z.string().trim().min(1, "Name the token (what will use it).").max(120, "At most 120 characters."),
  studioId: idParam,
  role: roleSchema,
  /** Days until it stops working; null: until revoked. */
  expiresInDays: z.number().int().min(1).max(365).nullable().default(90),
});

export const tokenParams = z.strictObject({ tokenId: idParam });

/** A SHA-256 digest in hexadecimal (FIPS 180-4: 256 bits, 64 hex digits), read in lower case. */
export const sha256Hex = z
  .string()
  .regex(/^[0-9a-fA-F]{64}$/, "A SHA-256 digest is 64 hexadecimal digits.")
  .transform((s) => s.toLowerCase());

/** At most this many digests in one lookup. */
export const MAX_HASH_LOOKUP = 1000;
export const hashLookupSchema = z.strictObject({
  sha256: z.array(sha256Hex).min(1, "Send at least one digest.").max(MAX_HASH_LOOKUP, `At most ${MAX_HASH_LOOKUP} digests at once.`),
});
