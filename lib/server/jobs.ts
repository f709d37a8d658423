import "server-only";
// Jobs: queue names, job names and versions, the measure jobs' retry policy and ids, the regroup timing, and
// the BullMQ queues on the process's one Redis connection (redis.ts). Producers (the app, the seeds, the
// worker's maintenance) add jobs here; the worker process (workers/main.ts) consumes the same queue names.
import { Queue, type JobsOptions } from "bullmq";
import { MEASURE_VERSION } from "@/lib/audio/version";
import { closeRedis, redis } from "./redis";

export const MAINTENANCE_QUEUE = "kw-maintenance";
export const MEASURE_QUEUE = "kw-measure";
export const REGROUP_QUEUE = "kw-regroup";

export const JOBS = {
  purgeExpired: { name: "purge-expired", version: 1 },
  measure: { name: "measure", version: MEASURE_VERSION },
  regroup: { name: "regroup", version: 1 },
} as const;

export interface MeasureJobData { sampleId: string; studioId: string; libraryId: string }
export interface RegroupJobData { studioId: string; libraryId: string }

/** Attempts and backoff of a measure job: 3 tries, 2 s then 4 s apart. */
export const MEASURE_ATTEMPTS = 3;
export const MEASURE_JOB_OPTS: JobsOptions = {
  attempts: MEASURE_ATTEMPTS,
  backoff: { type: "exponential", delay: 2000 },
  removeOnComplete: { age: 3600, count: 20_000 },
  removeOnFail: { age: 7 * 24 * 3600 },
};

/** Idempotent key: one job per sample and measuring version. */
export const measureJobId = (sampleId: string) => `measure:${sampleId}:${MEASURE_VERSION}`;

/** Regroups are debounced per library: all requests inside one window share one job, run after it closes. */
export const REGROUP_WINDOW_MS = 1500;
export function regroupJob(libraryId: string, now = Date.now(), windowMs = REGROUP_WINDOW_MS): { jobId: string; delay: number } {
  const bucket = Math.floor(now / windowMs);
  return { jobId: `regroup-${libraryId}-${windowMs}-${bucket}`, delay: (bucket + 1) * windowMs - now + 100 };
}

/**
 * The window regroup requests of a library share, from how long its last regroup took (in this process): at
 * least REGROUP_WINDOW_MS, and four times the last regroup's duration (rounded up to whole base windows, at most
 * a minute), so regroups of a large library being measured take at most about a quarter of the worker's time
 * and measuring is not starved (a 4,700-sample library takes about 2 s to regroup here).
 */
export function regroupWindowMs(lastRegroupMs: number | undefined): number {
  const want = Math.ceil((4 * (lastRegroupMs ?? 0)) / REGROUP_WINDOW_MS) * REGROUP_WINDOW_MS;
  return Math.min(60_000, Math.max(REGROUP_WINDOW_MS, want));
}

const queues = new Map<string, Queue>();
function queue(name: string): Queue {
  let q = queues.get(name);
  if (!q) {
    q = new Queue(name, { connection: redis() });
    queues.set(name, q);
  }
  return q;
}
export const maintenanceQueue = (): Queue => queue(MAINTENANCE_QUEUE);
export const measureQueue = (): Queue => queue(MEASURE_QUEUE);
export const regroupQueue = (): Queue => queue(REGROUP_QUEUE);

/** Closes the queues and the shared Redis connection (scripts and tests, before they exit). */
export async function closeQueues(): Promise<void> {
  const all = [...queues.values()];
  queues.clear();
  await Promise.all(all.map((q) => q.close()));
  await closeRedis();
}
