// Load driver (run by scripts/load.sh against a production server): signed-in browsing and audit runs at a
// fixed overall rate with autocannon, and 50 concurrent uploaders, for a bounded time on loopback. Then it
// waits for the worker to finish every uploaded file and counts the lost ones (neither catalogued nor
// rejected with a reason). Prints p50/p95/p99 and errors; writes a section into bench/RESULTS.md.
// Usage: node --import tsx tests/load/drive.ts --base http://127.0.0.1:3500 [--seconds 60 --rate 200 --uploaders 50]
import crypto from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import autocannon from "autocannon";
import knexFactory from "knex";
import config from "../../knexfile";
import { addMember, createSessionCookie, createStudio, createUser } from "../../db/factories";
import { bases, mutant } from "../hostile/mutate";

const argv = process.argv.slice(2);
const opt = (n: string, d: string) => (argv.includes(n) ? argv[argv.indexOf(n) + 1]! : d);
const BASE = opt("--base", "http://127.0.0.1:3500");
const SECONDS = Number(opt("--seconds", "60"));
const RATE = Number(opt("--rate", "200"));
const UPLOADERS = Number(opt("--uploaders", "50"));
/** Section of bench/RESULTS.md to write ("load" by default; e.g. --tag load-browse for a browsing-only run). */
const TAG = opt("--tag", "load").replace(/[^a-z0-9-]/gi, "");
const url = new URL(BASE);
const agent = new http.Agent({ keepAlive: true, maxSockets: UPLOADERS + 10 });

type Res = { status: number; json: any; ms: number };
function req(method: string, p: string, cookie: string, body?: { data: Uint8Array | string; type: string }): Promise<Res> {
  return new Promise((resolve) => {
    const t0 = performance.now();
    const headers: Record<string, string> = { cookie, origin: url.origin };
    if (body) headers["content-type"] = body.type;
    const r = http.request({ host: url.hostname, port: url.port, path: p, method, headers, agent, timeout: 120_000 }, (res) => {
      const parts: Buffer[] = [];
      res.on("data", (d) => parts.push(d));
      res.on("end", () => {
        const text = Buffer.concat(parts).toString();
        let json: unknown = text;
        try { json = JSON.parse(text); } catch { /* a page */ }
        resolve({ status: res.statusCode ?? 0, json, ms: performance.now() - t0 });
      });
    });
    r.on("error", (e) => resolve({ status: 0, json: e.message, ms: performance.now() - t0 }));
    r.on("timeout", () => r.destroy(new Error("timeout")));
    r.end(body?.data);
  });
}

async function multipart(files: { name: string; data: Uint8Array }[]) {
  const fd = new FormData();
  for (const f of files) fd.append("file", new Blob([f.data as BlobPart]), f.name);
  const r = new Request("http://x/", { method: "POST", body: fd });
  return { data: new Uint8Array(await r.arrayBuffer()), type: r.headers.get("content-type")! };
}

const pct = (xs: number[], p: number) => {
  if (!xs.length) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(p * s.length) - 1)]!;
};

async function main() {
  const k = knexFactory({ ...config, pool: { min: 0, max: 4 } });
  const owner = await createUser(k, { email: `load-${crypto.randomBytes(4).toString("hex")}@example.test`, name: "Load owner", password: "correct-horse-9" });
  const editors = await Promise.all(Array.from({ length: 5 }, (_, i) => createUser(k, { email: `load-ed${i}-${crypto.randomBytes(4).toString("hex")}@example.test`, name: `Load editor ${i}`, password: "correct-horse-9" })));
  const studio = await createStudio(k, { name: `Load ${crypto.randomBytes(3).toString("hex")}`, ownerId: owner.id });
  for (const e of editors) await addMember(k, { studioId: studio.id, userId: e.id, role: "editor" });
  const secret = process.env.NEXTAUTH_SECRET!;
  const cookieOf = (id: string) => createSessionCookie(k, id, secret);
  const cookie = await cookieOf(owner.id);
  const editorCookies = await Promise.all(editors.map((e) => cookieOf(e.id)));

  // setup through the API: a library with some samples, a kit and a layout from the GM template
  const lib = await req("POST", `/api/studios/${studio.id}/libraries`, cookie, { data: JSON.stringify({ name: "Load library" }), type: "application/json" });
  if (lib.status !== 201) throw new Error(`library: ${lib.status} ${JSON.stringify(lib.json)}`);
  const libraryId = lib.json.id as string;
  const kit = await req("POST", `/api/studios/${studio.id}/kits`, cookie, { data: JSON.stringify({ name: "Load kit", template: "gm-percussion" }), type: "application/json" });
  const layout = await req("POST", `/api/studios/${studio.id}/layouts`, cookie, { data: JSON.stringify({ name: "Load layout", template: "gm-percussion" }), type: "application/json" });
  const canAudit = kit.status === 201 && layout.status === 201;
  if (!canAudit) console.log(`audit runs left out: kit ${kit.status}, layout ${layout.status}`);

  const b = bases();
  const fresh = (i: number) => {
    const x = b[i % b.length]!.bytes.slice();
    x.set(crypto.getRandomValues(new Uint8Array(8)), x.length - 10);
    return x;
  };

  // browsing + audits with autocannon at a fixed overall rate
  const sp = `/api/studios/${studio.id}`;
  const requests: autocannon.Request[] = [
    { method: "GET", path: `/s/${studio.id}` },
    { method: "GET", path: `${sp}/libraries` },
    { method: "GET", path: `/s/${studio.id}/libraries/${libraryId}` },
    { method: "GET", path: `${sp}/libraries/${libraryId}/samples?page=1` },
    { method: "GET", path: `${sp}/libraries/${libraryId}/samples?sort=strike&dir=desc` },
    { method: "GET", path: `${sp}/libraries/${libraryId}/progress` },
    { method: "GET", path: `/s/${studio.id}/audits` },
    { method: "GET", path: `${sp}/kits` },
    ...(canAudit ? [{ method: "POST" as const, path: `${sp}/audits`, headers: { "content-type": "application/json", origin: url.origin, cookie }, body: JSON.stringify({ layoutId: layout.json.layout?.id ?? layout.json.id, kitId: kit.json.kit?.id ?? kit.json.id }) }] : []),
  ];
  const browseTimes: number[] = [];
  const statusByPath: Record<string, Record<number, number>> = {};
  const firstError: Record<string, string> = {};
  for (const r of requests) {
    const label = `${r.method} ${r.path!.split("?")[0]!.replace(studio.id, ":studio").replace(libraryId, ":library")}${r.path!.includes("?") ? `?${r.path!.split("?")[1]}` : ""}`;
    r.onResponse = (status: number, body: string) => {
      const m = (statusByPath[label] ??= {});
      m[status] = (m[status] ?? 0) + 1;
      if (status >= 400 && !firstError[label]) firstError[label] = `${status} ${String(body).slice(0, 300)}`;
    };
  }
  const statusCounts: Record<string, number> = {};
  const uploadTimes: number[] = [];
  const uploadErrors: string[] = [];
  const uploaded: { name: string; sampleId?: string; status: string }[] = [];
  let stop = false;

  const uploader = async (u: number) => {
    let n = 0;
    while (!stop) {
      const files: { name: string; data: Uint8Array }[] = Array.from({ length: 3 }, (_, j) => ({ name: `u${u}/take_${n}_${j}.wav`, data: fresh(u * 7 + j) }));
      if (n % 4 === 3) files.push({ name: `u${u}/broken_${n}.wav`, data: mutant(8 + 15 * n, u + 10).bytes }); // zero channels: refused by the measurer
      n++;
      const r = await req("POST", `${sp}/libraries/${libraryId}/uploads`, editorCookies[u % editorCookies.length]!, await multipart(files));
      uploadTimes.push(r.ms);
      if (r.status !== 201) uploadErrors.push(`${r.status} ${JSON.stringify(r.json).slice(0, 200)}`);
      else for (const f of r.json.files) uploaded.push({ name: f.name, sampleId: f.sampleId, status: f.status });
    }
  };

  const loadStart = os.loadavg().map((x) => x.toFixed(2)).join(" ");
  const t0 = Date.now();
  const upl = Array.from({ length: UPLOADERS }, (_, u) => uploader(u));
  const inst = autocannon({ url: BASE, connections: 20, duration: SECONDS, overallRate: RATE, headers: { cookie }, requests, timeout: 30 });
  inst.on("response", (_client: unknown, statusCode: number, _bytes: number, ms: number) => {
    browseTimes.push(ms);
    statusCounts[statusCode] = (statusCounts[statusCode] ?? 0) + 1;
  });
  const result = await inst;
  stop = true;
  await Promise.all(upl);
  const wall = (Date.now() - t0) / 1000;
  const loadEnd = os.loadavg().map((x) => x.toFixed(2)).join(" ");

  // every uploaded file must end catalogued or rejected with a reason
  const ids = uploaded.filter((x) => x.status === "queued").map((x) => x.sampleId!);
  // The worker drains its backlog after the load: wait while it makes progress. A sample is lost when the
  // worker stalls (nothing finished for 2 minutes) or 20 minutes pass with it still pending.
  const drainStart = Date.now();
  const giveUp = drainStart + 20 * 60_000;
  let lastProgress = Date.now();
  let pending = ids.length;
  let rows: { id: string; state: string; reject_reason: string | null }[] = [];
  while (Date.now() < giveUp && Date.now() - lastProgress < 120_000) {
    rows = await k("samples").where({ library_id: libraryId }).select("id", "state", "reject_reason");
    const now = rows.filter((r) => r.state === "queued" || r.state === "measuring" || r.state === "measured").length;
    if (now < pending) lastProgress = Date.now();
    pending = now;
    if (!pending) break;
    await new Promise((r) => setTimeout(r, 2000));
  }
  const drainSec = (Date.now() - drainStart) / 1000;
  const have = new Set(rows.map((r) => r.id));
  const missing = ids.filter((id) => !have.has(id)).length;
  const rejectedNoReason = rows.filter((r) => r.state === "rejected" && !(r.reject_reason ?? "").trim()).length;
  const lost = pending + missing + rejectedNoReason;
  const catalogued = rows.filter((r) => r.state === "catalogued").length;
  const rejected = rows.filter((r) => r.state === "rejected").length;
  await k.destroy();

  // unloaded latency of each route (10 calls one after another, after the load), to see where time goes
  const unloaded: Record<string, number> = {};
  for (const r of requests) {
    const label = `${r.method} ${r.path!.replace(studio.id, ":studio").replace(libraryId, ":library")}`;
    const xs: number[] = [];
    for (let i = 0; i < 10; i++) xs.push((await req(r.method ?? "GET", r.path!, cookie, r.body ? { data: r.body, type: "application/json" } : undefined)).ms);
    unloaded[label] = pct(xs, 0.5);
  }
  const browseErrors = result.errors + result.timeouts + Object.entries(statusCounts).filter(([s]) => Number(s) >= 400).reduce((a, [, n]) => a + n, 0);
  const f = (x: number) => (Number.isFinite(x) ? x.toFixed(0) : "-");
  const lines = [
    `| traffic | requests | rate | p50 ms | p95 ms | p99 ms | errors |`,
    `|---|---:|---:|---:|---:|---:|---:|`,
    `| signed-in browsing${canAudit ? " + audit runs" : ""} (autocannon, 20 connections, target ${RATE} req/s) | ${browseTimes.length} | ${(browseTimes.length / SECONDS).toFixed(0)}/s | ${f(pct(browseTimes, 0.5))} | ${f(pct(browseTimes, 0.95))} | ${f(pct(browseTimes, 0.99))} | ${browseErrors} (status ${JSON.stringify(statusCounts)}, ${result.errors} socket errors, ${result.timeouts} timeouts) |`,
    ...Object.entries(statusByPath).map(([p, m]) => `| &nbsp; ${p} (unloaded p50 ${f(unloaded[p] ?? NaN)} ms) | ${Object.values(m).reduce((a, b) => a + b, 0)} | | | | | ${JSON.stringify(m)} |`),
    `| uploads (${UPLOADERS} concurrent uploaders, 3-4 files each) | ${uploadTimes.length} | ${(uploadTimes.length / wall).toFixed(1)}/s | ${f(pct(uploadTimes, 0.5))} | ${f(pct(uploadTimes, 0.95))} | ${f(pct(uploadTimes, 0.99))} | ${uploadErrors.length} |`,
  ];
  const pass = browseErrors === 0 && uploadErrors.length === 0 && lost === 0;
  const summary = `Files uploaded: ${uploaded.length} (${ids.length} queued, ${uploaded.filter((x) => x.status === "duplicate").length} duplicate, ${uploaded.filter((x) => x.status === "refused").length} refused at the door); after the run (the worker's backlog ${pending ? "still not drained" : "drained"} ${drainSec.toFixed(0)} s after the load ended): ${catalogued} catalogued, ${rejected} rejected with a reason, lost ${lost} (still pending ${pending}, missing rows ${missing}, rejected without a reason ${rejectedNoReason}). Verdict: ${pass ? "PASS (zero errors, zero lost samples)" : "FAIL"}; offered browsing rate reached: ${(browseTimes.length / SECONDS).toFixed(0)} of ${RATE} req/s${browseTimes.length / SECONDS < 0.9 * RATE ? " (NOT reached: the server was saturated)" : ""}.`;
  const head = `Measured by \`bash scripts/load.sh\` on ${new Date().toISOString().slice(0, 16).replace("T", " ")} UTC against \`next start\` (production build) and one worker process, ${SECONDS} s, loopback, ${os.cpus().length} shared cores. Load average at the start: ${loadStart}; at the end: ${loadEnd}.`;
  console.log(`\n${head}\n\n${lines.join("\n")}\n\n${summary}`);
  for (const [p, e] of Object.entries(firstError)) console.log(`first error of ${p}: ${e}`);
  if (uploadErrors.length) console.log(`first upload errors:\n${uploadErrors.slice(0, 5).join("\n")}`);
  const file = path.resolve(import.meta.dirname, "../../bench/RESULTS.md");
  const title = TAG === "load" ? "Load" : `Load (${TAG.replace(/^load-/, "")}: ${UPLOADERS} uploaders, target ${RATE} req/s)`;
  const section = `<!-- ${TAG}:start -->\n## ${title}\n\n${head}\n\n${lines.join("\n")}\n\n${summary}\n<!-- ${TAG}:end -->`;
  const old = fs.existsSync(file) ? fs.readFileSync(file, "utf8") : "# Kitwright results\n";
  const re = new RegExp(`<!-- ${TAG}:start -->[\\s\\S]*<!-- ${TAG}:end -->`);
  fs.writeFileSync(file, re.test(old) ? old.replace(re, section) : `${old.trimEnd()}\n\n${section}\n`);
  process.exit(pass ? 0 : 1);
}

main().catch((e) => {
  console.error(e);
  process.exit(2);
});
