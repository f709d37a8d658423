// Figures of several processes (run by scripts/scale.sh after the scale test): the files of one generated library
// (tests/scale/files.ts) uploaded through two app processes at once with no worker running, then measured and
// sorted by one worker; the same files uploaded into a second library and measured and sorted by two workers.
// Prints files/s of each step and the peak resident memory of every process (tests/scale/cluster.ts). Usage:
// node --conditions=react-server --import tsx bench/scale.ts --files 2000   (with the test profile's services up)
import crypto from "node:crypto";
import os from "node:os";
import { createSessionCookie, createStudio, createUser } from "../db/factories";
import { closeDb, db } from "../lib/server/db";
import { closeQueues } from "../lib/server/jobs";
import { api, Cluster, uploadBatch } from "../tests/scale/cluster";
import { planLibraries, type PlannedFile } from "../tests/scale/files";

const arg = (name: string, fallback: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const FILES = arg("files", 2000);
const PER_APP = 3;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const say = (s: string) => process.stdout.write(`${s}\n`);

async function main() {
  const cluster = new Cluster();
  try {
    say(`[scale figures] generating ${FILES} files`);
    const [plan] = planLibraries({ total: FILES, libraries: 1, seed: 7 });
    const batches = plan!.batches;
    const rows = plan!.files.filter((f) => f.kind === "good" || f.kind === "rejected-by-decoder").length;
    const bytes = plan!.files.reduce((n, f) => n + f.bytes.length, 0);
    await cluster.prepare({ apps: 2, workers: 2 });
    await cluster.s3.start(30_000);
    await Promise.all(cluster.apps.map((a) => a.start()));
    const owner = await createUser(db(), { email: `scale-figures-${crypto.randomBytes(4).toString("hex")}@example.test`, name: "Scale figures", password: "correct-horse-9" });
    const studio = await createStudio(db(), { name: "Scale figures", ownerId: owner.id });
    const cookie = await createSessionCookie(db(), owner.id, process.env.NEXTAUTH_SECRET!);

    const upload = async (libraryId: string) => {
      let next = 0;
      const t0 = performance.now();
      const lane = async (i: number) => {
        while (next < batches.length) {
          const b: PlannedFile[] = batches[next++]!;
          await uploadBatch(cluster, i % 2, cookie, studio.id, libraryId, b.map((f) => ({ name: f.path, bytes: f.bytes })));
        }
      };
      await Promise.all(Array.from({ length: PER_APP * 2 }, (_, i) => lane(i)));
      return (performance.now() - t0) / 1000;
    };
    const settle = async (libraryId: string) => {
      for (;;) {
        const p = (await api(cluster, 0, "GET", `/api/studios/${studio.id}/libraries/${libraryId}/progress`, { cookie })).json;
        if (p.catalogued + p.rejected >= rows && p.pending === 0 && !p.sorting && p.healthComputedAt !== null) return;
        await sleep(250);
      }
    };
    const library = async (name: string) => (await api(cluster, 0, "POST", `/api/studios/${studio.id}/libraries`, { cookie, json: { name } })).json.id as string;

    const out: string[] = [];
    for (const workers of [1, 2]) {
      const libraryId = await library(`Figures, ${workers} worker(s)`);
      const up = await upload(libraryId);
      out.push(`upload through 2 apps (no worker running): ${plan!.files.length} files, ${(bytes / 1024 ** 2).toFixed(0)} MB in ${up.toFixed(1)} s = ${(plan!.files.length / up).toFixed(0)} files/s`);
      const ws = cluster.workers.slice(0, workers);
      for (const w of ws) w.peakRssMb = 0;
      await Promise.all(ws.map((w) => w.start()));
      const t0 = performance.now();
      await settle(libraryId);
      const s = (performance.now() - t0) / 1000;
      out.push(`measure and sort with ${workers} worker(s): ${rows} files in ${s.toFixed(1)} s = ${(rows / s).toFixed(1)} files/s; peak memory ${ws.map((w) => `${w.name} ${Math.round(w.peakRssMb)} MB`).join(", ")}`);
      await Promise.all(ws.map((w) => w.stop()));
    }
    for (const a of cluster.apps) a.sampleRss();
    out.push(`peak memory: ${cluster.apps.map((a) => `${a.name} ${Math.round(a.peakRssMb)} MB`).join(", ")}, S3 fake ${Math.round(cluster.s3.peakRssMb)} MB`);
    say(`[scale figures] ${FILES} files planned (${plan!.files.length} sent: good, copies and broken), on ${os.availableParallelism()} cores`);
    for (const l of out) say(`  ${l}`);
  } finally {
    await cluster.close();
    await closeQueues();
    await closeDb();
  }
}

main().catch((e) => {
  process.stderr.write(`[scale figures] failed: ${e instanceof Error ? e.stack : String(e)}\n`);
  process.exit(1);
});
