// Maintenance job: deletes auth tokens that are used or expired for more than a day, and sign-in attempts
// older than a day (the rate limit looks back 15 minutes).
import { db } from "@/lib/server/db";

export async function runMaintenance(now = new Date()): Promise<{ tokens: number; attempts: number }> {
  const dayAgo = new Date(now.getTime() - 24 * 3600_000);
  const tokens = await db()("auth_tokens").where("expires_at", "<", dayAgo).orWhere("used_at", "<", dayAgo).delete();
  const attempts = await db()("sign_in_attempts").where("created_at", "<", dayAgo).delete();
  return { tokens, attempts };
}
