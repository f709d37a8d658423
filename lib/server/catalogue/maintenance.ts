import "server-only";
// Upkeep of the catalogue's tables, run by the worker's maintenance schedule (workers/maintenance.ts):
// - samples still `queued` a few minutes after their last change have their measure job queued again: an
//   upload recorded while Redis was away, or a job lost with Redis's data, would otherwise wait for ever. Job
//   ids are deterministic (sample id + MEASURE_VERSION), so a job that is still there is not doubled;
// - libraries whose catalogue is older than a change made a few minutes ago (a sample measured and not yet
//   catalogued, or relabelled) have their cataloguing queued again: a job lost with Redis's data, or one left in
//   a queue of an older name (lib/server/jobs.ts retireRenamedJobs), would otherwise leave them waiting;
// - search words of libraries that no longer exist are removed (words.ts sweepOrphanWords);
// - at worker start only (requeueOutdated): samples measured by an older MEASURE_VERSION have their measure job
//   queued, so a new version of the measuring code reaches the stored samples; they keep their state (measured or
//   catalogued) while they are measured again (measure.ts).
import { MEASURE_VERSION } from "@/lib/audio/version";
import { MEASURED_STATES } from "@/lib/validation/library";
import { db } from "../db";
import { enqueueCataloguing, enqueueMeasure } from "./queue";
import { sweepOrphanWords as sweepWords } from "./words";

/** Queues the measure job again for samples left `queued` for more than `olderThanMs`. */
export async function requeueStranded({ olderThanMs = 5 * 60_000, now = Date.now() } = {}): Promise<number> {
  const rows = await db()("samples").where({ state: "queued" }).andWhere("updated_at", "<", new Date(now - olderThanMs)).limit(50_000).select("id", "studio_id", "library_id");
  await enqueueMeasure(rows.map((r) => ({ sampleId: r.id, studioId: r.studio_id, libraryId: r.library_id })));
  return rows.length;
}

/**
 * Queues the cataloguing of every library with a measured sample that changed after the library's catalogue was
 * read (or that has no catalogue yet), when that change is older than `olderThanMs`: its own job should have run
 * by then. Returns how many libraries.
 */
export async function requeueStaleCatalogues({ olderThanMs = 5 * 60_000, now = Date.now() } = {}): Promise<number> {
  const rows: { id: string; studio_id: string }[] = await db()("libraries as l")
    .leftJoin("library_health as h", "h.library_id", "l.id")
    .whereExists((q) =>
      q.select(db().raw("1")).from("samples as s")
        .whereRaw("s.library_id = l.id")
        .whereIn("s.state", MEASURED_STATES)
        .andWhere("s.updated_at", "<", new Date(now - olderThanMs))
        .andWhere((w) => w.whereNull("h.computed_at").orWhereRaw("s.updated_at > h.computed_at")),
    )
    .select("l.id", "l.studio_id");
  for (const r of rows) await enqueueCataloguing({ studioId: r.studio_id, libraryId: r.id });
  return rows.length;
}

/**
 * Queues the measure job for every sample measured (or refused) by an older MEASURE_VERSION, walking the samples
 * in pages by id. Run when the worker starts: a new version arrives with new code. Returns how many were queued.
 */
export async function requeueOutdated({ pageSize = 5000 } = {}): Promise<number> {
  let after = "", total = 0;
  for (;;) {
    const rows: { id: string; studio_id: string; library_id: string }[] = await db()("samples")
      .whereIn("state", [...MEASURED_STATES, "rejected"])
      .andWhere((q) => q.whereNull("measure_version").orWhere("measure_version", "<", MEASURE_VERSION))
      .andWhere("id", ">", after)
      .orderBy("id")
      .limit(pageSize)
      .select("id", "studio_id", "library_id");
    if (!rows.length) return total;
    await enqueueMeasure(rows.map((r) => ({ sampleId: r.id, studioId: r.studio_id, libraryId: r.library_id })));
    total += rows.length;
    after = rows[rows.length - 1]!.id;
    if (rows.length < pageSize) return total;
  }
}

/** Removes the search words of libraries that no longer exist; returns how many rows. */
export const sweepOrphanWords = (): Promise<number> => sweepWords(db());
