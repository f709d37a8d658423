// The worker process: consumes Kitwright's BullMQ queues. Run with
// `node --conditions=react-server --import tsx workers/main.ts` (the condition lets server-only modules load).
// Only wiring: the queues, the Redis connection and the jobs' work live in lib/server, the measuring in
// lib/audio (measureWav) on the thread pool of lib/audio-pool, the maintenance schedule in ./maintenance.ts.
// Measure jobs run one per core (concurrency = os.availableParallelism()) on the pool's threads, so the event
// loop stays free for lock renewals; cataloguings run one at a time per process (they lock their library).
import os from "node:os";
import { Worker, type Job } from "bullmq";
import { MeasurePool } from "@/lib/audio-pool/pool";
import { env } from "@/lib/server/env";
import { closeDb } from "@/lib/server/db";
import { redis } from "@/lib/server/redis";
import { closeQueues, MEASURE_QUEUE, CATALOGUE_QUEUE, type MeasureJobData, type CatalogueJobData } from "@/lib/server/jobs";
import { measureSample, rejectSample, RetryableMeasureError } from "@/lib/server/catalogue/measure";
import { runCataloguingJob } from "@/lib/server/catalogue/catalogue-library";
import { startMaintenance } from "./maintenance";

async function main() {
  const connection = redis();
  const cores = os.availableParallelism();
  const pool = new MeasurePool(env().KW_MEASURE_THREADS ?? cores);
  // A worker killed mid-job leaves its jobs locked; they return to the queue once the lock expires.
  const lockOpts = { lockDuration: 15_000, stalledInterval: 5_000, maxStalledCount: 3 };

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

  // a job whose worker died (its lock ran out) is back in the queue: said once per job, for the operator
  measure.on("stalled", (jobId) => console.warn(`[worker] measure job ${jobId} stalled (its worker stopped); queued again`));
  const cataloguing = new Worker<CatalogueJobData>(CATALOGUE_QUEUE, (job: Job<CatalogueJobData>) => runCataloguingJob(job.data), { connection, concurrency: 1, ...lockOpts, lockDuration: 60_000 });
  cataloguing.on("failed", (job, err) => console.error(`[worker] cataloguing ${job?.data.libraryId} failed: ${err.message}`));
  cataloguing.on("stalled", (jobId) => console.warn(`[worker] cataloguing job ${jobId} stalled (its worker stopped); queued again`));

  const maintenance = await startMaintenance(connection);
  console.log(`[worker] ready on ${env().KW_REDIS_URL}: measuring ${cores} at a time on ${pool.size} thread(s)`);

  const stop = async () => {
    await Promise.all([maintenance.close(), measure.close(), cataloguing.close()]);
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
