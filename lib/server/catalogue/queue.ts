import "server-only";
// Producers for the measure and regroup queues (lib/server/jobs.ts; the worker consumes them: workers/main.ts).
import { MEASURE_JOB_OPTS, JOBS, measureJobId, measureQueue, regroupJob, regroupQueue, regroupWindowMs, type MeasureJobData, type RegroupJobData } from "../jobs";

/** Enqueues measuring of samples; idempotent (one job per sample id and measuring version). */
export async function enqueueMeasure(items: MeasureJobData[]): Promise<void> {
  if (!items.length) return;
  for (let i = 0; i < items.length; i += 500) {
    await measureQueue().addBulk(items.slice(i, i + 500).map((data) => ({ name: JOBS.measure.name, data, opts: { ...MEASURE_JOB_OPTS, jobId: measureJobId(data.sampleId) } })));
  }
}

/** How long each library's last regroup took in this process (the worker, which both measures and regroups). */
const regroupCost = new Map<string, number>();
export function noteRegroupDuration(libraryId: string, ms: number): void {
  regroupCost.set(libraryId, ms);
}

/**
 * Asks for a regroup of a library; requests within one window share one job. The window grows with the cost
 * of the library's last regroup (lib/server/jobs.ts regroupWindowMs); elsewhere (a person's relabel) it is short.
 */
export async function enqueueRegroup(data: RegroupJobData): Promise<void> {
  const { jobId, delay } = regroupJob(data.libraryId, Date.now(), regroupWindowMs(regroupCost.get(data.libraryId)));
  await regroupQueue().add(JOBS.regroup.name, data, { jobId, delay, attempts: 5, backoff: { type: "exponential", delay: 1000 }, removeOnComplete: { age: 600 }, removeOnFail: { age: 7 * 24 * 3600 } });
}
