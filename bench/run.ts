// npm run bench [-- --files 500 --upload-gb 2 --skip-upload --skip-measure --fresh-db]
// (--fresh-db drops the bench database first: after a migration changed, or to time the 100,000-row seed)
// One command, one run, one table: measuring (bench/measure.ts), audit (bench/audit.ts), the browser table
// (bench/browse.ts: 100,000 sample rows through the samples API, with query plans), page weight (from the
// .next build output) and upload (bench/upload.ts: a 2 GB batch over loopback). Starts the test profile's
// MariaDB and Redis if they are not running (a database of its own, kitwright_bench). Prints the table with
// the target beside each figure and writes it into bench/RESULTS.md between the bench markers.
import { spawn } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { pageWeight } from "./page-weight";
import { benchEnv, ROOT } from "./env";
import { runUploadBench } from "./upload";

const argv = process.argv.slice(2);
const flag = (n: string) => argv.includes(n);
const opt = (n: string, d: number) => (argv.includes(n) ? Number(argv[argv.indexOf(n) + 1]) : d);
const load = () => os.loadavg().map((x) => x.toFixed(2)).join(" ");

type Row = { area: string; figure: string; value: string; target: string; met: "yes" | "no" | "-" };
const rows: Row[] = [];
const notes: string[] = [];
const add = (r: Row) => {
  rows.push(r);
  process.stderr.write(`  ${r.area}: ${r.figure} = ${r.value} (target ${r.target})\n`);
};

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv = process.env, timeoutMs = 900_000): Promise<string> {
  return new Promise((resolve, reject) => {
    const p = spawn(cmd, args, { cwd: ROOT, env, stdio: ["ignore", "pipe", "pipe"] });
    let out = "";
    let err = "";
    const t = setTimeout(() => p.kill("SIGKILL"), timeoutMs);
    p.stdout.on("data", (d) => (out += d));
    p.stderr.on("data", (d) => (err += d));
    p.on("close", (code) => {
      clearTimeout(t);
      code === 0 ? resolve(out) : reject(new Error(`${cmd} ${args.join(" ")} failed (${code}): ${err.slice(-800)}`));
    });
  });
}

async function measuring() {
  if (flag("--skip-measure")) return add({ area: "measuring", figure: "files/s", value: "not measured: --skip-measure", target: "-", met: "-" });
  const files = opt("--files", 500);
  // bench/measure.ts also rewrites its own bench/MEASURE-RESULTS.md: keep that file as it was (this table is ours)
  const own = path.join(ROOT, "bench/MEASURE-RESULTS.md");
  const before = fs.existsSync(own) ? fs.readFileSync(own) : null;
  let out: string;
  try {
    out = await run(process.execPath, ["--import", "tsx", "bench/measure.ts", "--files", String(files)]);
  } finally {
    if (before) fs.writeFileSync(own, before);
  }
  const line = (start: string) => out.split("\n").find((l) => l.startsWith(`| ${start}`))?.split("|").map((c) => c.trim()) ?? [];
  const full = line("full measurement");
  const dec = line("decode only");
  const sox = line("sox FILE");
  const rss = /peak RSS per worker (\d+) MB after \d+ files, (\d+) MB at the end/.exec(full[6] ?? "");
  add({ area: "measuring", figure: `full measurement, ${files} files, all cores (files/s; CPU ms per file)`, value: `${full[2]} files/s; ${full[4]} ms CPU/file (${full[5]} files/s if the cores were ours alone)`, target: ">= 100 files/s on 2 cores", met: Number(full[2]) >= 100 ? "yes" : "no" });
  add({ area: "measuring", figure: "decode only (files/s)", value: `${dec[2]} files/s`, target: "reference", met: "-" });
  add({ area: "measuring", figure: "sox FILE -n stats (files/s)", value: `${sox[2]} files/s`, target: "reference (full measurement near sox or faster)", met: Number(full[2]) >= 0.8 * Number(sox[2]) ? "yes" : "no" });
  if (rss) add({ area: "measuring", figure: "peak RSS per worker process (early, end)", value: `${rss[1]} MB, ${rss[2]} MB`, target: "flat as the file count grows", met: Number(rss[2]) - Number(rss[1]) < 20 ? "yes" : "no" });
}

async function audit() {
  const out = await run(process.execPath, ["--import", "tsx", "bench/audit.ts"]);
  const warm = /audit, warm \(indexed catalogue\): median ([\d.]+) ms, worst ([\d.]+) ms/.exec(out);
  const cold = /audit, cold: ([\d.]+) ms/.exec(out);
  const layout = /layout: (.*)/.exec(out)?.[1] ?? "";
  add({ area: "audit", figure: "128-pad layout vs a kit from 20,000 samples (median warm; worst; cold)", value: `${warm?.[1]} ms; ${warm?.[2]} ms; ${cold?.[1]} ms`, target: "< 50 ms", met: Number(warm?.[1]) < 50 ? "yes" : "no" });
  notes.push(`Audit: ${layout}. Timed on the pure auditor (lib/audit runAudit), the server's work per audit request besides reading the catalogue.`);
}

async function browse(env: NodeJS.ProcessEnv) {
  const out = await run(process.execPath, ["--conditions=react-server", "--import", "tsx", "bench/browse.ts"], env);
  const r = JSON.parse(out.trim().split("\n").at(-1)!) as { rows: number; seedSec: number; pages: { name: string; total: number; p50: number; p95: number; n: number }[]; plans: { page: string; sql: string; type: string; key: string | null; rows: number; extra: string }[] };
  for (const p of r.pages) add({ area: "browser table", figure: `${p.name}, ${r.rows.toLocaleString("en")} rows (p95; p50; ${p.n} requests)`, value: `${p.p95.toFixed(1)} ms; ${p.p50.toFixed(1)} ms`, target: "p95 < 50 ms", met: p.p95 < 50 ? "yes" : "no" });
  // an index must pick the rows, and no page may sort more than 10,000 rows after reading them (filesort)
  const noIndex = r.plans.filter((p) => !p.key || p.type === "ALL");
  const bigSorts = r.plans.filter((p) => /filesort/.test(p.extra) && p.rows > 10_000);
  add({ area: "browser table", figure: "query plans (EXPLAIN): index used; large filesorts (> 10,000 rows)", value: `index in ${r.plans.length - noIndex.length} of ${r.plans.length}; large filesort in ${bigSorts.length} (${[...new Set(bigSorts.map((p) => p.page.split(" (")[0]))].join(", ") || "none"})`, target: "index in all, no large filesort", met: noIndex.length || bigSorts.length ? "no" : "yes" });
  notes.push(`Browser table plans (samples table): ${r.plans.map((p) => `${p.page} [${p.sql}]: type ${p.type}, key ${p.key ?? "NONE"}, ~${p.rows} rows, ${p.extra || "-"}`).join("; ")}.`);
  if (r.seedSec) notes.push(`The 100,000 rows were inserted in ${r.seedSec.toFixed(1)} s (batches of 1,000) for this run.`);
}

function weight() {
  const nextDir = path.join(ROOT, ".next");
  if (!fs.existsSync(path.join(nextDir, "BUILD_ID"))) return add({ area: "page weight", figure: "JS per page", value: "not measured: no production build (.next)", target: "-", met: "-" });
  const built = fs.statSync(path.join(nextDir, "BUILD_ID")).mtime.toISOString().slice(0, 16).replace("T", " ");
  for (const [name, page] of [["library page", "/(app)/s/[studioId]/libraries/[libraryId]/page"], ["audit page", "/(app)/s/[studioId]/audits/[auditId]/page"]] as const) {
    try {
      const w = pageWeight(page, nextDir);
      add({ area: "page weight", figure: `${name}: JS gzip (shared framework + page's own; files)`, value: `${w.gzipKb} KB (${w.sharedGzipKb} + ${w.ownGzipKb}; ${w.files} files)`, target: "< 250 KB gzip (common practice budget)", met: w.gzipKb < 250 ? "yes" : "no" });
    } catch (e) {
      add({ area: "page weight", figure: name, value: `not measured: ${(e as Error).message}`, target: "-", met: "-" });
    }
  }
  notes.push(`Page weight from the build made ${built} UTC (.next/BUILD_ID); JS files gzipped at level 9.`);
}

async function upload(env: NodeJS.ProcessEnv) {
  if (flag("--skip-upload")) return add({ area: "upload", figure: "MB/s", value: "not measured: --skip-upload", target: "-", met: "-" });
  const gb = opt("--upload-gb", 2);
  const vias: ("next" | "serve")[] = fs.existsSync(path.join(ROOT, ".next/BUILD_ID")) ? ["next", "serve"] : ["serve"];
  for (const via of vias) {
    const where = via === "next" ? "through `next start` as deployed (scripts/serve-app.sh)" : "route handler in a plain Node server";
    const u = await runUploadBench(env, { totalBytes: Math.round(gb * 1024 ** 3), via, port: via === "next" ? 3471 : 3470 });
    add({ area: "upload", figure: `${(u.bytes / 1024 ** 3).toFixed(2)} GB batch, ${u.files} files, one request over loopback, ${where} (MB/s)`, value: `${u.mbPerSec.toFixed(1)} MB/s (${u.seconds.toFixed(1)} s; HTTP ${u.status}; ${u.queued} queued, ${u.duplicate} duplicate, ${u.refused} refused)`, target: ">= 100 MB/s", met: u.mbPerSec >= 100 && u.status === 201 ? "yes" : "no" });
    add({ area: "upload", figure: `server RSS growth during the batch, ${where} (idle -> peak, with child processes)`, value: `${u.rssGrowthMb.toFixed(1)} MB (${u.rssIdleMb.toFixed(0)} -> ${u.rssPeakMb.toFixed(0)} MB)`, target: "< 100 MB", met: u.rssGrowthMb < 100 ? "yes" : "no" });
  }
  notes.push("Upload: the real route handler (busboy streaming to local storage, SHA-256, one row and one job per file), once through `next start` as deployed (scripts/serve-app.sh, with its V8 setting --heap-growing-percent=100) and once in a plain Node HTTP server (tests/faults/serve.ts, V8's defaults) to separate the framework's share; the client generating the body and the server share the 2 cores.");
}

async function main() {
  const started = new Date();
  const loadStart = load();
  process.stderr.write(`bench: load average ${loadStart}\n`);
  const env = benchEnv({ fresh: flag("--fresh-db") });
  const steps: [string, () => Promise<void> | void][] = [["measuring", measuring], ["audit", audit], ["browser table", () => browse(env)], ["page weight", weight], ["upload", () => upload(env)]];
  for (const [name, fn] of steps) {
    process.stderr.write(`bench: ${name} ...\n`);
    try {
      await fn();
    } catch (e) {
      add({ area: name, figure: "-", value: `not measured: ${(e as Error).message.split("\n")[0]!.slice(0, 200)}`, target: "-", met: "-" });
    }
  }
  const loadEnd = load();
  const table = ["| area | figure | value | target | met |", "|---|---|---|---|---|", ...rows.map((r) => `| ${r.area} | ${r.figure} | ${r.value} | ${r.target} | ${r.met} |`)].join("\n");
  const head = `Measured by \`npm run bench\` (bench/run.ts) on ${started.toISOString().slice(0, 16).replace("T", " ")} UTC in one run, Node ${process.version}, ${os.cpus().length} cores (${os.cpus()[0]?.model ?? "?"}), shared machine. Load average at the start: ${loadStart}; at the end: ${loadEnd}.`;
  const section = `<!-- bench:start -->\n## Benchmarks\n\n${head}\n\n${table}\n\n${notes.map((n) => `- ${n}`).join("\n")}\n<!-- bench:end -->`;
  process.stdout.write(`\n${head}\n\n${table}\n`);
  const file = path.join(ROOT, "bench/RESULTS.md");
  const old = fs.existsSync(file) ? fs.readFileSync(file, "utf8") : "# Kitwright results\n\n";
  const next = /<!-- bench:start -->[\s\S]*<!-- bench:end -->/.test(old) ? old.replace(/<!-- bench:start -->[\s\S]*<!-- bench:end -->/, section) : `${old.trimEnd()}\n\n${section}\n`;
  fs.writeFileSync(file, next);
  process.stderr.write(`bench: written to bench/RESULTS.md\n`);
}

main().catch((e) => {
  process.stderr.write(`bench failed: ${(e as Error).stack ?? e}\n`);
  process.exit(1);
});
