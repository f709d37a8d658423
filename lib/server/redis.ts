import "server-only";
// The Redis connection used by BullMQ queues and the health check (one per process).
import IORedis from "ioredis";
import { env } from "./env";

const g = globalThis as unknown as { __kwRedis?: IORedis };

export function redis(): IORedis {
  if (!g.__kwRedis) {
    g.__kwRedis = new IORedis(env().KW_REDIS_URL, { maxRetriesPerRequest: null, lazyConnect: true, enableOfflineQueue: true });
    g.__kwRedis.on("error", () => undefined); // reported by health checks and job calls, not as unhandled events
  }
  return g.__kwRedis;
}

export async function closeRedis(): Promise<void> {
  if (g.__kwRedis) {
    const r = g.__kwRedis;
    g.__kwRedis = undefined;
    r.disconnect();
  }
}
