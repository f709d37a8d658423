// Maintenance, run by the worker at start and on a schedule:
// - auth tokens used or expired for more than a day, sessions ended more than a day ago, and sign-in attempts
//   older than a day (the rate limit looks back 15 minutes), are deleted;
// - partial files left by uploads cut off by a crash (`<key>.part-<hex>` in local storage, `kw-zip-*.zip` in the
//   temp folder) are deleted once they are an hour old (a live upload writes to its file continuously);
// - samples still `queued` a few minutes after their last change have their measure job queued again: an
//   upload recorded while Redis was away, or a job lost with Redis's data, would otherwise wait for ever.
//   Job ids are deterministic (sample id + MEASURE_VERSION), so a job that is still there is not doubled.
// - at start only (requeueOutdated, from workers/main.ts): samples measured by an older MEASURE_VERSION have their
//   measure job queued, so a new version of the measuring code reaches the stored samples; they stay catalogued
//   while they are measured again.
import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { MEASURE_VERSION } from "@/lib/audio/version";
import { db } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { storage } from "@/lib/server/storage";
import { enqueueMeasure } from "@/lib/server/catalogue/queue";
import { sweepOrphanWords } from "@/lib/server/catalogue/words";
import { purgeSessions } from "@/lib/server/auth/sessions";

const HOUR = 3600_000;

export async function purgeAuthRows(now = new Date()): Promise<{ tokens: number; attempts: number; sessions: number }> {
  const dayAgo = new Date(now.getTime() - 24 * HOUR);
  const tokens = await db()("auth_tokens").where("expires_at", "<", dayAgo).orWhere("used_at", "<", dayAgo).delete();
  const attempts = await db()("sign_in_attempts").where("created_at", "<", dayAgo).delete();
  const sessions = await purgeSessions(now);
  return { tokens, attempts, sessions };
}

async function* walk(dir: string): AsyncGenerator<string> {
  let entries: import("node:fs").Dirent[];
  try {
    entries = await fs.readdir(dir, { withFileTypes: true });
  } catch {
    return;
  }
  for (const e of entries) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) yield* walk(p);
    else if (e.isFile()) yield p;
  }
}

/** Deletes upload leftovers older than `olderThanMs`; returns how many. */
export async function sweepPartials({ storageRoot, tmpDir = os.tmpdir(), olderThanMs = HOUR, now = Date.now() }: { storageRoot: string | null; tmpDir?: string; olderThanMs?: number; now?: number }): Promise<number> {
  let n = 0;
  const sweep = async (file: string) => {
    const st = await fs.stat(file).catch(() => null);
    if (st && now - st.mtimeMs > olderThanMs && (await fs.rm(file, { force: true }).then(() => true, () => false))) n++;
  };
  if (storageRoot) for await (const f of walk(storageRoot)) if (/\.part-[0-9a-f]{12}$/.test(f)) await sweep(f);
  for (const name of await fs.readdir(tmpDir).catch(() => [] as string[])) if (/^kw-zip-[0-9a-f]{16}\.zip$/.test(name)) await sweep(path.join(tmpDir, name));
  return n;
}

/** Queues the measure job again for samples left `queued` for more than `olderThanMs`. */
export async function requeueStranded({ olderThanMs = 5 * 60_000, now = Date.now() } = {}): Promise<number> {
  const rows = await db()("samples").where({ state: "queued" }).andWhere("updated_at", "<", new Date(now - olderThanMs)).limit(50_000).select("id", "studio_id", "library_id");
  await enqueueMeasure(rows.map((r) => ({ sampleId: r.id, studioId: r.studio_id, libraryId: r.library_id })));
  return rows.length;
}

/**
 * Queues the measure job for every sample measured (or refused) by an older MEASURE_VERSION, walking the samples
 * in pages by id. Run when the worker starts: a new version arrives with new code. Returns how many were queued.
 */
export async function requeueOutdated({ pageSize = 5000 } = {}): Promise<number> {
  let after = "", total = 0;
  for (;;) {
    const rows: { id: string; studio_id: string; library_id: string }[] = await db()("samples")
      .whereIn("state", ["catalogued", "rejected"])
      .andWhere((q) => q.whereNull("measure_version").orWhere("measure_version", "<", MEASURE_VERSION))
      .andWhere("id", ">", after)
      .orderBy("id")
      .limit(pageSize)
      .select("id", "studio_id", "library_id");
    if (!rows.length) return total;
    await enqueueMeasure(rows.map((r) => ({ sampleId: r.id, studioId: r.studio_id, libraryId: r.library_id })));
    total += rows.length;
    after = rows[rows.length - 1]!.id;
    if (rows.length < pageSize) return total;
  }
}

export async function runMaintenance(): Promise<{ tokens: number; attempts: number; sessions: number; partials: number; requeued: number; orphanWords: number }> {
  const auth = await purgeAuthRows();
  const partials = await sweepPartials({ storageRoot: storage().kind === "local" ? path.resolve(env().KW_STORAGE_DIR) : null });
  const requeued = await requeueStranded();
  const orphanWords = await sweepOrphanWords(db());
  return { ...auth, partials, requeued, orphanWords };
}
