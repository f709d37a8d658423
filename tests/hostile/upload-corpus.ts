// The hostile corpus through the upload API, by hand (the CI test sends 300):
//   bash scripts/with-test-env.sh node --conditions=react-server --import tsx tests/hostile/upload-corpus.ts --count 10000
// Sends the seeded corpus (tests/hostile/mutate.ts) in batches of 500 files to the real upload route handler
// (in-process, signed-in editor), then measures every queued sample exactly as the worker does (measureSample +
// measureWav, inline), catalogues the library (catalogueLibrary) and checks: no 5xx, one outcome per file, every stored sample catalogued or rejected with
// a reason, one stored file per row. Prints counts and the worst times; exit code 1 on any problem.
import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { NextRequest } from "next/server";
import { db } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { createSessionCookie, createStudio, createUser } from "@/db/factories";
import { createLibrary } from "@/lib/server/catalogue/libraries";
import { measureSample } from "@/lib/server/catalogue/measure";
import { catalogueLibrary } from "@/lib/server/catalogue/catalogue-library";
import { closeQueues } from "@/lib/server/jobs";
import { measureWav } from "@/lib/audio";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";
import { bases, mutant } from "./mutate";

const arg = (n: string, d: number) => (process.argv.includes(n) ? Number(process.argv[process.argv.indexOf(n) + 1]) : d);
const COUNT = arg("--count", 10_000);
const SEED = arg("--seed", 5);
const BATCH = 500;

async function main() {
  const t0 = performance.now();
  const load = os.loadavg().map((x) => x.toFixed(2)).join(" ");
  const user = await createUser(db(), { email: `hostile-${crypto.randomBytes(4).toString("hex")}@example.test`, name: "Hostile uploader", password: "correct-horse-9" });
  const studio = await createStudio(db(), { name: `Hostile ${crypto.randomBytes(3).toString("hex")}`, ownerId: user.id });
  const lib = await createLibrary({ studioId: studio.id, actorId: user.id, name: `Hostile corpus ${SEED}` });
  const cookie = await createSessionCookie(db(), user.id, env().NEXTAUTH_SECRET);
  const base = new URL(env().KW_APP_URL);
  const b = bases();
  const outcomes: Record<string, number> = {};
  const problems: string[] = [];
  let worstUploadMs = 0;
  let worstMeasureMs = 0;
  const queued: string[] = [];
  for (let start = 0; start < COUNT; start += BATCH) {
    const fd = new FormData();
    const n = Math.min(BATCH, COUNT - start);
    for (let i = start; i < start + n; i++) {
      const m = mutant(i, SEED, b);
      fd.append("file", new Blob([m.bytes as BlobPart]), `corpus/${m.name}`);
    }
    const body = new Request("http://x/", { method: "POST", body: fd });
    const bytes = new Uint8Array(await body.arrayBuffer());
    const req = new NextRequest(new URL(`/api/studios/${studio.id}/libraries/${lib.id}/uploads`, base), { method: "POST", headers: { host: base.host, origin: base.origin, cookie, "content-type": body.headers.get("content-type")! }, body: bytes });
    const u0 = performance.now();
    const res = await uploadRoute.POST(req, { params: Promise.resolve({ studioId: studio.id, libraryId: lib.id }) });
    worstUploadMs = Math.max(worstUploadMs, performance.now() - u0);
    type Outcome = { name: string; status: string; code?: string; reason?: string; sampleId?: string };
    const json = (await res.json()) as { files?: Outcome[]; error?: { details?: { files?: Outcome[] } } };
    if (res.status >= 500) problems.push(`batch at ${start}: HTTP ${res.status} ${JSON.stringify(json).slice(0, 200)}`);
    // 201 with the outcomes, or 422 with them when nothing in the batch was accepted
    const outcomesOf = res.status === 201 ? json.files : res.status === 422 ? json.error?.details?.files : undefined;
    if (!outcomesOf) {
      problems.push(`batch at ${start}: HTTP ${res.status}`);
      continue;
    }
    if (outcomesOf.length !== n) problems.push(`batch at ${start}: ${outcomesOf.length} outcomes for ${n} files`);
    for (const f of outcomesOf) {
      const key = f.status === "refused" ? `refused at upload: ${f.code}` : f.status;
      outcomes[key] = (outcomes[key] ?? 0) + 1;
      if (f.status === "refused" && !(f.reason ?? "").trim()) problems.push(`${f.name}: refused without a reason`);
      if (f.status === "queued") queued.push(f.sampleId!);
    }
    process.stderr.write(`  uploaded ${start + n}\n`);
  }
  for (const id of queued) {
    const m0 = performance.now();
    await measureSample({ sampleId: id, studioId: studio.id }, async (bytes) => measureWav(bytes));
    worstMeasureMs = Math.max(worstMeasureMs, performance.now() - m0);
  }
  await catalogueLibrary({ studioId: studio.id, libraryId: lib.id });
  const rows = await db()("samples").where({ library_id: lib.id }).select("id", "state", "reject_code", "reject_reason", "rel_path");
  const after: Record<string, number> = {};
  for (const r of rows) {
    const key = r.state === "rejected" ? `rejected: ${r.reject_code}` : r.state;
    after[key] = (after[key] ?? 0) + 1;
    if (r.state !== "catalogued" && r.state !== "rejected") problems.push(`${r.rel_path}: left ${r.state}`);
    if (r.state === "rejected" && !(r.reject_reason ?? "").trim()) problems.push(`${r.rel_path}: rejected without a reason`);
    if (r.rel_path.includes("-valid-") && r.state !== "catalogued") problems.push(`${r.rel_path}: an undamaged file was not catalogued`);
  }
  if (rows.length !== queued.length) problems.push(`${rows.length} rows for ${queued.length} queued files`);
  const dir = path.resolve(env().KW_STORAGE_DIR, `studios/${studio.id}/libraries/${lib.id}`);
  const files = fs.existsSync(dir) ? fs.readdirSync(dir) : [];
  if (files.length !== rows.length) problems.push(`${files.length} stored files for ${rows.length} rows`);
  console.log(`hostile corpus through the upload API: ${COUNT} files, seed ${SEED}, ${((performance.now() - t0) / 1000).toFixed(1)} s, load average at start ${load}`);
  console.log(`at upload: ${JSON.stringify(outcomes)}`);
  console.log(`after measuring: ${JSON.stringify(after)}`);
  console.log(`worst upload request (${BATCH} files): ${worstUploadMs.toFixed(0)} ms; worst measure of one sample: ${worstMeasureMs.toFixed(0)} ms`);
  console.log(`problems: ${problems.length}`);
  for (const p of problems.slice(0, 20)) console.log(`  ${p}`);
  // the library and its files are removed afterwards (a scratch studio)
  await db()("libraries").where({ id: lib.id }).delete();
  fs.rmSync(dir, { recursive: true, force: true });
  await closeQueues();
  await db().destroy();
  process.exit(problems.length ? 1 : 0);
}

main().catch((e) => {
  console.error(e);
  process.exit(2);
});
