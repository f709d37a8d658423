// Requests and answers of the personal API token routes (/api/me/tokens, /api/me/tokens/:id), of
// GET /api/whoami (who a request acts as) and of the hash lookup (POST .../libraries/:id/samples/by-hash).
// Types only, shared by lib/server, components/data and the command line.
import type { z } from "zod";
import type { Role } from "@/lib/permissions";
import type { createTokenSchema, hashLookupSchema } from "@/lib/validation/token";

/** One of my tokens as the account page lists it (never the secret). */
export interface ApiTokenSummary {
  id: string;
  name: string;
  studioId: string;
  studioName: string;
  /** The role chosen at creation. */
  role: Role;
  /** What the token can do now: the lower of `role` and my role in the studio; null when I left it. */
  effectiveRole: Role | null;
  /** The first characters of the secret, to tell tokens apart. */
  hint: string;
  createdAt: string;
  expiresAt: string | null;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** GET /api/me/tokens */
export interface ApiTokenList {
  tokens: ApiTokenSummary[];
}

/** POST /api/me/tokens */
export type CreateTokenBody = z.input<typeof createTokenSchema>;
/** The answer carries the secret: it is shown this once and never again (only its SHA-256 is kept). */
export interface CreatedToken {
  token: ApiTokenSummary;
  secret: string;
}

/** GET /api/whoami: the person a request acts for and, for a personal API token, its studio and role. */
export interface Whoami {
  user: { id: string; name: string; email: string };
  via: "session" | "token";
  token: { id: string; name: string; studioId: string; studioName: string; role: Role | null } | null;
}

/** POST /api/studios/:s/libraries/:l/samples/by-hash */
export type HashLookupBody = z.input<typeof hashLookupSchema>;
export interface HashLookupAnswer {
  /** The digests the library already holds (each once, lower case), with the sample that holds it. */
  known: { sha256: string; sampleId: string; path: string }[];
}
