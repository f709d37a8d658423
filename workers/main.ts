// The worker process: consumes Kitwright's BullMQ queues. Run with
// `node --conditions=react-server --import tsx workers/main.ts` (the condition lets server-only modules load).
// Measure jobs run one per core (concurrency = os.availableParallelism()) on a pool of worker threads, so the
// event loop stays free for lock renewals; regroups run one at a time per process (they lock their library).
import os from "node:os";
import { Worker, type Job } from "bullmq";
import { env } from "@/lib/server/env";
import { closeDb } from "@/lib/server/db";
import { measureSample, rejectSample, RetryableMeasureError } from "@/lib/server/catalogue/measure";
import { regroupLibrary } from "@/lib/server/catalogue/regroup";
import { noteRegroupDuration } from "@/lib/server/catalogue/queue";
import { closeQueues, JOBS, MAINTENANCE_QUEUE, maintenanceQueue, MEASURE_QUEUE, REGROUP_QUEUE, type MeasureJobData, type RegroupJobData } from "./jobs";
import { runMaintenance } from "./maintenance";
import { MeasurePool } from "@/lib/audio-pool/pool";

async function main() {
  const connection = { url: env().KW_REDIS_URL, maxRetriesPerRequest: null };
  const cores = os.availableParallelism();
  const pool = new MeasurePool(env().KW_MEASURE_THREADS ?? cores);
  // A worker killed mid-job leaves its jobs locked; they return to the queue once the lock expires.
  const lockOpts = { lockDuration: 15_000, stalledInterval: 5_000, maxStalledCount: 3 };

  const maintenance = new Worker(
    MAINTENANCE_QUEUE,
    async (job) => {
      if (job.name === JOBS.purgeExpired.name) return runMaintenance();
      throw new Error(`unknown job ${job.name}`);
    },
    { connection, concurrency: 1 },
  );
  maintenance.on("failed", (job, err) => console.error(`[worker] ${job?.name} failed: ${err.message}`));

  const measure = new Worker<MeasureJobData>(
    MEASURE_QUEUE,
    async (job: Job<MeasureJobData>) => {
      const out = await measureSample({ sampleId: job.data.sampleId, studioId: job.data.studioId }, (bytes) => pool.measureWav(bytes));
      return { outcome: out };
    },
    { connection, concurrency: cores, ...lockOpts },
  );
  measure.on("failed", async (job, err) => {
    if (!job) return;
    const attempts = job.opts.attempts ?? 1;
    console.error(`[worker] measure ${job.data.sampleId} failed (attempt ${job.attemptsMade}/${attempts}): ${err.message}`);
    if (job.attemptsMade >= attempts) {
      // failed for good: the sample is rejected with the reason, never left hanging
      const reason = err instanceof RetryableMeasureError || err.message ? `measuring failed ${attempts} times: ${err.message}` : "measuring failed";
      await rejectSample({ sampleId: job.data.sampleId, studioId: job.data.studioId, code: "failed", reason }).catch((e) => console.error(`[worker] could not reject ${job.data.sampleId}: ${e.message}`));
    }
  });

  const regroup = new Worker<RegroupJobData>(
    REGROUP_QUEUE,
    async (job: Job<RegroupJobData>) => {
      const t0 = performance.now();
      const out = await regroupLibrary(job.data);
      noteRegroupDuration(job.data.libraryId, performance.now() - t0);
      return out;
    },
    { connection, concurrency: 1, ...lockOpts, lockDuration: 60_000 },
  );
  regroup.on("failed", (job, err) => console.error(`[worker] regroup ${job?.data.libraryId} failed: ${err.message}`));

  // Maintenance (workers/maintenance.ts) at start and every 10 minutes (deterministic scheduler id).
  await maintenanceQueue().upsertJobScheduler(JOBS.purgeExpired.name, { every: 600_000 }, { name: JOBS.purgeExpired.name, data: {} });
  runMaintenance()
    .then((m) => (m.partials || m.requeued) && console.log(`[worker] start-up sweep: ${m.partials} partial file(s) removed, ${m.requeued} stranded sample(s) queued again`))
    .catch((e) => console.error(`[worker] start-up maintenance failed: ${e.message}`));
  console.log(`[worker] ready on ${env().KW_REDIS_URL}: measuring ${cores} at a time on ${pool.size} thread(s)`);

  const stop = async () => {
    await Promise.all([maintenance.close(), measure.close(), regroup.close()]);
    await closeQueues();
    await pool.close();
    await closeDb();
    process.exit(0);
  };
  process.on("SIGTERM", stop);
  process.on("SIGINT", stop);
}

main().catch((e) => {
  console.error(`[worker] could not start: ${e instanceof Error ? e.message : String(e)}`);
  process.exit(1);
});
