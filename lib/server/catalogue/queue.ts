import "server-only";
// Producers for the measure and cataloguing queues (lib/server/jobs.ts; the worker consumes them: workers/main.ts).
import { MEASURE_JOB_OPTS, JOBS, measureJobId, measureQueue, cataloguingJob, catalogueQueue, cataloguingWindowMs, type MeasureJobData, type CatalogueJobData } from "../jobs";

/** Enqueues measuring of samples; idempotent (one job per sample id and measuring version). */
export async function enqueueMeasure(items: MeasureJobData[]): Promise<void> {
  if (!items.length) return;
  for (let i = 0; i < items.length; i += 500) {
    await measureQueue().addBulk(items.slice(i, i + 500).map((data) => ({ name: JOBS.measure.name, data, opts: { ...MEASURE_JOB_OPTS, jobId: measureJobId(data.sampleId) } })));
  }
}

/** How long each library's last cataloguing took in this process (the worker, which both measures and catalogues). */
const cataloguingCost = new Map<string, number>();
export function noteCataloguingDuration(libraryId: string, ms: number): void {
  cataloguingCost.set(libraryId, ms);
}

/**
 * Asks for a cataloguing of a library; requests within one window share one job. The window grows with the cost
 * of the library's last cataloguing (lib/server/jobs.ts cataloguingWindowMs); elsewhere (a person's relabel) it is
 * short.
 */
export async function enqueueCataloguing(data: CatalogueJobData): Promise<void> {
  const { jobId, delay } = cataloguingJob(data.libraryId, Date.now(), cataloguingWindowMs(cataloguingCost.get(data.libraryId)));
  await catalogueQueue().add(JOBS.catalogue.name, data, { jobId, delay, attempts: 5, backoff: { type: "exponential", delay: 1000 }, removeOnComplete: { age: 600 }, removeOnFail: { age: 7 * 24 * 3600 } });
}
