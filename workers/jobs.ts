// Job definitions: queue names, job names and versions, shared by producers (the app) and the worker.
import { Queue } from "bullmq";
import { env } from "@/lib/server/env";

export const MAINTENANCE_QUEUE = "kw-maintenance";

export const JOBS = {
  purgeExpired: { name: "purge-expired", version: 1 },
} as const;

let q: Queue | undefined;
export function maintenanceQueue(): Queue {
  if (!q) q = new Queue(MAINTENANCE_QUEUE, { connection: { url: env().KW_REDIS_URL, maxRetriesPerRequest: null } });
  return q;
}
