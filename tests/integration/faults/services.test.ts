// Faults: a private MariaDB and Redis (own ports and folders, never the test profile's) behind the app's real
// route handlers in their own process (tests/faults/serve.ts). The database or Redis is stopped and started
// while requests and uploads are under way. Expectations: a clear 503 { error: { code: "unavailable" } } while
// the database is away (503 Service Unavailable, RFC 9110 15.6.4), /api/health naming the service that is
// down, requests succeeding again after it returns, no orphan file and no half-written row, and uploads made
// while Redis is away recorded and queued once it is back.
import http from "node:http";
import fs from "node:fs";
import path from "node:path";
import type { ChildProcess } from "node:child_process";
import knexFactory, { type Knex } from "knex";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createSessionCookie, createStudio, createUser } from "@/db/factories";
import { measureJobId } from "@/lib/server/jobs";
import { uniq } from "../helpers";
import { bases } from "@/tests/hostile/mutate";
import { faultEnv, migrate, redisCli, startDb, startRedis, startServer, stopDb, stopRedis, teardown, type FaultEnv } from "@/tests/faults/services";

let f: FaultEnv;
let server: ChildProcess;
let k: Knex;
let cookie: string;
let studioId: string;
let libraryId: string;
const log: string[] = [];

type Res = { status: number; json: any };

function request(method: string, p: string, body?: { data: Uint8Array | string; type: string }, chunks?: (write: (b: Uint8Array) => void) => Promise<void>): Promise<Res> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string> = { cookie, origin: f.env.KW_APP_URL! };
    if (body) headers["content-type"] = body.type;
    const req = http.request({ host: "127.0.0.1", port: f.appPort, path: p, method, headers }, (res) => {
      const parts: Buffer[] = [];
      res.on("data", (d) => parts.push(d));
      res.on("end", () => {
        const text = Buffer.concat(parts).toString();
        let json: unknown = text;
        try { json = JSON.parse(text); } catch { /* not JSON */ }
        resolve({ status: res.statusCode ?? 0, json });
      });
    });
    req.on("error", reject);
    if (chunks) void chunks((b) => req.write(b)).then(() => req.end(), reject);
    else req.end(body?.data);
  });
}

const get = (p: string) => request("GET", p);

async function multipart(files: { name: string; data: Uint8Array }[]): Promise<{ data: Uint8Array; type: string }> {
  const fd = new FormData();
  for (const x of files) fd.append("file", new Blob([x.data as BlobPart]), x.name);
  const r = new Request("http://localhost/", { method: "POST", body: fd });
  return { data: new Uint8Array(await r.arrayBuffer()), type: r.headers.get("content-type")! };
}

function fresh(i: number): Uint8Array {
  // a valid WAV with its own bytes (never a duplicate of an earlier upload)
  const out = bases()[i % 7]!.bytes.slice();
  out.set(crypto.getRandomValues(new Uint8Array(4)), out.length - 6);
  return out;
}

const uploadsPath = () => `/api/studios/${studioId}/libraries/${libraryId}/uploads`;

/** Every row has its stored file and every stored file its row; no temporary files; no row left half-written. */
async function checkNoOrphans(opts: { partsAllowed?: boolean } = {}): Promise<{ rows: { id: string; state: string; storage_key: string }[] }> {
  const rows = await k("samples").where({ library_id: libraryId }).select("id", "state", "storage_key", "sha256", "size_bytes");
  const dir = path.join(f.env.KW_STORAGE_DIR!, `studios/${studioId}/libraries/${libraryId}`);
  const files = fs.existsSync(dir) ? fs.readdirSync(dir) : [];
  if (!opts.partsAllowed) expect(files.filter((x) => x.includes(".part"))).toEqual([]);
  expect(files.filter((x) => !x.includes(".part")).sort()).toEqual(rows.map((r: { id: string }) => `${r.id}.wav`).sort());
  for (const r of rows) {
    expect(r.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(Number(r.size_bytes)).toBe(fs.statSync(path.join(f.env.KW_STORAGE_DIR!, r.storage_key)).size);
  }
  return { rows };
}

async function until<T>(fn: () => Promise<T>, ok: (v: T) => boolean, ms: number, what: string): Promise<T> {
  const end = Date.now() + ms;
  let last: T | undefined;
  while (Date.now() < end) {
    last = await fn();
    if (ok(last)) return last;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${what}: still ${JSON.stringify(last)}`);
}

beforeAll(async () => {
  f = faultEnv(171);
  startDb(f, true);
  startRedis(f);
  migrate(f);
  server = await startServer(f, log);
  k = knexFactory({ client: "mysql2", connection: { host: "127.0.0.1", port: f.dbPort, user: f.env.KW_DB_USER ?? "kitwright", password: f.env.KW_DB_PASSWORD, database: "kitwright_faults", timezone: "Z" }, pool: { min: 0, max: 2 } });
  const owner = await createUser(k, { email: `${uniq("f")}@example.test`, name: "Fault owner", password: "correct-horse-9", verified: true });
  studioId = (await createStudio(k, { name: uniq("Faults"), ownerId: owner.id })).id;
  // the session row lives in the fault suite's own database, beside the user
  cookie = await createSessionCookie(k, owner.id, f.env.NEXTAUTH_SECRET!);
  const lib = await request("POST", `/api/studios/${studioId}/libraries`, { data: JSON.stringify({ name: "Fault library" }), type: "application/json" });
  expect(lib.status, JSON.stringify(lib.json)).toBe(201);
  libraryId = lib.json.id;
}, 120_000);

afterAll(async () => {
  await k?.destroy().catch(() => undefined);
  if (f) await teardown(f, server);
});

describe("faults: the database or Redis goes away", () => {
  it("with everything up, health is 200 and the routes answer", async () => {
    const h = await get("/api/health");
    expect(h.status).toBe(200);
    expect([h.json.database.ok, h.json.redis.ok, h.json.storage.ok]).toEqual([true, true, true]);
    expect((await get(`/api/studios/${studioId}/libraries`)).status).toBe(200);
  });

  it("MariaDB stopped: routes answer 503 unavailable with a clear message, health 503 names the database", async () => {
    stopDb(f);
    for (const p of ["/api/studios", `/api/studios/${studioId}/libraries`, `/api/studios/${studioId}/libraries/${libraryId}/samples`]) {
      const r = await get(p);
      expect(r.status, p).toBe(503);
      expect(r.json.error.code, p).toBe("unavailable");
      expect(r.json.error.message, p).toMatch(/database/i);
    }
    const up = await request("POST", uploadsPath(), await multipart([{ name: "while-down.wav", data: fresh(0) }]));
    expect(up.status).toBe(503);
    expect(up.json.error.code).toBe("unavailable");
    const h = await get("/api/health");
    expect(h.status).toBe(503);
    expect(h.json.database.ok).toBe(false);
    expect(h.json.database.error).toBeTruthy();
    expect(h.json.redis.ok).toBe(true);
  });

  it("after MariaDB returns, requests succeed again (the pool reconnects by itself)", async () => {
    startDb(f);
    await until(() => get(`/api/studios/${studioId}/libraries`), (r) => r.status === 200, 30_000, "libraries after the database returned");
    for (let i = 0; i < 3; i++) expect((await get(`/api/studios/${studioId}/libraries`)).status).toBe(200);
    expect((await get("/api/health")).status).toBe(200);
    await checkNoOrphans();
    expect((await k("samples").where({ library_id: libraryId }).count({ n: "*" }))[0]!.n).toBe(0);
  });

  it("MariaDB stopped in the middle of an upload: no 5xx other than 503, no orphan file or half-written row, the retry lands", async () => {
    const files = [{ name: "mid/one.wav", data: fresh(1) }, { name: "mid/two.wav", data: fresh(2) }];
    const body = await multipart(files);
    const cut = body.data.length - 2000; // inside the second file
    const r = await request("POST", uploadsPath(), { data: new Uint8Array(0), type: body.type }, async (write) => {
      write(body.data.subarray(0, cut));
      await new Promise((res) => setTimeout(res, 1500)); // the first file is stored and recorded meanwhile
      stopDb(f);
      write(body.data.subarray(cut));
    });
    console.log(`upload cut by the database stopping: ${r.status} ${JSON.stringify(r.json)}`);
    expect([201, 503]).toContain(r.status);
    if (r.status === 503) expect(r.json.error.code).toBe("unavailable");
    else for (const x of r.json.files) expect(x.status === "refused" ? x.reason.length > 5 : !!x.sampleId).toBe(true);
    startDb(f);
    await until(() => get(`/api/studios/${studioId}/libraries`), (x) => x.status === 200, 30_000, "libraries after the database returned");
    await checkNoOrphans();
    // the client retries the same batch: everything is in the library afterwards, each file once
    const retry = await request("POST", uploadsPath(), await multipart(files));
    expect(retry.status).toBe(201);
    for (const x of retry.json.files) expect(["queued", "duplicate"]).toContain(x.status);
    const { rows } = await checkNoOrphans();
    expect(rows).toHaveLength(2);
    for (const row of rows) expect(redisCli(f, "EXISTS", `bull:kw-measure:${measureJobId(row.id)}`)).toBe("1");
  });

  it("Redis stopped: health 503 names Redis; the database still answers", async () => {
    stopRedis(f);
    const h = await get("/api/health");
    expect(h.status).toBe(503);
    expect(h.json.redis.ok).toBe(false);
    expect(h.json.database.ok).toBe(true);
    expect((await get(`/api/studios/${studioId}/libraries`)).status).toBe(200);
  });

  it("an upload while Redis is stopped is recorded at once and its jobs are queued when Redis returns (ioredis offline queue)", async () => {
    const files = [{ name: "redis/a.wav", data: fresh(3) }, { name: "redis/b.wav", data: fresh(4) }];
    const pending = request("POST", uploadsPath(), await multipart(files));
    const rows = await until(() => k("samples").where({ library_id: libraryId }).where("rel_path", "like", "redis/%").select("id", "state"), (x) => x.length === 2, 15_000, "rows recorded while Redis is down");
    expect(rows.map((x: { state: string }) => x.state)).toEqual(["queued", "queued"]);
    startRedis(f);
    const r = await pending;
    expect(r.status).toBe(201);
    expect(r.json.counts.queued).toBe(2);
    for (const row of rows) expect(redisCli(f, "EXISTS", `bull:kw-measure:${measureJobId(row.id)}`)).toBe("1");
    await checkNoOrphans();
    expect((await get("/api/health")).status).toBe(200);
  });

  it("the server killed (SIGKILL) during an upload and restarted: no row for the cut file, the retry lands", async () => {
    const files = [{ name: "killed/one.wav", data: fresh(5) }];
    const body = await multipart(files);
    const r = request("POST", uploadsPath(), { data: new Uint8Array(0), type: body.type }, async (write) => {
      write(body.data.subarray(0, body.data.length - 3000));
      await new Promise((res) => setTimeout(res, 800));
      server.kill("SIGKILL");
    }).catch((e: Error) => ({ status: 0, json: e.message }));
    const cut = await r;
    expect(cut.status).toBe(0); // the connection dropped: the client shows a retry
    await new Promise((res) => setTimeout(res, 300));
    server = await startServer(f, []);
    expect(await k("samples").where({ library_id: libraryId, rel_path: "killed/one.wav" }).first()).toBeUndefined();
    const dir = path.join(f.env.KW_STORAGE_DIR!, `studios/${studioId}/libraries/${libraryId}`);
    console.log(`partial files left by the killed server: ${fs.readdirSync(dir).filter((x) => x.includes(".part")).join(", ") || "none"}`);
    await checkNoOrphans({ partsAllowed: true });
    const retry = await request("POST", uploadsPath(), await multipart(files));
    expect(retry.status).toBe(201);
    expect(retry.json.files[0].status).toBe("queued");
  });
});
