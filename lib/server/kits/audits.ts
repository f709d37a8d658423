import "server-only";
// Saved audits: runAudit (lib/audit) over a layout, a kit and the studio's catalogue, stored whole
// (kitwright.audit/v3 content; older rows are upgraded on read) so it can be re-read, exported and compared with a later audit.
import { db } from "../db";
import { AppError, notFound } from "../errors";
import { newId } from "../ids";
import { logActivity } from "../activity";
import { jsonColumn } from "../json-column";
import { runAudit } from "@/lib/audit/audit";
import { AUDIT_RESULT_VERSION, currentAuditResult } from "@/lib/audit/audit-version";
import { diffAudits } from "@/lib/audit/export";
import type { AuditResult } from "@/lib/audit/types";
import type { AuditComparison, AuditRecord, AuditSummaryRow, StudioCatalogueInstrument } from "@/lib/api-types/audits";
import { getKit } from "./kits";
import { getLayout } from "./layouts";
import { loadStudioCatalogue } from "./catalogue-for-audit";
import { loadStudioStrokes } from "../strokes";

const iso = (d: unknown) => new Date(d as string).toISOString();

function summary(r: Record<string, unknown>): AuditSummaryRow {
  return {
    id: r.id as string, layoutId: r.layout_id as string, kitId: (r.kit_id as string) ?? null,
    layoutName: r.layout_name as string, kitName: r.kit_name as string, score: Number(r.score),
    silentPads: Number(r.silent_pads), standInPads: Number(r.stand_in_pads), conflicts: Number(r.conflicts),
    createdAt: iso(r.created_at), createdBy: (r.created_by_name as string) ?? null,
  };
}

/** Run and save an audit of `layoutId` against `kitId` with the studio's current catalogue. */
export async function runAndSaveAudit({ studioId, actorId, layoutId, kitId }: { studioId: string; actorId: string; layoutId: string; kitId: string }): Promise<AuditRecord> {
  const [layout, kit] = await Promise.all([getLayout({ studioId, layoutId }), getKit({ studioId, kitId })]);
  const ids = kit.kit.slots.map((s) => s.instrumentId).filter((x): x is string => !!x);
  // one read of the studio's strokes: the catalogue reader and the audit both take them
  const strokes = await loadStudioStrokes(studioId);
  const catalogue = await loadStudioCatalogue({ studioId, instrumentIds: ids, strokes });
  const result = runAudit(layout.layout, kit.kit, catalogue, { strokes });
  const id = newId();
  await db().transaction(async (trx) => {
    await trx("audits").insert({
      id, studio_id: studioId, layout_id: layoutId, kit_id: kitId, layout_name: layout.name, kit_name: kit.name,
      score: result.score.value, silent_pads: result.summary.silent, stand_in_pads: result.summary.standIn, conflicts: result.summary.conflicts,
      result: JSON.stringify(result), result_version: AUDIT_RESULT_VERSION, created_by: actorId,
    });
    await logActivity(trx, { studioId, actorId, action: "audit.run", subjectType: "audit", subjectId: id, details: { layout: layout.name, kit: kit.name, score: result.score.value, silent: result.summary.silent } });
  });
  return getAudit({ studioId, auditId: id });
}

/**
 * Bring the studio's audits stored in an earlier result shape to today's (currentAuditResult: empty slots
 * grouped, score recomputed from the stored findings), so lists, pages and comparisons read one scale.
 * Cheap when there is nothing to do (an indexed look-up).
 */
export async function upgradeStoredAudits({ studioId }: { studioId: string }): Promise<number> {
  const old = await db()("audits").where("studio_id", studioId).andWhere("result_version", "<", AUDIT_RESULT_VERSION).select("id", "result");
  for (const row of old) {
    const r = currentAuditResult(jsonColumn(row.result));
    await db()("audits").where({ id: row.id, studio_id: studioId }).update({
      score: r.score.value, silent_pads: r.summary.silent, stand_in_pads: r.summary.standIn, conflicts: r.summary.conflicts,
      result: JSON.stringify(r), result_version: AUDIT_RESULT_VERSION,
    });
  }
  return old.length;
}

export async function listAudits({ studioId, layoutId, limit = 200 }: { studioId: string; layoutId?: string; limit?: number }): Promise<AuditSummaryRow[]> {
  await upgradeStoredAudits({ studioId });
  const q = db()("audits as a").leftJoin("users as u", "u.id", "a.created_by").where("a.studio_id", studioId)
    .orderBy([{ column: "a.created_at", order: "desc" }, { column: "a.id", order: "desc" }]).limit(limit)
    .select("a.id", "a.layout_id", "a.kit_id", "a.layout_name", "a.kit_name", "a.score", "a.silent_pads", "a.stand_in_pads", "a.conflicts", "a.created_at", "u.name as created_by_name");
  if (layoutId) q.andWhere("a.layout_id", layoutId);
  return (await q).map(summary);
}

export async function getAudit({ studioId, auditId }: { studioId: string; auditId: string }): Promise<AuditRecord> {
  const r = await db()("audits as a").leftJoin("users as u", "u.id", "a.created_by").where({ "a.studio_id": studioId, "a.id": auditId }).first("a.*", "u.name as created_by_name");
  if (!r) throw notFound("The audit");
  // a row of an earlier version is read in today's shape (its summary columns follow the recomputed result)
  const result: AuditResult = currentAuditResult(jsonColumn(r.result));
  return { ...summary(r), score: result.score.value, silentPads: result.summary.silent, standInPads: result.summary.standIn, conflicts: result.summary.conflicts, result };
}

/** What changed between two audits of the same layout. */
export async function compareAudits({ studioId, before, after }: { studioId: string; before: string; after: string }): Promise<AuditComparison> {
  const [a, b] = await Promise.all([getAudit({ studioId, auditId: before }), getAudit({ studioId, auditId: after })]);
  if (a.layoutId !== b.layoutId) throw new AppError("invalid-input", "Only audits of the same layout can be compared.");
  const { result: ra, ...sa } = a;
  const { result: rb, ...sb } = b;
  return { before: sa, after: sb, diff: diffAudits(ra, rb) };
}

/** The catalogue entries the audit's findings name, with their libraries (for audition). */
export async function auditSounds({ studioId, auditId }: { studioId: string; auditId: string }): Promise<StudioCatalogueInstrument[]> {
  const a = await getAudit({ studioId, auditId });
  const ids = new Set<string>();
  for (const p of a.result.pads) if (p.instrumentId) ids.add(p.instrumentId);
  for (const z of a.result.pedal?.zones ?? []) if (z.instrumentId) ids.add(z.instrumentId);
  if (a.result.pedal?.chick?.instrumentId) ids.add(a.result.pedal.chick.instrumentId);
  return loadStudioCatalogue({ studioId, instrumentIds: [...ids] });
}
