// The worker's maintenance schedule: at start and every 10 minutes (a BullMQ job scheduler with a fixed id, so
// one schedule however many workers run), each module that owns tables or files tidies its own:
// - auth: tokens, sessions ended and sign-in attempts older than a day (lib/server/auth/maintenance.ts);
// - storage: partial upload files and .zip and S3 spools older than an hour (lib/server/storage.ts sweepPartials);
// - catalogue: samples stranded `queued` queued again, libraries changed a while ago and not catalogued since
//   queued for their cataloguing, search words of deleted libraries removed (lib/server/catalogue/maintenance.ts),
//   stored sample files no row names (a process killed between storing a file and recording it) deleted after an
//   hour (lib/server/catalogue/orphans.ts); at start only, samples measured by an older MEASURE_VERSION queued to
//   be measured again (requeueOutdated; they keep their state meanwhile);
// - at start only, the queue and schedule of names no longer used removed (lib/server/jobs.ts retireRenamedJobs).
// Nothing here touches a table or a file itself.
import { Worker } from "bullmq";
import type IORedis from "ioredis";
import { purgeAuthRows } from "@/lib/server/auth/maintenance";
import { sweepPartials } from "@/lib/server/storage";
import { requeueOutdated, requeueStaleCatalogues, requeueStranded, sweepOrphanWords } from "@/lib/server/catalogue/maintenance";
import { sweepOrphanFiles } from "@/lib/server/catalogue/orphans";
import { JOBS, MAINTENANCE_QUEUE, maintenanceQueue, retireRenamedJobs } from "@/lib/server/jobs";

const EVERY_MS = 600_000;

export async function runMaintenance(): Promise<{ tokens: number; attempts: number; sessions: number; partials: number; requeued: number; staleCatalogues: number; orphanWords: number; orphanFiles: number }> {
  const auth = await purgeAuthRows();
  const partials = await sweepPartials();
  const requeued = await requeueStranded();
  const staleCatalogues = await requeueStaleCatalogues();
  const orphanWords = await sweepOrphanWords();
  const orphanFiles = await sweepOrphanFiles();
  return { ...auth, partials, requeued, staleCatalogues, orphanWords, orphanFiles };
}

/**
 * Starts the maintenance consumer, removes the jobs of retired names, schedules the job every 10 minutes, runs one
 * sweep now and queues samples of an older MEASURE_VERSION.
 */
export async function startMaintenance(connection: IORedis): Promise<Worker> {
  // first, so no consumer takes a job of a retired name meanwhile
  const retired = await retireRenamedJobs();
  if (retired) console.log(`[worker] ${retired} job(s) of a retired name removed (their libraries are catalogued again by the sweep)`);
  const worker = new Worker(
    MAINTENANCE_QUEUE,
    async (job) => {
      if (job.name === JOBS.maintenance.name) return runMaintenance();
      throw new Error(`unknown job ${job.name}`);
    },
    { connection, concurrency: 1 },
  );
  worker.on("failed", (job, err) => console.error(`[worker] ${job?.name} failed: ${err.message}`));
  await maintenanceQueue().upsertJobScheduler(JOBS.maintenance.name, { every: EVERY_MS }, { name: JOBS.maintenance.name, data: {} });
  runMaintenance()
    .then((m) => (m.partials || m.requeued || m.staleCatalogues || m.orphanFiles) && console.log(`[worker] start-up sweep: ${m.partials} partial file(s) removed, ${m.requeued} stranded sample(s) queued again, ${m.staleCatalogues} library catalogue(s) queued again, ${m.orphanFiles} stored file(s) without a sample removed`))
    .catch((e) => console.error(`[worker] start-up maintenance failed: ${e.message}`));
  requeueOutdated()
    .then((n) => n && console.log(`[worker] ${n} sample(s) measured by an older MEASURE_VERSION queued to be measured again`))
    .catch((e) => console.error(`[worker] could not queue samples measured by an older version: ${e.message}`));
  return worker;
}
