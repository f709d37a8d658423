// Upload benchmark: a batch of generated WAV one-shots (2 GB by default) streamed over loopback as one
// multipart/form-data request to the real upload route handler (served by tests/faults/serve.ts in its own
// process, against the bench database, a Redis database of its own and a scratch storage folder). The body is
// produced on the fly (never held in memory); the server's resident memory is sampled from /proc every 100 ms.
// Reports MB/s (bytes sent / time to the response) and the server's RSS growth over its idle, warmed-up RSS.
// Diagnostics for the plain-server run: KW_BENCH_CPU_PROF=<dir> (a CPU profile), KW_BENCH_TRACE_GC=1 with
// KW_BENCH_SERVER_LOG=<file> (V8's --trace-gc lines: the RSS growth is heap awaiting a mark-compact, see
// bench/RESULTS.md finding 8).
import { spawn } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import knexFactory from "knex";
import { createSessionCookie, createStudio, createUser } from "../db/factories";
import { benchFile } from "./generate";

export interface UploadBench { bytes: number; files: number; seconds: number; mbPerSec: number; rssIdleMb: number; rssPeakMb: number; rssGrowthMb: number; status: number; queued: number; refused: number; duplicate: number }

function rssOfKb(pid: number): number {
  try {
    const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${pid}/status`, "utf8"));
    return m ? Number(m[1]) : 0;
  } catch {
    return 0;
  }
}

/** Resident memory of a process and all its descendants (next start may serve from a child process). */
function rssKb(root: number): number {
  const children = new Map<number, number[]>();
  for (const d of fs.readdirSync("/proc")) {
    if (!/^\d+$/.test(d)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${d}/stat`, "utf8");
      const ppid = Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]);
      (children.get(ppid) ?? children.set(ppid, []).get(ppid)!).push(Number(d));
    } catch {
      /* gone */
    }
  }
  let total = 0;
  const stack = [root];
  while (stack.length) {
    const p = stack.pop()!;
    total += rssOfKb(p);
    stack.push(...(children.get(p) ?? []));
  }
  return total;
}

/**
 * via "serve": the route handler in a plain Node HTTP server (tests/faults/serve.ts); via "next": the production
 * server as deployed (scripts/serve-app.sh: `next start` with the app's Node settings; needs a build in .next).
 * KW_BENCH_NODE_FLAGS adds Node flags to either.
 */
export async function runUploadBench(baseEnv: NodeJS.ProcessEnv, opts: { totalBytes?: number; port?: number; via?: "serve" | "next" } = {}): Promise<UploadBench> {
  const via = opts.via ?? "serve";
  const total = opts.totalBytes ?? 2 * 1024 ** 3;
  const port = opts.port ?? 3470;
  const scratch = fs.mkdtempSync(path.join(os.tmpdir(), "kw-bench-upload-"));
  const redisUrl = `${baseEnv.KW_REDIS_URL}/5`;
  const env: NodeJS.ProcessEnv = { ...baseEnv, KW_STORAGE_DIR: scratch, KW_REDIS_URL: redisUrl, KW_APP_URL: `http://127.0.0.1:${port}`, NEXTAUTH_URL: `http://127.0.0.1:${port}`, KW_UPLOAD_MAX_BATCH_BYTES: String(total + 64 * 1024 ** 2) };
  const k = knexFactory({ client: "mysql2", connection: { host: env.KW_DB_HOST, port: Number(env.KW_DB_PORT), user: env.KW_DB_USER, password: env.KW_DB_PASSWORD, database: env.KW_DB_NAME, timezone: "Z" }, pool: { min: 0, max: 2 } });
  const user = await createUser(k, { email: `upload-bench-${crypto.randomBytes(4).toString("hex")}@example.test`, name: "Upload bench", password: "correct-horse-9" });
  const studio = await createStudio(k, { name: `Upload bench ${crypto.randomBytes(3).toString("hex")}`, ownerId: user.id });
  const libraryId = crypto.randomUUID();
  await k("libraries").insert({ id: libraryId, studio_id: studio.id, name: "upload-bench", created_by: user.id });
  const cookie = await createSessionCookie(k, user.id, env.NEXTAUTH_SECRET!);

  const log: string[] = [];
  const nodeFlags = [...(process.env.KW_BENCH_TRACE_GC ? ["--trace-gc"] : []), ...(process.env.KW_BENCH_NODE_FLAGS ?? "").split(" ").filter(Boolean)];
  const server =
    via === "next"
      ? spawn("bash", ["scripts/serve-app.sh", "-p", String(port), "-H", "127.0.0.1"], { env: { ...env, NODE_ENV: "production", KW_APP_NODE_FLAGS: nodeFlags.join(" ") }, stdio: ["ignore", "pipe", "pipe"] })
      : spawn(process.execPath, [...(process.env.KW_BENCH_CPU_PROF ? ["--cpu-prof", `--cpu-prof-dir=${process.env.KW_BENCH_CPU_PROF}`] : []), ...nodeFlags, "--conditions=react-server", "--import", "tsx", "tests/faults/serve.ts", "--port", String(port)], { env, stdio: ["ignore", "pipe", "pipe"] });
  const ready = () => (via === "next" ? /Ready in/.test(log.join("")) : log.join("").includes("[serve] listening"));
  server.stdout!.on("data", (d) => log.push(String(d)));
  if (process.env.KW_BENCH_SERVER_LOG) server.stdout!.pipe(fs.createWriteStream(process.env.KW_BENCH_SERVER_LOG));
  server.stderr!.on("data", (d) => log.push(String(d)));
  try {
    for (let i = 0; i < 300 && !ready(); i++) await new Promise((r) => setTimeout(r, 100));
    if (!ready()) throw new Error(`upload server did not start: ${log.join("").slice(-500)}`);

    // a pool of distinct takes; each file is a pool take with its index written into its last bytes
    const pool = Array.from({ length: 30 }, (_, i) => benchFile(i).bytes);
    const boundary = `----kwbench${crypto.randomBytes(8).toString("hex")}`;
    const fileBytes = pool[0]!.length;
    const count = Math.floor(total / fileBytes);
    const post = (n: number, offset: number) =>
      new Promise<{ status: number; body: any; bytes: number }>((resolve, reject) => {
        const req = http.request({ host: "127.0.0.1", port, method: "POST", path: `/api/studios/${studio.id}/libraries/${libraryId}/uploads`, headers: { cookie, origin: env.KW_APP_URL!, "content-type": `multipart/form-data; boundary=${boundary}` } }, (res) => {
          const parts: Buffer[] = [];
          res.on("data", (d) => parts.push(d));
          res.on("end", () => resolve({ status: res.statusCode ?? 0, body: JSON.parse(Buffer.concat(parts).toString() || "null"), bytes: sent }));
        });
        req.on("error", reject);
        let i = 0;
        let sent = 0;
        const pump = () => {
          while (i < n) {
            const b = Buffer.from(pool[(offset + i) % pool.length]!);
            b.writeUInt32LE(offset + i, b.length - 4);
            const head = Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="bench/take_${String(offset + i).padStart(6, "0")}.wav"\r\nContent-Type: audio/wav\r\n\r\n`);
            i++;
            sent += head.length + b.length + 2;
            req.write(head);
            req.write(b);
            const ok = req.write("\r\n");
            if (!ok) return void req.once("drain", pump);
          }
          req.end(`--${boundary}--\r\n`);
        };
        pump();
      });

    // warm up (JIT, pools, first connections), then the idle RSS
    await post(20, 10_000_000);
    await new Promise((r) => setTimeout(r, 1000));
    const idle = rssKb(server.pid!);
    let peak = idle;
    const timer = setInterval(() => (peak = Math.max(peak, rssKb(server.pid!))), 100);
    const t0 = performance.now();
    const r = await post(count, 0);
    const seconds = (performance.now() - t0) / 1000;
    clearInterval(timer);
    peak = Math.max(peak, rssKb(server.pid!));
    const counts = r.body?.counts ?? {};
    if (r.status !== 201) process.stderr.write(`upload bench: HTTP ${r.status} ${JSON.stringify(r.body).slice(0, 300)}\n`);
    return { bytes: r.bytes, files: count, seconds, mbPerSec: r.bytes / 1024 ** 2 / seconds, rssIdleMb: idle / 1024, rssPeakMb: peak / 1024, rssGrowthMb: (peak - idle) / 1024, status: r.status, queued: counts.queued ?? 0, refused: counts.refused ?? 0, duplicate: counts.duplicate ?? 0 };
  } finally {
    server.kill("SIGTERM");
    for (let i = 0; i < 50 && server.exitCode === null; i++) await new Promise((r) => setTimeout(r, 100));
    if (server.exitCode === null) server.kill("SIGKILL");
    await k("sample_words").where({ library_id: libraryId }).delete().catch(() => undefined); // no foreign key (migration 0009)
    await k("libraries").where({ id: libraryId }).delete().catch(() => undefined);
    await k.destroy();
    fs.rmSync(scratch, { recursive: true, force: true });
    spawn("redis-cli", ["-u", redisUrl, "FLUSHDB"], { stdio: "ignore" });
  }
}
