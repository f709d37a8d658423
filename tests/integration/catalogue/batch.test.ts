// The background measuring end to end with the real worker process (workers/main.ts as a child process):
// a 500-file batch with 50 broken files, and a worker killed (SIGKILL) mid-batch and restarted.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { ChildProcess } from "node:child_process";
import { call, makeStudioWithRoles, uniq } from "../helpers";
import { db, closeDb } from "@/lib/server/db";
import { closeQueues } from "@/lib/server/jobs";
import { storage } from "@/lib/server/storage";
import { badHeaderWav, hitWav, multipart, notWav, rf64, startWorker, stateCounts, waitFor, waitForReady } from "./helpers";
import * as libsRoute from "@/app/api/studios/[studioId]/libraries/route";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";

let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let worker: ChildProcess | null = null;
const log: string[] = [];

async function newLibrary() {
  const r = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name: uniq("Batch") }, user: ctx.users.editor });
  return r.json.id as string;
}
async function upload(libraryId: string, files: { name: string; data: Uint8Array }[]) {
  const { body, type } = await multipart(files);
  const r = await call(uploadRoute.POST, { method: "POST", params: { studioId: ctx.studio.id, libraryId }, rawBody: body, headers: { "content-type": type }, user: ctx.users.editor });
  expect(r.status).toBe(201);
  return r.json as { files: { name: string; status: string; code?: string; reason?: string; sampleId?: string }[]; counts: Record<string, number> };
}
const drums = ["kick", "snare", "tom", "hat"];
function goodFile(i: number, tag: string) {
  const d = drums[i % 4]!;
  return { name: `${tag}/${d}/${d}_v${(i % 3) + 1}_rr${(i % 5) + 1}_${i}.wav`, data: hitWav(i * 7919 + tag.length, { freq: 80 + (i % 4) * 90, gain: 0.2 + (i % 3) * 0.25 }) };
}

beforeAll(async () => {
  ctx = await makeStudioWithRoles();
});

afterAll(async () => {
  if (log.some((l) => /failed|could not/.test(l))) console.log(log.join("").slice(-3000));
  if (worker && worker.exitCode === null) worker.kill("SIGKILL");
  await closeQueues();
  await closeDb();
});

describe("background measuring with the worker process", () => {
  it("500 files with 50 broken: 450 catalogued, 50 refused or rejected with reasons, nothing lost", async () => {
    const libraryId = await newLibrary();
    const files: { name: string; data: Uint8Array }[] = [];
    for (let i = 0; i < 500; i++) {
      if (i % 10 === 3) {
        const k = Math.floor(i / 10);
        files.push(k % 3 === 0 ? { name: `broken/text_${i}.wav`, data: notWav(i) } : k % 3 === 1 ? { name: `broken/rf64_${i}.wav`, data: rf64(i) } : { name: `broken/header_${i}.wav`, data: badHeaderWav(i + 100_000) });
      } else files.push(goodFile(i, "b500"));
    }
    const t0 = Date.now();
    // the browser sends large selections in several requests; do the same (5 x 100)
    const results = [];
    for (let i = 0; i < 500; i += 100) results.push(...(await upload(libraryId, files.slice(i, i + 100))).files);
    const uploadMs = Date.now() - t0;
    expect(results).toHaveLength(500);
    const refusedAtUpload = results.filter((r) => r.status === "refused");
    expect(refusedAtUpload.length).toBe(34); // 17 text + 17 RF64 (50 broken: 17 + 17 + 16 bad headers)
    for (const r of refusedAtUpload) expect(r.reason).toBeTruthy();
    expect(results.filter((r) => r.status === "queued")).toHaveLength(466);

    worker = startWorker(log);
    await waitForReady(log);
    const t1 = Date.now();
    const done = await waitFor(() => stateCounts(libraryId), (c) => c.queued + c.measuring === 0, 120_000, "the batch to be measured");
    const measureMs = Date.now() - t1;
    expect(done.rejected).toBe(16);
    // the debounced cataloguing places every measured sample: measured becomes catalogued
    const placed = await waitFor(() => stateCounts(libraryId), (c) => c.measured === 0, 30_000, "the cataloguing");
    expect(placed).toEqual({ queued: 0, measuring: 0, measured: 0, catalogued: 450, rejected: 16 });
    const rejected = await db()("samples").where({ library_id: libraryId, state: "rejected" }).select("rel_path", "reject_code", "reject_reason");
    for (const r of rejected) {
      expect(r.rel_path).toMatch(/^broken\/header_/);
      expect(r.reject_code).toBe("bad-header");
      expect(r.reject_reason).toBeTruthy();
    }
    // every catalogued sample has its measurement, peaks and columns
    const incomplete = await db()("samples").where({ library_id: libraryId, state: "catalogued" }).where((w) => w.whereNull("measurement").orWhereNull("peaks").orWhereNull("strike_lufs")).count({ n: "*" }).first();
    expect(Number(incomplete!.n)).toBe(0);
    // the cataloguing labels everything and writes health
    await waitFor(async () => (await db()("samples").where({ library_id: libraryId, state: "catalogued" }).whereNull("family").count({ n: "*" }).first())!.n, (n) => Number(n) === 0, 30_000, "the cataloguing");
    const h = await waitFor(() => db()("library_health").where({ library_id: libraryId }).first(), (x) => !!x && Number(x.sample_count) === 450, 30_000, "health of all 450");
    expect(Number(h.sample_count)).toBe(450);
    const kick = await db()("samples").where({ library_id: libraryId, state: "catalogued" }).where("rel_path", "like", "b500/kick/%").select("family");
    expect(kick.every((k) => k.family === "kick")).toBe(true);
    console.log(`[measured] 500-file batch: upload ${uploadMs} ms, measure ${measureMs} ms (${(466 / (measureMs / 1000)).toFixed(0)} files/s)`);
  }, 200_000);

  it("a worker killed mid-batch and restarted finishes the batch: no sample lost, none duplicated", async () => {
    const libraryId = await newLibrary();
    const files = Array.from({ length: 240 }, (_, i) => goodFile(i + 10_000, "kill"));
    // 1.5 s files take longer to measure, so the kill lands mid-batch
    for (let i = 0; i < files.length; i += 3) files[i] = { name: files[i]!.name, data: hitWav(i + 50_000, { seconds: 1.5 }) };
    const res = await upload(libraryId, files);
    expect(res.counts.queued).toBe(240);
    if (!worker || worker.exitCode !== null) {
      worker = startWorker(log);
      await waitForReady(log);
    }
    await waitFor(() => stateCounts(libraryId), (c) => c.measured + c.catalogued >= 20, 60_000, "some progress");
    worker.kill("SIGKILL");
    const tKill = Date.now();
    await new Promise((r) => worker!.once("exit", r));
    const mid = await stateCounts(libraryId);
    expect(mid.measured + mid.catalogued).toBeLessThan(240);
    worker = startWorker(log);
    await waitForReady(log);
    const end = await waitFor(() => stateCounts(libraryId), (c) => c.catalogued === 240, 120_000, "the batch to finish after the restart");
    expect(end).toEqual({ queued: 0, measuring: 0, measured: 0, catalogued: 240, rejected: 0 });
    const rows = await db()("samples").where({ library_id: libraryId }).select("rel_path", "sha256");
    expect(rows).toHaveLength(240);
    expect(new Set(rows.map((r) => r.rel_path)).size).toBe(240);
    expect(new Set(rows.map((r) => r.sha256)).size).toBe(240);
    console.log(`[measured] killed with ${mid.measured + mid.catalogued}/240 measured (${mid.measuring} measuring); finished ${((Date.now() - tKill) / 1000).toFixed(1)} s after the kill`);
  }, 200_000);

  it("a job that keeps failing (stored file gone) leaves its sample rejected with the reason after its retries", async () => {
    // the worker is stopped while the file goes missing, so it cannot measure it first
    if (worker && worker.exitCode === null) {
      worker.kill("SIGTERM");
      await new Promise((r) => worker!.once("exit", r));
    }
    const libraryId = await newLibrary();
    const res = await upload(libraryId, [{ name: "gone/lost.wav", data: hitWav(777_001) }]);
    const sampleId = res.files[0]!.sampleId as string;
    const row = await db()("samples").where({ id: sampleId }).first("storage_key");
    await storage().delete(row.storage_key);
    if (!worker || worker.exitCode !== null) {
      worker = startWorker(log);
      await waitForReady(log);
    }
    const t0 = Date.now();
    const done = await waitFor(() => db()("samples").where({ id: sampleId }).first("state", "reject_code", "reject_reason"), (r) => r.state === "rejected", 60_000, "the sample to be rejected");
    expect(done.reject_code).toBe("failed");
    expect(done.reject_reason).toMatch(/measuring failed 3 times: the stored file could not be read/);
    // 3 attempts with exponential backoff of 2 s then 4 s: at least 6 s in all
    expect(Date.now() - t0).toBeGreaterThanOrEqual(5_500);
  }, 90_000);
});
