// The worker process: consumes Kitwright's BullMQ queues. Run with
// `node --conditions=react-server --import tsx workers/main.ts` (the condition lets server-only modules load).
import { Worker } from "bullmq";
import { env } from "@/lib/server/env";
import { closeDb } from "@/lib/server/db";
import { JOBS, MAINTENANCE_QUEUE, maintenanceQueue } from "./jobs";
import { runMaintenance } from "./maintenance";

async function main() {
  const connection = { url: env().KW_REDIS_URL, maxRetriesPerRequest: null };
  const maintenance = new Worker(
    MAINTENANCE_QUEUE,
    async (job) => {
      if (job.name === JOBS.purgeExpired.name) return runMaintenance();
      throw new Error(`unknown job ${job.name}`);
    },
    { connection, concurrency: 1 },
  );
  maintenance.on("failed", (job, err) => console.error(`[worker] ${job?.name} failed: ${err.message}`));
  // Hourly clean-up of used or expired tokens and old sign-in attempts (deterministic scheduler id).
  await maintenanceQueue().upsertJobScheduler(JOBS.purgeExpired.name, { every: 3600_000 }, { name: JOBS.purgeExpired.name, data: {} });
  console.log(`[worker] ready on ${env().KW_REDIS_URL}`);

  const stop = async () => {
    await maintenance.close();
    await maintenanceQueue().close();
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
