import "server-only";
// Redis: the one connection factory (URL from env.ts, the options BullMQ needs) and the process's one shared
// connection built by it, used by the health check, the BullMQ queues (lib/server/jobs.ts) and the worker
// process's BullMQ workers (which duplicate it for their blocking reads, as BullMQ does with a given client).
import IORedis from "ioredis";
import { env } from "./env";

const g = globalThis as unknown as { __kwRedis?: IORedis };

/**
 * A new Redis connection: connects on first use, and while Redis is away queues commands until it returns
 * (maxRetriesPerRequest null, as BullMQ requires; an upload made meanwhile is recorded and its jobs wait).
 */
export function redisConnection(): IORedis {
  const r = new IORedis(env().KW_REDIS_URL, { maxRetriesPerRequest: null, lazyConnect: true, enableOfflineQueue: true });
  r.on("error", () => undefined); // reported by health checks and job calls, not as unhandled events
  return r;
}

/** The process's shared connection (made once, cached on globalThis so hot reload does not open more). */
export function redis(): IORedis {
  if (!g.__kwRedis) g.__kwRedis = redisConnection();
  return g.__kwRedis;
}

export async function closeRedis(): Promise<void> {
  if (g.__kwRedis) {
    const r = g.__kwRedis;
    g.__kwRedis = undefined;
    r.disconnect();
  }
}
