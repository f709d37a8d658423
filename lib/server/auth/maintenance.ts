import "server-only";
// Upkeep of the auth tables, run by the worker's maintenance schedule (workers/maintenance.ts): tokens used or
// expired for more than a day, sessions ended more than a day ago (sessions.ts purgeSessions), and sign-in
// attempts older than a day (the rate limit looks back 15 minutes).
import { db } from "../db";
import { purgeSessions } from "./sessions";

const DAY = 24 * 3600_000;

export async function purgeAuthRows(now = new Date()): Promise<{ tokens: number; attempts: number; sessions: number }> {
  const dayAgo = new Date(now.getTime() - DAY);
  const tokens = await db()("auth_tokens").where("expires_at", "<", dayAgo).orWhere("used_at", "<", dayAgo).delete();
  const attempts = await db()("sign_in_attempts").where("created_at", "<", dayAgo).delete();
  const sessions = await purgeSessions(now);
  return { tokens, attempts, sessions };
}
