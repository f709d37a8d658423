// Private MariaDB and Redis for the fault tests, on their own ports and folders (never the test profile's),
// started and stopped through the functions of scripts/lib.sh; plus the route server (tests/faults/serve.ts).
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";

const ROOT = path.resolve(import.meta.dirname, "../..");

export interface FaultEnv {
  dir: string;
  dbPort: number;
  redisPort: number;
  appPort: number;
  env: NodeJS.ProcessEnv;
}

function lib(cmd: string, env: NodeJS.ProcessEnv): string {
  return execFileSync("bash", ["-c", `source scripts/lib.sh; ${cmd}`], { cwd: ROOT, env, encoding: "utf8", stdio: ["ignore", "pipe", "pipe"], timeout: 60_000 });
}

export function faultEnv(base: number): FaultEnv {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "kwf-"));
  const dbPort = 34_000 + base;
  const redisPort = 64_000 + base;
  const appPort = 34_500 + base;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    KW_DB_PORT: String(dbPort),
    KW_DB_NAME: "kitwright_faults",
    KW_DB_PASSWORD: process.env.KW_DB_PASSWORD ?? "kitwright-local",
    KW_REDIS_URL: `redis://127.0.0.1:${redisPort}`,
    KW_STORAGE_DIR: path.join(dir, "storage"),
    KW_APP_URL: `http://127.0.0.1:${appPort}`,
    NEXTAUTH_URL: `http://127.0.0.1:${appPort}`,
    KW_MEASURE_THREADS: "0",
  };
  return { dir, dbPort, redisPort, appPort, env };
}

export function startDb(f: FaultEnv, withDatabase = false): void {
  lib(`start_mariadb "${f.dir}" "${f.dir}/run" ${f.dbPort}${withDatabase ? ` && create_database "${f.dir}/run" kitwright_faults` : ""}`, f.env);
}
export function stopDb(f: FaultEnv): void {
  lib(`stop_mariadb "${f.dir}/run"; for _ in $(seq 1 100); do [ -S "${f.dir}/run/mariadb.sock" ] || break; sleep 0.1; done`, f.env);
}
export function startRedis(f: FaultEnv): void {
  lib(`start_redis "${f.dir}" "${f.dir}/run" ${f.redisPort}`, f.env);
}
export function stopRedis(f: FaultEnv): void {
  lib(`stop_redis "${f.dir}/run" ${f.redisPort}; for _ in $(seq 1 50); do redis-cli -h 127.0.0.1 -p ${f.redisPort} ping >/dev/null 2>&1 || break; sleep 0.1; done`, f.env);
}
export function migrate(f: FaultEnv): void {
  execFileSync(process.execPath, ["--import", "tsx", "db/migrate.ts"], { cwd: ROOT, env: f.env, stdio: "ignore", timeout: 60_000 });
}
export function redisCli(f: FaultEnv, ...args: string[]): string {
  return execFileSync("redis-cli", ["-h", "127.0.0.1", "-p", String(f.redisPort), ...args], { encoding: "utf8" }).trim();
}

/** Starts the route server on the fault env's port and waits until it listens. */
export async function startServer(f: FaultEnv, log: string[] = []): Promise<ChildProcess> {
  const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "tests/faults/serve.ts", "--port", String(f.appPort)], { cwd: ROOT, env: f.env, stdio: ["ignore", "pipe", "pipe"] });
  child.stdout!.on("data", (d) => log.push(String(d)));
  child.stderr!.on("data", (d) => log.push(String(d)));
  const end = Date.now() + 30_000;
  while (Date.now() < end) {
    if (log.join("").includes("[serve] listening")) return child;
    if (child.exitCode !== null) break;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`route server did not start:\n${log.join("")}`);
}

/** Stops everything and removes the folder (best effort; each step on its own). */
export async function teardown(f: FaultEnv, server?: ChildProcess): Promise<void> {
  if (server && server.exitCode === null) {
    server.kill("SIGTERM");
    await new Promise((r) => setTimeout(r, 300));
    if (server.exitCode === null) server.kill("SIGKILL");
  }
  try { stopRedis(f); } catch { /* already down */ }
  try { stopDb(f); } catch { /* already down */ }
  fs.rmSync(f.dir, { recursive: true, force: true });
}
