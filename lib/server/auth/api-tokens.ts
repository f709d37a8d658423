import "server-only";
// Personal API tokens: keys a member makes on the account page for scripts (`kitwright upload`). A token is
// scoped to one studio and holds a role chosen at creation, never above the creator's role there; each request
// is served with the lower of that role and the creator's role at that moment (cappedRole), so a demotion or a
// removal takes effect at once. The secret is shown once; only its SHA-256 is kept. A fast unsalted hash is
// enough here because the secret is 256 random bits (crypto.randomBytes): nobody can try 2^256 candidates
// however fast each try is, which is what salts and slow hashes (bcrypt) make up for with passwords people
// choose. An unsalted digest is also what lets a request find its row by one indexed lookup.
// Every request made with a token updates its last use and writes a `token.used` row to the studio's activity
// log (the route wrapper calls recordTokenUse).
import type { Knex } from "knex";
import { db } from "../db";
import { AppError, forbidden, notFound } from "../errors";
import { hashToken, newId, newToken } from "../ids";
import { logActivity } from "../activity";
import { cappedRole, isRole, roleWithin, roleWithArticle, type Role } from "@/lib/permissions";
import type { ApiTokenSummary, CreatedToken } from "@/lib/api-types/tokens";
import type { createTokenSchema } from "@/lib/validation/token";
import type { z } from "zod";

/** Every secret starts so, to be recognised (in a leaked log, say) and told from a session cookie. */
export const TOKEN_PREFIX = "kwt_";
const SECRET_SHAPE = /^kwt_[A-Za-z0-9_-]{43}$/;
const HINT_LENGTH = 8;

const iso = (d: Date | string | null): string | null => (d ? new Date(d).toISOString() : null);

function summary(r: Record<string, any>): ApiTokenSummary {
  const role = r.role as Role;
  return {
    id: r.id,
    name: r.name,
    studioId: r.studio_id,
    studioName: r.studio_name,
    role,
    effectiveRole: cappedRole(role, isRole(r.member_role) ? r.member_role : null),
    hint: r.hint,
    createdAt: iso(r.created_at)!,
    expiresAt: iso(r.expires_at),
    lastUsedAt: iso(r.last_used_at),
    revokedAt: iso(r.revoked_at),
  };
}

function tokensWithMembership(k: Knex) {
  return k("api_tokens as t")
    .join("studios as s", "s.id", "t.studio_id")
    .leftJoin("memberships as m", function (this: Knex.JoinClause) {
      this.on("m.user_id", "t.user_id").andOn("m.studio_id", "t.studio_id");
    })
    .select("t.*", "s.name as studio_name", "m.role as member_role");
}

/** My tokens, newest first, revoked ones too (marked), never a secret. */
export async function listApiTokens({ userId }: { userId: string }): Promise<ApiTokenSummary[]> {
  const rows = await tokensWithMembership(db()).where("t.user_id", userId).orderBy([{ column: "t.created_at", order: "desc" }, { column: "t.id" }]);
  return rows.map(summary);
}

/** Makes a token for a studio I belong to, with a role at most mine there; answers the secret this once. */
export async function createApiToken({ userId, input }: { userId: string; input: z.output<typeof createTokenSchema> }): Promise<CreatedToken> {
  const id = newId();
  const secret = `${TOKEN_PREFIX}${newToken()}`;
  await db().transaction(async (trx) => {
    const m = await trx("memberships").where({ user_id: userId, studio_id: input.studioId }).forUpdate().first("role");
    if (!m || !isRole(m.role)) throw notFound("The studio");
    if (!roleWithin(input.role, m.role))
      throw forbidden(`You are ${roleWithArticle(m.role)} in this studio: a token can hold at most that role, not ${roleWithArticle(input.role)}'s.`);
    const expiresAt = input.expiresInDays === null ? null : new Date(Date.now() + input.expiresInDays * 24 * 3600_000);
    await trx("api_tokens").insert({ id, user_id: userId, studio_id: input.studioId, name: input.name, role: input.role, token_hash: hashToken(secret), hint: secret.slice(0, HINT_LENGTH), expires_at: expiresAt });
    await logActivity(trx, { studioId: input.studioId, actorId: userId, action: "token.created", subjectType: "token", subjectId: id, details: { name: input.name, role: input.role, expiresAt: iso(expiresAt) } });
  });
  const row = await tokensWithMembership(db()).where("t.id", id).first();
  return { token: summary(row), secret };
}

/** Revokes one of my tokens (at once: the next request with it answers 401). Revoking it again changes nothing. */
export async function revokeApiToken({ userId, tokenId }: { userId: string; tokenId: string }): Promise<void> {
  await db().transaction(async (trx) => {
    const t = await trx("api_tokens").where({ id: tokenId, user_id: userId }).forUpdate().first();
    if (!t) throw notFound("The token");
    if (t.revoked_at) return;
    await trx("api_tokens").where({ id: tokenId }).update({ revoked_at: trx.fn.now(3) });
    await logActivity(trx, { studioId: t.studio_id, actorId: userId, action: "token.revoked", subjectType: "token", subjectId: tokenId, details: { name: t.name } });
  });
}

export interface TokenCaller {
  user: { id: string; email: string; name: string };
  token: { id: string; name: string; studioId: string; studioName: string };
  /** The token's role capped by the creator's current role in the token's studio; null when they left it. */
  role: Role | null;
}

/**
 * The person and role a bearer secret stands for, or a 401 saying why not (not a token, unknown, revoked,
 * expired). The role is that in the token's own studio; callers compare the studio of the URL themselves.
 */
export async function tokenCaller(secret: string): Promise<TokenCaller> {
  if (!SECRET_SHAPE.test(secret)) throw new AppError("unauthenticated", `That is not a Kitwright API token (a token starts "${TOKEN_PREFIX}" and is 47 characters long).`);
  const r = await tokensWithMembership(db())
    .join("users as u", "u.id", "t.user_id")
    .where("t.token_hash", hashToken(secret))
    .first("u.email as user_email", "u.name as user_name");
  if (!r) throw new AppError("unauthenticated", "This API token is not known: it may have been deleted, or mistyped.");
  if (r.revoked_at) throw new AppError("unauthenticated", `This API token ("${r.name}") was revoked on ${iso(r.revoked_at)!.slice(0, 10)}. Make a new one on your account page.`);
  if (r.expires_at && new Date(r.expires_at).getTime() <= Date.now())
    throw new AppError("unauthenticated", `This API token ("${r.name}") expired on ${iso(r.expires_at)!.slice(0, 10)}. Make a new one on your account page.`);
  return {
    user: { id: r.user_id, email: r.user_email, name: r.user_name },
    token: { id: r.id, name: r.name, studioId: r.studio_id, studioName: r.studio_name },
    role: cappedRole(r.role, isRole(r.member_role) ? r.member_role : null),
  };
}

/** One use of a token: its last use, and a `token.used` row in its studio's activity log. */
export async function recordTokenUse(caller: TokenCaller, use: { method: string; path: string; status: number }): Promise<void> {
  await db().transaction(async (trx) => {
    await trx("api_tokens").where({ id: caller.token.id }).update({ last_used_at: trx.fn.now(3) });
    await logActivity(trx, {
      studioId: caller.token.studioId,
      actorId: caller.user.id,
      action: "token.used",
      subjectType: "token",
      subjectId: caller.token.id,
      details: { name: caller.token.name, method: use.method, path: use.path.slice(0, 300), status: use.status },
    });
  });
}
