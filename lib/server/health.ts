import "server-only";
// Health of the services the app depends on, each probed with a short time limit.
import { db } from "./db";
import { redis } from "./redis";
import { storage } from "./storage";

type Status = { ok: boolean; ms: number; error?: string };

async function probe(fn: () => Promise<unknown>, timeoutMs = 2000): Promise<Status> {
  const t0 = performance.now();
  try {
    await Promise.race([fn(), new Promise((_, rej) => setTimeout(() => rej(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs))]);
    return { ok: true, ms: Math.round(performance.now() - t0) };
  } catch (e) {
    return { ok: false, ms: Math.round(performance.now() - t0), error: e instanceof Error ? e.message : String(e) };
  }
}

export async function checkHealth() {
  const [database, queue, files] = await Promise.all([
    probe(() => db().raw("SELECT 1")),
    probe(async () => {
      const r = redis();
      if (r.status === "wait" || r.status === "end") await r.connect().catch(() => undefined);
      if ((await r.ping()) !== "PONG") throw new Error("unexpected reply");
    }),
    probe(() => storage().check()),
  ]);
  return { ok: database.ok && queue.ok && files.ok, database, redis: queue, storage: { ...files, kind: storage().kind } };
}
