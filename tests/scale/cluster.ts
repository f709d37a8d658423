// Several Kitwright processes on loopback, as they would run on several machines: app processes (the production
// server, scripts/serve-app.sh: `next start`, needs a `next build`) and worker processes (workers/main.ts), sharing
// one MariaDB database, one Redis database and one S3-compatible store (the S3 fake, tests/scale/s3-fake.ts, in a
// process of its own). The database (`kitwright_scale`, made fresh and migrated) and the Redis database (number
// 7, emptied) are the harness's own, so the test profile's app and worker never see its jobs or rows. Each
// process runs in its own process group, so a kill (SIGKILL) reaches everything it started, and its resident
// memory (the group's) is sampled while it runs. Used by tests/scale/scale.test.ts and bench/scale.ts.
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import knexFactory from "knex";

export const ROOT = path.resolve(import.meta.dirname, "../..");
const SCALE_DB = "kitwright_scale";
const SCALE_REDIS_DB = 7;
export const SCALE_BUCKET = "kw-scale";

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function portFree(p: number): Promise<boolean> {
  return new Promise<boolean>((res) => {
    const s = net.createServer().once("error", () => res(false)).listen(p, "127.0.0.1", () => s.close(() => res(true)));
  });
}
/** `count` free loopback ports from `from` upward. */
export async function freePorts(from: number, count: number): Promise<number[]> {
  const out: number[] = [];
  for (let p = from; out.length < count && p < from + 200; p++) if (await portFree(p)) out.push(p);
  if (out.length < count) throw new Error(`no ${count} free ports from ${from}`);
  return out;
}

/** Resident memory (kB) of every process of a process group, from /proc. */
function groupRssKb(pgid: number): number {
  let kb = 0;
  for (const d of fs.readdirSync("/proc")) {
    if (!/^\d+$/.test(d)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${d}/stat`, "utf8");
      if (Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[2]) !== pgid) continue;
      const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${d}/status`, "utf8"));
      if (m) kb += Number(m[1]);
    } catch {
      /* gone meanwhile */
    }
  }
  return kb;
}

/** One service process (and whatever it starts), in its own process group. */
export class Proc {
  child: ChildProcess | null = null;
  readonly log: string[] = [];
  starts = 0;
  peakRssMb = 0;
  /** What the last readiness probe met (reported when the process does not become ready). */
  lastProbe = "";
  private sampler: NodeJS.Timeout | null = null;
  constructor(
    readonly name: string,
    private readonly cmd: string,
    private readonly args: string[],
    private readonly env: NodeJS.ProcessEnv,
    private readonly ready: (log: string) => boolean | Promise<boolean>,
  ) {}
  get running(): boolean {
    return !!this.child && this.child.exitCode === null && this.child.signalCode === null;
  }
  async start(timeoutMs = 120_000): Promise<void> {
    if (this.running) throw new Error(`${this.name} is already running`);
    this.starts++;
    const child = spawn(this.cmd, this.args, { cwd: ROOT, env: this.env, detached: true, stdio: ["ignore", "pipe", "pipe"] });
    this.child = child;
    this.log.push(`--- start ${this.starts} (pid ${child.pid})\n`);
    child.stdout!.on("data", (d) => this.log.push(String(d)));
    child.stderr!.on("data", (d) => this.log.push(String(d)));
    this.sampler = setInterval(() => this.sampleRss(), 500);
    const end = Date.now() + timeoutMs;
    while (!(await this.ready(this.log.join("")))) {
      if (!this.running) throw new Error(`${this.name} exited while starting:\n${this.tail()}`);
      if (Date.now() > end) throw new Error(`${this.name} did not become ready in ${timeoutMs / 1000} s (${this.lastProbe}):\n${this.tail()}`);
      await sleep(200);
    }
  }
  sampleRss(): void {
    if (this.running) this.peakRssMb = Math.max(this.peakRssMb, groupRssKb(this.child!.pid!) / 1024);
  }
  /** Sends a signal to the whole group (SIGKILL: the machine lost power, the process was killed by the OOM killer). */
  kill(signal: NodeJS.Signals = "SIGKILL"): void {
    if (!this.child?.pid) return;
    try {
      process.kill(-this.child.pid, signal);
    } catch {
      /* already gone */
    }
  }
  async exited(timeoutMs = 15_000): Promise<boolean> {
    const end = Date.now() + timeoutMs;
    while (this.running && Date.now() < end) await sleep(50);
    return !this.running;
  }
  /** Stops the process (SIGTERM, then SIGKILL after 15 s). */
  async stop(): Promise<void> {
    if (this.sampler) clearInterval(this.sampler);
    this.sampler = null;
    if (!this.running) return;
    this.kill("SIGTERM");
    if (!(await this.exited())) this.kill("SIGKILL");
    await this.exited(5000);
  }
  /** SIGKILL, then wait until it is gone. */
  async killHard(): Promise<void> {
    this.kill("SIGKILL");
    await this.exited(10_000);
    if (this.sampler) clearInterval(this.sampler);
    this.sampler = null;
  }
  tail(chars = 3000): string {
    return this.log.join("").slice(-chars);
  }
}

export interface ClusterOptions {
  apps: number;
  workers: number;
  /** Measuring threads per worker (KW_MEASURE_THREADS; default: one per core). */
  measureThreads?: number;
}

export class Cluster {
  readonly apps: Proc[] = [];
  readonly workers: Proc[] = [];
  s3!: Proc;
  appPorts: number[] = [];
  s3Port = 0;
  env: NodeJS.ProcessEnv = { ...process.env };
  readonly dir = fs.mkdtempSync(path.join(os.tmpdir(), "kw-scale-"));

  appUrl(i: number): string {
    return `http://127.0.0.1:${this.appPorts[i]}`;
  }

  /**
   * The environment every process of the cluster shares (and this process, so lib/server reads the same
   * database, Redis and store): the test profile's services (scripts/env.sh), with the scale database, Redis
   * database 7 and the S3 fake's bucket. The public address is the first app's (as behind a load balancer).
   */
  async prepare(o: ClusterOptions): Promise<void> {
    const base = process.env;
    for (const v of ["KW_DB_PORT", "KW_REDIS_URL", "NEXTAUTH_SECRET"]) if (!base[v]) throw new Error(`${v} is not set: run through scripts/with-test-env.sh, scripts/test.sh or scripts/scale.sh`);
    if (!fs.existsSync(path.join(ROOT, ".next", "BUILD_ID"))) throw new Error("no production build (.next): run `npx next build` first");
    const firstApp = Number(base.KW_SCALE_APP_PORT ?? base.KW_APP_PORT ?? 3100);
    this.appPorts = await freePorts(firstApp, o.apps);
    [this.s3Port] = await freePorts(Number(base.KW_SCALE_S3_PORT ?? 4576), 1);
    const redisUrl = `${base.KW_REDIS_URL!.replace(/\/\d*$/, "")}/${SCALE_REDIS_DB}`;
    this.env = {
      ...base,
      KW_DB_NAME: SCALE_DB,
      KW_REDIS_URL: redisUrl,
      KW_S3_BUCKET: SCALE_BUCKET,
      KW_S3_ENDPOINT: `http://127.0.0.1:${this.s3Port}`,
      KW_S3_ACCESS_KEY: "S3RVER",
      KW_S3_SECRET_KEY: "S3RVER",
      KW_STORAGE_DIR: path.join(this.dir, "no-local-storage"),
      KW_APP_URL: this.appUrl(0),
      NEXTAUTH_URL: this.appUrl(0),
      NEXT_TELEMETRY_DISABLED: "1",
      ...(o.measureThreads !== undefined ? { KW_MEASURE_THREADS: String(o.measureThreads) } : {}),
    };
    Object.assign(process.env, { KW_DB_NAME: SCALE_DB, KW_REDIS_URL: redisUrl, KW_S3_BUCKET: SCALE_BUCKET, KW_S3_ENDPOINT: this.env.KW_S3_ENDPOINT, KW_S3_ACCESS_KEY: "S3RVER", KW_S3_SECRET_KEY: "S3RVER" });

    // a fresh database and Redis database of the harness's own
    const k = knexFactory({ client: "mysql2", connection: { host: base.KW_DB_HOST ?? "127.0.0.1", port: Number(base.KW_DB_PORT), user: base.KW_DB_USER ?? "kitwright", password: base.KW_DB_PASSWORD ?? "kitwright-local" }, pool: { min: 0, max: 1 } });
    try {
      await k.raw(`DROP DATABASE IF EXISTS \`${SCALE_DB}\``);
      await k.raw(`CREATE DATABASE \`${SCALE_DB}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
    } finally {
      await k.destroy();
    }
    execFileSync(process.execPath, ["--import", "tsx", "db/migrate.ts"], { cwd: ROOT, env: this.env, stdio: "pipe", timeout: 120_000 });
    execFileSync("redis-cli", ["-u", redisUrl, "FLUSHDB"], { stdio: "pipe" });

    // --openssl-legacy-provider: s3rver makes the continuation token of a listing cut into pages with DES, which
    // OpenSSL 3 keeps in its legacy provider; without it every listing longer than a page answers 500
    this.s3 = new Proc("s3", process.execPath, ["--openssl-legacy-provider", "--import", "tsx", "tests/scale/s3-fake.ts", "--port", String(this.s3Port), "--dir", path.join(this.dir, "s3"), "--bucket", SCALE_BUCKET], this.env, (l) => l.includes("[s3-fake] listening"));
    for (let i = 0; i < o.apps; i++) {
      const url = this.appUrl(i);
      this.apps.push(
        new Proc(`app ${i + 1}`, "bash", ["scripts/serve-app.sh", "-p", String(this.appPorts[i]), "-H", "127.0.0.1"], { ...this.env, NODE_ENV: "production" }, async () => {
          try {
            const r = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(5000) });
            if (r.status === 200) return true;
            this.apps[i]!.lastProbe = `HTTP ${r.status} ${(await r.text()).slice(0, 300)}`;
          } catch (e) {
            this.apps[i]!.lastProbe = `${(e as Error).message} ${String((e as { cause?: unknown }).cause ?? "")}`;
          }
          return false;
        }),
      );
    }
    for (let i = 0; i < o.workers; i++) {
      this.workers.push(new Proc(`worker ${i + 1}`, process.execPath, ["--conditions=react-server", "--import", "tsx", "workers/main.ts"], this.env, (l) => (l.match(/\[worker\] ready/g) ?? []).length >= this.workers[i]!.starts));
    }
  }

  async startAll(): Promise<void> {
    await this.s3.start(30_000);
    await Promise.all(this.apps.map((a) => a.start()));
    await Promise.all(this.workers.map((w) => w.start()));
  }

  all(): Proc[] {
    return [...this.apps, ...this.workers, ...(this.s3 ? [this.s3] : [])];
  }

  async close(): Promise<void> {
    await Promise.all([...this.apps, ...this.workers].map((p) => p.stop()));
    await this.s3?.stop();
    fs.rmSync(this.dir, { recursive: true, force: true });
  }
}

// ------------------------------------------------------------------ the client

export interface HttpAnswer { status: number; json: any }

/** A request to one app, as a browser on that address would send it (session cookie, its own Origin). */
export async function api(cluster: Cluster, app: number, method: string, urlPath: string, o: { cookie: string; json?: unknown; form?: FormData; timeoutMs?: number }): Promise<HttpAnswer> {
  const origin = cluster.appUrl(app);
  const headers: Record<string, string> = { cookie: o.cookie, origin };
  let body: BodyInit | undefined;
  if (o.json !== undefined) {
    headers["content-type"] = "application/json";
    body = JSON.stringify(o.json);
  } else if (o.form) body = o.form;
  const r = await fetch(`${origin}${urlPath}`, { method, headers, body, signal: AbortSignal.timeout(o.timeoutMs ?? 120_000) });
  const text = await r.text();
  let json: any = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = { raw: text.slice(0, 500) };
  }
  return { status: r.status, json };
}

/** What a client does when an app went away under its request: connection refused or reset, or a 502/503/504 from a proxy. */
export class Unreachable extends Error {}

export interface SentFile { name: string; bytes: Uint8Array }
export interface FileOutcome { name: string; status: "queued" | "duplicate" | "refused"; code?: string; reason?: string; sampleId?: string }

/** Sends one batch of files as one multipart upload; every file's outcome, or Unreachable when the app went away. */
export async function uploadBatch(cluster: Cluster, app: number, cookie: string, studioId: string, libraryId: string, files: SentFile[]): Promise<FileOutcome[]> {
  const form = new FormData();
  for (const f of files) form.append("file", new Blob([f.bytes as BlobPart], { type: "audio/wav" }), f.name);
  let r: HttpAnswer;
  try {
    r = await api(cluster, app, "POST", `/api/studios/${studioId}/libraries/${libraryId}/uploads`, { cookie, form });
  } catch (e) {
    throw new Unreachable(`app ${app + 1}: ${(e as Error).message} ${String((e as { cause?: unknown }).cause ?? "")}`);
  }
  if ([502, 503, 504].includes(r.status)) throw new Unreachable(`app ${app + 1}: HTTP ${r.status}`);
  const outcomes = (r.status === 201 ? r.json?.files : r.json?.error?.details?.files) as FileOutcome[] | undefined;
  if (!outcomes || (r.status !== 201 && r.status !== 422)) throw new Error(`upload to app ${app + 1} answered ${r.status}: ${JSON.stringify(r.json).slice(0, 500)}`);
  return outcomes;
}
