import "server-only";
// Identifiers and secret tokens. Tokens are sent to people once and stored only as SHA-256 hashes.
import crypto from "node:crypto";

export const newId = (): string => crypto.randomUUID();
export const newToken = (): string => crypto.randomBytes(32).toString("base64url");
export const hashToken = (token: string): string => crypto.createHash("sha256").update(token).digest("hex");
