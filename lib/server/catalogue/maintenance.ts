import "server-only";
// Upkeep of the catalogue's tables, run by the worker's maintenance schedule (workers/maintenance.ts):
// - samples still `queued` a few minutes after their last change have their measure job queued again: an
//   upload recorded while Redis was away, or a job lost with Redis's data, would otherwise wait for ever. Job
//   ids are deterministic (sample id + MEASURE_VERSION), so a job that is still there is not doubled;
// - search words of libraries that no longer exist are removed (words.ts sweepOrphanWords).
import { db } from "../db";
import { enqueueMeasure } from "./queue";
import { sweepOrphanWords as sweepWords } from "./words";

/** Queues the measure job again for samples left `queued` for more than `olderThanMs`. */
export async function requeueStranded({ olderThanMs = 5 * 60_000, now = Date.now() } = {}): Promise<number> {
  const rows = await db()("samples").where({ state: "queued" }).andWhere("updated_at", "<", new Date(now - olderThanMs)).limit(50_000).select("id", "studio_id", "library_id");
  await enqueueMeasure(rows.map((r) => ({ sampleId: r.id, studioId: r.studio_id, libraryId: r.library_id })));
  return rows.length;
}

/** Removes the search words of libraries that no longer exist; returns how many rows. */
export const sweepOrphanWords = (): Promise<number> => sweepWords(db());
