// npm run bench:measure [-- --files N]
// Generates N (default 500) one-shots (1.5 s, 48 kHz, 24-bit stereo) and times, in one run on all cores:
// the full measurement (read + decode + measure), a decode-only pass (read the bytes, convert to floats),
// and `sox FILE -n stats` on the same files; prints files/s, MB/s and the ratios, plus the peak RSS of each
// worker process early in the run and at the end (it should stay flat as the file count grows). The table is
// also written to bench/MEASURE-RESULTS.md. Workers are child processes (fork), one per core.
import { fork, spawn, type ChildProcess } from "node:child_process";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { availableParallelism, cpus, loadavg, tmpdir } from "node:os";
import path from "node:path";
import { decodeWav, encodeWav, measure } from "../lib/audio/index";
import { hit, lcg } from "../lib/audio/signals";

type Mode = "measure" | "decode" | "meyda";
type ToChild = { paths: string[] } | { done: true };
type FromChild = { ready: true } | { finished: number; maxRssKb: number; cpuMs: number };

const FS = 48000;
const SECONDS = 1.5;
const BATCH = 5;

// ---------------------------------------------------------------- worker side
async function child(mode: Mode): Promise<void> {
  if (mode === "meyda") meydaLib = ((await import("meyda")) as unknown as { default: typeof meydaLib }).default;
  const send = (m: FromChild) => process.send!(m);
  let cpu: NodeJS.CpuUsage | null = null;
  process.on("message", async (msg: ToChild) => {
    if ("done" in msg) { process.exit(0); }
    cpu ??= process.cpuUsage();
    for (const p of msg.paths) {
      const bytes = new Uint8Array(await readFile(p));
      const d = decodeWav(bytes);
      if (mode === "measure") measure(d);
      else if (mode === "meyda") meydaNaive(d.channels);
    }
    const used = process.cpuUsage(cpu);
    send({ finished: msg.paths.length, maxRssKb: process.resourceUsage().maxRSS, cpuMs: (used.user + used.system) / 1000 });
  });
  send({ ready: true });
}

/** Reference point only: meyda as commonly used, every 1024/512 frame of the mono mix, seven features. */
let meydaLib: { bufferSize: number; sampleRate: number; windowingFunction: string; extract: (f: string[], s: Float32Array) => unknown } | null = null;
function meydaNaive(channels: Float32Array[]): void {
  const n = channels[0].length;
  const mono = new Float32Array(n);
  for (const x of channels) for (let i = 0; i < n; i++) mono[i] += x[i] / channels.length;
  const m = meydaLib!;
  m.bufferSize = 1024;
  m.sampleRate = FS;
  m.windowingFunction = "hanning";
  for (let s = 0; s + 1024 <= n; s += 512) m.extract(["rms", "zcr", "spectralCentroid", "spectralFlatness", "spectralRolloff", "mfcc", "loudness"], mono.subarray(s, s + 1024));
}

// ---------------------------------------------------------------- generator
function oneShot(k: number): Float32Array[] {
  const r = lcg(1000 + k);
  const kind = k % 5; // kick, snare, tom, hat, cymbal-like: parameters from drum acoustics, varied per take
  const p =
    kind === 0 ? { f: 45 + 20 * Math.abs(r()), tau: 0.12 + 0.05 * r(), noiseMix: 0.1 } :
    kind === 1 ? { f: 170 + 40 * Math.abs(r()), tau: 0.09 + 0.03 * r(), noiseMix: 0.6 } :
    kind === 2 ? { f: 80 + 120 * Math.abs(r()), tau: 0.25 + 0.1 * r(), noiseMix: 0.15 } :
    kind === 3 ? { f: 400, tau: 0.04 + 0.02 * Math.abs(r()), noiseMix: 0.95 } :
    { f: 300, tau: 0.5 + 0.2 * Math.abs(r()), noiseMix: 0.9 };
  const amp = 0.2 + 0.7 * Math.abs(r());
  const L = hit(FS, SECONDS, { ...p, amp, leadSec: 0.002 * Math.abs(r()), noiseDb: -85, seed: 2 * k + 1 });
  const R = hit(FS, SECONDS, { ...p, amp: amp * (0.8 + 0.2 * Math.abs(r())), leadSec: 0.002, noiseDb: -85, seed: 2 * k + 2 });
  return [L, R];
}

// ---------------------------------------------------------------- runners
interface PassResult { seconds: number; rssEarlyMb: number; rssEndMb: number; cpuMsPerFile: number }

async function runPass(mode: Mode, files: string[], workers: number): Promise<PassResult> {
  const self = process.argv[1];
  const kids: ChildProcess[] = [];
  for (let i = 0; i < workers; i++) kids.push(fork(self, ["--child", mode], { stdio: ["ignore", "inherit", "inherit", "ipc"] }));
  await Promise.all(kids.map((k) => new Promise<void>((res) => k.once("message", () => res()))));
  let next = 0, done = 0;
  const earlyAt = Math.ceil(files.length / 5);
  const rss = new Map<ChildProcess, { early: number; end: number; seen: number; cpuMs: number }>();
  const t0 = performance.now();
  await new Promise<void>((resolve, reject) => {
    const feed = (k: ChildProcess) => {
      if (next >= files.length) { k.send({ done: true } satisfies ToChild); return; }
      const paths = files.slice(next, next + BATCH);
      next += paths.length;
      k.send({ paths } satisfies ToChild);
    };
    for (const k of kids) {
      rss.set(k, { early: 0, end: 0, seen: 0, cpuMs: 0 });
      k.on("message", (m: FromChild) => {
        if (!("finished" in m)) return;
        done += m.finished;
        const r = rss.get(k)!;
        r.seen += m.finished;
        r.end = m.maxRssKb;
        r.cpuMs = m.cpuMs;
        if (r.seen <= earlyAt / workers + BATCH) r.early = m.maxRssKb;
        if (done === files.length) resolve();
        else feed(k);
      });
      k.on("exit", (code) => { if (code && done < files.length) reject(new Error(`${mode} worker exited with ${code}`)); });
      feed(k);
    }
  });
  const seconds = (performance.now() - t0) / 1000;
  for (const k of kids) if (k.connected) k.send({ done: true } satisfies ToChild);
  const vals = [...rss.values()];
  return { seconds, rssEarlyMb: Math.max(...vals.map((v) => v.early)) / 1024, rssEndMb: Math.max(...vals.map((v) => v.end)) / 1024, cpuMsPerFile: vals.reduce((a, v) => a + v.cpuMs, 0) / files.length };
}

async function runSox(files: string[], workers: number): Promise<number> {
  let next = 0;
  const t0 = performance.now();
  const one = (f: string) => new Promise<void>((res, rej) => {
    const p = spawn("/usr/bin/sox", [f, "-n", "stats"], { stdio: ["ignore", "ignore", "pipe"] });
    let err = "";
    p.stderr.on("data", (d) => (err += d));
    p.on("close", (code) => (code === 0 && /RMS lev dB/.test(err) ? res() : rej(new Error(`sox failed on ${f}: ${err.slice(0, 200)}`))));
    p.on("error", rej);
  });
  await Promise.all(Array.from({ length: workers }, async () => { while (next < files.length) await one(files[next++]); }));
  return (performance.now() - t0) / 1000;
}

async function main(): Promise<void> {
  const i = process.argv.indexOf("--files");
  const count = i > 0 ? Number(process.argv[i + 1]) : 500;
  const workers = typeof availableParallelism === "function" ? availableParallelism() : cpus().length;
  const dir = await mkdtemp(path.join(tmpdir(), "kitwright-bench-"));
  try {
    process.stdout.write(`generating ${count} one-shots (1.5 s, 48 kHz, 24-bit stereo) in ${dir} ...\n`);
    const files: string[] = [];
    let bytes = 0;
    for (let k = 0; k < count; k++) {
      const wav = encodeWav(oneShot(k), { sampleRate: FS, bits: 24 });
      const f = path.join(dir, `oneshot-${String(k).padStart(4, "0")}.wav`);
      await writeFile(f, wav);
      files.push(f);
      bytes += wav.length;
    }
    const mb = bytes / 1e6;
    const loadStart = loadavg().map((v) => v.toFixed(2)).join(" ");
    process.stdout.write(`running on ${workers} worker process(es), ${mb.toFixed(1)} MB ...\n`);
    const full = await runPass("measure", files, workers);
    const dec = await runPass("decode", files, workers);
    const soxSec = await runSox(files, workers);
    const meydaFiles = files.slice(0, Math.min(files.length, 100));
    const naive = await runPass("meyda", meydaFiles, workers);
    const row = (name: string, s: number, cpuMs: number | null, extra: string) =>
      `| ${name} | ${(count / s).toFixed(1)} | ${(mb / s).toFixed(1)} | ${cpuMs === null ? "-" : cpuMs.toFixed(2)} | ${cpuMs === null ? "-" : ((workers * 1000) / cpuMs).toFixed(0)} | ${extra} |`;
    const table = [
      `| pass (${count} files, ${workers} worker processes) | files/s | MB/s | CPU ms per file | files/s if the ${workers} cores were ours alone | notes |`,
      "|---|---:|---:|---:|---:|---|",
      row("full measurement (read + decode + measure)", full.seconds, full.cpuMsPerFile, `peak RSS per worker ${full.rssEarlyMb.toFixed(0)} MB after ${Math.ceil(count / 5)} files, ${full.rssEndMb.toFixed(0)} MB at the end`),
      row("decode only (read + convert to floats)", dec.seconds, dec.cpuMsPerFile, `peak RSS per worker ${dec.rssEarlyMb.toFixed(0)} MB early, ${dec.rssEndMb.toFixed(0)} MB at the end`),
      row("sox FILE -n stats (Debian sox)", soxSec, null, "one sox process per file"),
      `| reference: meyda used naively (every 1024/512 frame, 7 features; first ${meydaFiles.length} files) | ${(meydaFiles.length / naive.seconds).toFixed(1)} | ${((mb * meydaFiles.length) / count / naive.seconds).toFixed(1)} | ${naive.cpuMsPerFile.toFixed(2)} | ${((workers * 1000) / naive.cpuMsPerFile).toFixed(0)} | what the spectrum-once-per-frame design avoids |`,
      "",
      `Ratios (wall time): full measurement takes ${(full.seconds / dec.seconds).toFixed(2)}x the decode-only time and ${(full.seconds / soxSec).toFixed(2)}x the sox stats time (decode-only vs sox: ${(dec.seconds / soxSec).toFixed(2)}x).`,
      `Load average when the run started: ${loadStart}; at the end: ${loadavg().map((v) => v.toFixed(2)).join(" ")} (other work on the machine lowers the wall-time figures; CPU ms per file depends on it less, though shared caches still slow it).`,
    ].join("\n");
    process.stdout.write("\n" + table + "\n");
    const when = new Date().toISOString().slice(0, 16).replace("T", " ");
    const md = `# Measurement benchmark\n\nProduced by \`npm run bench:measure\` (bench/measure.ts) on ${when} UTC, Node ${process.version}, ${cpus()[0]?.model ?? "unknown CPU"}.\nTarget: at least 100 files/s for the full measurement on 2 cores; peak RSS flat as the file count grows.\nThe machine is shared: the wall-time columns include other users' load; \"files/s if the cores were ours alone\" is cores x 1000 / CPU ms per file.\n\n${table}\n`;
    await writeFile(path.join(path.dirname(process.argv[1]), "MEASURE-RESULTS.md"), md);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

const ci = process.argv.indexOf("--child");
if (ci > 0) void child(process.argv[ci + 1] as Mode);
else main().catch((e) => { process.stderr.write(`bench:measure failed: ${(e as Error).stack ?? e}\n`); process.exit(1); });
