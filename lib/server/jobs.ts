import "server-only";
// Jobs: queue names, job names and versions, the measure jobs' retry policy and ids, the cataloguing timing,
// and the BullMQ queues on the process's one Redis connection (redis.ts). Producers (the app, the seeds, the
// worker's maintenance) add jobs here; the worker process (workers/main.ts) consumes the same queue names.
import { Queue, type JobsOptions } from "bullmq";
import { MEASURE_VERSION } from "@/lib/audio/version";
import { closeRedis, redis } from "./redis";

export const MAINTENANCE_QUEUE = "kw-maintenance";
export const MEASURE_QUEUE = "kw-measure";
export const CATALOGUE_QUEUE = "kw-catalogue";

export const JOBS = {
  maintenance: { name: "maintenance", version: 1 },
  measure: { name: "measure", version: MEASURE_VERSION },
  catalogue: { name: "catalogue", version: 1 },
} as const;

export interface MeasureJobData { sampleId: string; studioId: string; libraryId: string }
export interface CatalogueJobData { studioId: string; libraryId: string }

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

/** Cataloguings are debounced per library: all requests inside one window share one job, run after it closes. */
export const CATALOGUING_WINDOW_MS = 1500;
export function cataloguingJob(libraryId: string, now = Date.now(), windowMs = CATALOGUING_WINDOW_MS): { jobId: string; delay: number } {
  const bucket = Math.floor(now / windowMs);
  return { jobId: `catalogue-${libraryId}-${windowMs}-${bucket}`, delay: (bucket + 1) * windowMs - now + 100 };
}

/**
 * The window cataloguing requests of a library share, from how long its last cataloguing took (in this process):
 * at least CATALOGUING_WINDOW_MS, and four times the last cataloguing's duration (rounded up to whole base windows,
 * at most a minute), so cataloguings of a large library being measured take at most about a quarter of the
 * worker's time and measuring is not starved (bench/RESULTS.md, finding 9).
 */
export function cataloguingWindowMs(lastCataloguingMs: number | undefined): number {
  const want = Math.ceil((4 * (lastCataloguingMs ?? 0)) / CATALOGUING_WINDOW_MS) * CATALOGUING_WINDOW_MS;
  return Math.min(60_000, Math.max(CATALOGUING_WINDOW_MS, want));
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
export const catalogueQueue = (): Queue => queue(CATALOGUE_QUEUE);

/**
 * Names this code no longer uses, kept only to tidy Redis: the cataloguing queue was called "kw-regroup" (job
 * "regroup"), and the maintenance job "purge-expired". The worker calls retireRenamedJobs at start: it removes the
 * old maintenance schedule and the job it has already queued (a job of that name would fail every 10 minutes)
 * and deletes the old queue with whatever it still holds; what those jobs were to do is done anyway, since the maintenance queues the cataloguing
 * of every library changed since its catalogue (catalogue/maintenance.ts requeueStaleCatalogues).
 */
const RETIRED = { queues: ["kw-regroup"], maintenanceSchedules: ["purge-expired"] } as const;

/** Removes the queues and the schedule of the names above; returns how many jobs of those names were waiting. */
export async function retireRenamedJobs(): Promise<number> {
  let dropped = 0;
  for (const id of RETIRED.maintenanceSchedules) await maintenanceQueue().removeJobScheduler(id);
  const waiting = await maintenanceQueue().getJobs(["waiting", "delayed", "prioritized", "wait"]);
  for (const job of waiting.filter((j) => (RETIRED.maintenanceSchedules as readonly string[]).includes(j.name))) {
    await job.remove();
    dropped++;
  }
  for (const name of RETIRED.queues) {
    const q = new Queue(name, { connection: redis() });
    try {
      const counts = await q.getJobCounts();
      dropped += Object.values(counts).reduce((a, b) => a + b, 0);
      await q.obliterate({ force: true });
    } finally {
      await q.close();
    }
  }
  return dropped;
}

/** Closes the queues and the shared Redis connection (scripts and tests, before they exit). */
export async function closeQueues(): Promise<void> {
  const all = [...queues.values()];
  queues.clear();
  await Promise.all(all.map((q) => q.close()));
  await closeRedis();
}
