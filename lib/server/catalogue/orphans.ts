import "server-only";
// Stored sample files that no sample row names. An upload stores each file before it records its row (upload/
// store.ts, then recorder.ts), and takes the file back when the row is not written; a process killed between the
// two (a crash, a deploy, the OOM killer) leaves the file behind for good, as does a library deletion cut short
// after its rows went and before its folder was emptied. The worker's maintenance (workers/maintenance.ts) deletes
// such files once they are older than any upload in progress could leave them (an hour by default).
import { db } from "../db";
import { storage } from "../storage";

/** A sample's key (libraries.ts sampleKey): studios/<studio id>/libraries/<library id>/<sample id>.wav. */
const SAMPLE_KEY = /^studios\/[^/]+\/libraries\/[^/]+\/([^/]+)\.wav$/;

/** Deletes stored sample files older than `olderThanMs` that no sample row names; returns how many. */
export async function sweepOrphanFiles({ olderThanMs = 3600_000, now = Date.now() } = {}): Promise<number> {
  const store = storage();
  let n = 0;
  for await (const page of store.list("studios/")) {
    const old = page.flatMap((o) => {
      const m = SAMPLE_KEY.exec(o.key);
      return m && now - o.modifiedMs > olderThanMs ? [{ key: o.key, sampleId: m[1]! }] : [];
    });
    if (!old.length) continue;
    const rows: { storage_key: string }[] = await db()("samples").whereIn("id", old.map((o) => o.sampleId)).select("storage_key");
    const named = new Set(rows.map((r) => r.storage_key));
    for (const o of old) {
      if (named.has(o.key)) continue;
      await store.delete(o.key);
      n++;
    }
  }
  return n;
}
