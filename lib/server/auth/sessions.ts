import "server-only";
// Sessions that can be ended. Signing in makes a `sessions` row; the session cookie (a next-auth JWT, signed
// and encrypted with NEXTAUTH_SECRET) carries the user id and that row's id. Every request (the route wrapper,
// the pages' currentUser) reads the user through the row, so a session ends the moment its row is revoked:
// signing out revokes this device's row, a password reset and removal from a studio revoke all of the account's.
import type { Knex } from "knex";
import type { JWT } from "next-auth/jwt";
import { db } from "../db";
import { newId } from "../ids";
import type { SessionUser } from "@/lib/api-types/account";

/** How long a session lasts after signing in (the cookie's lifetime too). */
export const SESSION_MAX_AGE_S = 7 * 24 * 3600;

/** Starts a session for the user; returns its id (kept in the session cookie). */
export async function startSession(userId: string): Promise<string> {
  const id = newId();
  await db()("sessions").insert({ id, user_id: userId, expires_at: new Date(Date.now() + SESSION_MAX_AGE_S * 1000) });
  return id;
}

/** Ends one session (signing out on this device). */
export async function endSession(sessionId: string): Promise<void> {
  await db()("sessions").where({ id: sessionId }).whereNull("revoked_at").update({ revoked_at: db().fn.now(3) });
}

/** Ends every session of the account (password reset, removal from a studio), inside the caller's transaction. */
export async function endAllSessions(k: Knex | Knex.Transaction, userId: string): Promise<number> {
  return k("sessions").where({ user_id: userId }).whereNull("revoked_at").update({ revoked_at: db().fn.now(3) });
}

/**
 * The user of a decoded session cookie while its session is live, and, when a studio is named, their role in
 * it: one query for all three. Null for a cookie without a session id (made before sessions could end), a
 * revoked or expired session, or a user who is gone.
 */
export async function liveSessionUser(token: JWT | null, studioId: string | null = null): Promise<{ user: SessionUser; role: string | null } | null> {
  const uid = typeof token?.uid === "string" ? token.uid : null;
  const sid = typeof token?.sid === "string" ? token.sid : null;
  if (!uid || !sid) return null;
  const q = db()("sessions as s")
    .join("users as u", "u.id", "s.user_id")
    .where({ "s.id": sid, "s.user_id": uid })
    .whereNull("s.revoked_at")
    .andWhere("s.expires_at", ">", new Date());
  if (studioId)
    q.leftJoin("memberships as m", function (this: Knex.JoinClause) {
      this.on("m.user_id", "u.id").andOnVal("m.studio_id", studioId);
    });
  const r = await q.first(["u.id", "u.email", "u.name", studioId ? "m.role" : db().raw("NULL as role")]);
  return r ? { user: { id: r.id, email: r.email, name: r.name }, role: r.role ?? null } : null;
}

/** Removes sessions that ended more than a day ago (the worker's maintenance). */
export async function purgeSessions(now = new Date()): Promise<number> {
  const dayAgo = new Date(now.getTime() - 24 * 3600_000);
  return db()("sessions").where("expires_at", "<", dayAgo).orWhere("revoked_at", "<", dayAgo).delete();
}
