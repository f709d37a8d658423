import "server-only";
// The activity log: one row per change in a studio (who, what, when).
import type { Knex } from "knex";
import { db } from "./db";
import { jsonColumn } from "./json-column";
import type { ActivityEntry } from "@/lib/api-types/activity";

export async function logActivity(
  trx: Knex | Knex.Transaction,
  e: { studioId: string; actorId: string | null; action: string; subjectType?: string; subjectId?: string; details?: Record<string, unknown> },
): Promise<void> {
  await trx("activity").insert({
    studio_id: e.studioId,
    actor_id: e.actorId,
    action: e.action,
    subject_type: e.subjectType ?? null,
    subject_id: e.subjectId ?? null,
    details: e.details ? JSON.stringify(e.details) : null,
  });
}

export async function listActivity({ studioId, before, limit }: { studioId: string; before?: number; limit: number }): Promise<ActivityEntry[]> {
  const q = db()("activity as a")
    .leftJoin("users as u", "u.id", "a.actor_id")
    .where("a.studio_id", studioId)
    .orderBy("a.id", "desc")
    .limit(limit)
    .select("a.*", "u.name as actor_name");
  if (before) q.andWhere("a.id", "<", before);
  const rows = await q;
  return rows.map((r) => ({
    id: Number(r.id),
    studioId: r.studio_id,
    actorId: r.actor_id,
    actorName: r.actor_name ?? null,
    action: r.action,
    subjectType: r.subject_type,
    subjectId: r.subject_id,
    details: r.details ? jsonColumn(r.details) : null,
    createdAt: new Date(r.created_at).toISOString(),
  }));
}
