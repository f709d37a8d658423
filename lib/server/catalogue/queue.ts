import "server-only";
// Producers for the measure and regroup queues (the worker consumes them: workers/main.ts).
import { MEASURE_JOB_OPTS, JOBS, measureJobId, measureQueue, regroupJob, regroupQueue, type MeasureJobData, type RegroupJobData } from "@/workers/jobs";

/** Enqueues measuring of samples; idempotent (one job per sample id and measuring version). */
export async function enqueueMeasure(items: MeasureJobData[]): Promise<void> {
  if (!items.length) return;
  for (let i = 0; i < items.length; i += 500) {
    await measureQueue().addBulk(items.slice(i, i + 500).map((data) => ({ name: JOBS.measure.name, data, opts: { ...MEASURE_JOB_OPTS, jobId: measureJobId(data.sampleId) } })));
  }
}

/** Asks for a regroup of a library; requests within one short window share one job. */
export async function enqueueRegroup(data: RegroupJobData): Promise<void> {
  const { jobId, delay } = regroupJob(data.libraryId);
  await regroupQueue().add(JOBS.regroup.name, data, { jobId, delay, attempts: 5, backoff: { type: "exponential", delay: 1000 }, removeOnComplete: { age: 600 }, removeOnFail: { age: 7 * 24 * 3600 } });
}
