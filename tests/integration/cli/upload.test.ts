// `kitwright upload` as a person runs it: the real command (bin/kitwright.mjs, its own process, no terminal so
// plain lines) against a running app (every route handler served over HTTP on loopback, tests/integration/
// route-server.ts) on the test MariaDB and Redis, with a personal API token in $KITWRIGHT_TOKEN. Expected counts
// come from how the folders were built (which files are good, broken or repeated), and each digest from
// node:crypto's SHA-256 (FIPS 180-4).
import { spawn } from "node:child_process";
import crypto from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, closeDb } from "@/lib/server/db";
import { closeQueues } from "@/lib/server/jobs";
import { createLibrary } from "@/lib/server/catalogue/libraries";
import { createApiToken, revokeApiToken } from "@/lib/server/auth/api-tokens";
import { makeStudioWithRoles, uniq } from "../helpers";
import { hitWav, notWav, zipOf } from "../catalogue/helpers";
import { startRouteServer, type RunningApp } from "../route-server";

const BIN = path.resolve("bin/kitwright.mjs");
let app: RunningApp;
let w: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let token: string;
let cache: string;
const dirs: string[] = [];

beforeAll(async () => {
  app = await startRouteServer();
  w = await makeStudioWithRoles();
  token = (await createApiToken({ userId: w.users.editor.id, input: { name: "cli test", studioId: w.studio.id, role: "editor", expiresInDays: 1 } })).secret;
  cache = fs.mkdtempSync(path.join(os.tmpdir(), "kw-cli-cache-"));
}, 120_000);
afterAll(async () => {
  await app?.close();
  for (const d of [...dirs, cache]) fs.rmSync(d, { recursive: true, force: true });
  await closeQueues();
  await closeDb();
});

const sha256 = (b: Uint8Array) => crypto.createHash("sha256").update(b).digest("hex");

function folder(files: Record<string, Uint8Array>): string {
  const d = fs.mkdtempSync(path.join(os.tmpdir(), "kw-up-"));
  dirs.push(d);
  for (const [rel, data] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(d, rel)), { recursive: true });
    fs.writeFileSync(path.join(d, rel), data);
  }
  return d;
}

async function newLibrary(): Promise<string> {
  return (await createLibrary({ studioId: w.studio.id, actorId: w.users.editor.id, name: uniq("CLI") })).id;
}

interface Run { code: number | null; stdout: string; stderr: string }

/** Runs the command; `onLine` sees each stdout line as it comes and may interrupt the process. */
function kitwright(args: string[], env: Record<string, string | undefined> = {}, onLine?: (line: string, child: ReturnType<typeof spawn>) => void): Promise<Run> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [BIN, ...args], { env: { ...process.env, KITWRIGHT_TOKEN: token, XDG_CACHE_HOME: cache, ...env }, stdio: ["ignore", "pipe", "pipe"] });
    let stdout = "";
    let stderr = "";
    let pending = "";
    child.stdout.on("data", (d: Buffer) => {
      stdout += d;
      pending += d;
      const lines = pending.split("\n");
      pending = lines.pop()!;
      for (const l of lines) onLine?.(l, child);
    });
    child.stderr.on("data", (d: Buffer) => (stderr += d));
    child.on("close", (code) => resolve({ code, stdout, stderr }));
  });
}

const upload = (target: string, libraryId: string, more: string[] = [], env: Record<string, string | undefined> = {}) => kitwright(["upload", target, "--library", libraryId, "--server", app.url, ...more], env);
const summaryCount = (out: string, what: string) => Number(new RegExp(`^  ${what} +(\\d+)`, "m").exec(out)?.[1] ?? NaN);
const uploadRequests = async (libraryId: string) =>
  Number((await db()("activity").where({ studio_id: w.studio.id, action: "token.used" }).andWhereRaw("details LIKE ?", [`%/libraries/${libraryId}/uploads%`]).count({ n: "*" }).first())!.n);

/** The upload requests counted once the server has finished with those in flight (an interrupted command's last
 * request can still be logged after the command exits): the count read again until it holds for half a second. */
async function settledUploadRequests(libraryId: string): Promise<number> {
  let n = await uploadRequests(libraryId);
  for (let i = 0; i < 20; i++) {
    await new Promise((r) => setTimeout(r, 500));
    const again = await uploadRequests(libraryId);
    if (again === n) return n;
    n = again;
  }
  return n;
}

async function libraryFiles(libraryId: string): Promise<Record<string, string>> {
  const rows = await db()("samples").where({ library_id: libraryId }).select("rel_path", "sha256");
  return Object.fromEntries(rows.map((r) => [r.rel_path, r.sha256]));
}

describe("kitwright upload", () => {
  it("sends a folder, refuses a broken file with its reason (exit 1), and a rerun skips everything by hash", async () => {
    const good = { "Kick/kick_01.wav": hitWav(7001), "Kick/kick_02.wav": hitWav(7002), "Snare/snare_01.wav": hitWav(7003, { freq: 240 }), "Snare/snare_02.wav": hitWav(7004, { freq: 240 }), "tom.WAV": hitWav(7005, { freq: 120 }) };
    const broken = notWav(7006);
    const dir = folder({ ...good, "Snare/broken.wav": broken, "Kick/kick_03.wav": good["Kick/kick_01.wav"], "notes.txt": new TextEncoder().encode("not a sample") });
    const lib = await newLibrary();

    const first = await upload(dir, lib, ["--jobs", "3"]);
    expect(first.stderr).toBe("");
    expect(first.code).toBe(1);
    expect(first.stdout).toMatch(/^refused Snare\/broken\.wav: .*not a WAV/m);
    expect(first.stdout).toMatch(/^    Snare\/broken\.wav: /m);
    expect([summaryCount(first.stdout, "sent"), summaryCount(first.stdout, "skipped"), summaryCount(first.stdout, "refused")]).toEqual([5, 1, 1]);
    expect(first.stdout).toMatch(/^  skipped  1 \(1 repeated in the folder\)$/m);
    // the good files landed, each once, under its path in the folder, with the digest of its bytes
    expect(await libraryFiles(lib)).toEqual(Object.fromEntries(Object.entries(good).map(([p, b]) => [p, sha256(b)])));
    expect(await uploadRequests(lib)).toBe(6);

    // again: every good file is skipped by its digest; only the refused file is sent again, and refused again
    const second = await upload(dir, lib);
    expect(second.code).toBe(1);
    expect([summaryCount(second.stdout, "sent"), summaryCount(second.stdout, "skipped"), summaryCount(second.stdout, "refused")]).toEqual([0, 6, 1]);
    expect(second.stdout).toMatch(/^  skipped  6 \(5 already in the library, 5 of them sent by an earlier run; 1 repeated in the folder\)$/m);
    expect(await uploadRequests(lib)).toBe(7);

    // without the broken file nothing is sent and all is well
    fs.rmSync(path.join(dir, "Snare/broken.wav"));
    const third = await upload(dir, lib);
    expect(third.code).toBe(0);
    expect([summaryCount(third.stdout, "sent"), summaryCount(third.stdout, "skipped"), summaryCount(third.stdout, "refused")]).toEqual([0, 6, 0]);
    expect(await uploadRequests(lib)).toBe(7);
    expect(Object.keys(await libraryFiles(lib))).toHaveLength(5);
  });

  it("resumes after an interruption: the second run sends only what is missing", async () => {
    const files = Object.fromEntries(Array.from({ length: 40 }, (_, i) => [`Hat/hat_${String(i).padStart(2, "0")}.wav`, hitWav(7100 + i, { freq: 400 + i })]));
    const dir = folder(files);
    const lib = await newLibrary();
    let sent = 0;
    const first = await kitwright(["upload", dir, "--library", lib, "--server", app.url, "--jobs", "1"], {}, (line, child) => {
      if (line.startsWith("sent ") && ++sent === 3) child.kill("SIGINT");
    });
    expect(first.code).toBe(130);
    expect(first.stdout).toMatch(/^interrupted: 40 files/m);
    expect(first.stdout).toMatch(/run the same command again to send them/);
    const requestsBefore = await settledUploadRequests(lib);
    const landed = Object.keys(await libraryFiles(lib)).length;
    expect(landed).toBeGreaterThanOrEqual(3);
    expect(landed).toBeLessThan(40);

    const second = await upload(dir, lib, ["--jobs", "4"]);
    expect(second.code).toBe(0);
    expect(summaryCount(second.stdout, "sent")).toBe(40 - landed);
    expect(summaryCount(second.stdout, "skipped")).toBe(landed);
    expect(await uploadRequests(lib)).toBe(requestsBefore + 40 - landed);
    expect(await libraryFiles(lib)).toEqual(Object.fromEntries(Object.entries(files).map(([p, b]) => [p, sha256(b)])));
    // the state file sits in the cache folder, one per server + library + folder
    expect(fs.readdirSync(path.join(cache, "kitwright", "uploads")).filter((f) => f.startsWith(lib))).toHaveLength(1);
  });

  it("sends the WAV entries of a zip pack and skips them the second time", async () => {
    const entries = [
      { name: "Pack/Ride/ride_01.wav", data: hitWav(7201, { freq: 600 }) },
      { name: "Pack/Ride/ride_02.wav", data: hitWav(7202, { freq: 610 }) },
      { name: "Pack/readme.txt", data: new TextEncoder().encode("hello") },
      { name: "__MACOSX/Pack/._ride_01.wav", data: new Uint8Array(10) },
    ];
    const dir = folder({ "pack.zip": zipOf(entries) });
    const lib = await newLibrary();
    const first = await upload(path.join(dir, "pack.zip"), lib);
    expect(first.code).toBe(0);
    expect(summaryCount(first.stdout, "sent")).toBe(2);
    expect(await libraryFiles(lib)).toEqual({ "Pack/Ride/ride_01.wav": sha256(entries[0]!.data), "Pack/Ride/ride_02.wav": sha256(entries[1]!.data) });
    const again = await upload(path.join(dir, "pack.zip"), lib);
    expect([again.code, summaryCount(again.stdout, "sent"), summaryCount(again.stdout, "skipped")]).toEqual([0, 0, 2]);
  });

  it("says clearly what is wrong with the token, the library or the server", async () => {
    const dir = folder({ "a.wav": hitWav(7301) });
    const lib = await newLibrary();
    const noToken = await upload(dir, lib, [], { KITWRIGHT_TOKEN: "" });
    expect([noToken.code, noToken.stderr]).toEqual([2, expect.stringMatching(/set \$KITWRIGHT_TOKEN to a personal API token/)]);
    const unknown = await upload(dir, lib, [], { KITWRIGHT_TOKEN: `kwt_${"x".repeat(43)}` });
    expect([unknown.code, unknown.stderr]).toEqual([3, expect.stringMatching(/the server refused the token in \$KITWRIGHT_TOKEN: This API token is not known/)]);
    const noLib = await upload(dir, crypto.randomUUID());
    expect([noLib.code, noLib.stderr]).toEqual([3, expect.stringMatching(/the studio ".*" \(the token's studio\) has no library/)]);
    const badId = await upload(dir, "not-an-id");
    expect([badId.code, badId.stderr]).toEqual([2, expect.stringMatching(/"not-an-id" is not a library id/)]);
    // nobody listens on a port just closed
    const closed = http.createServer();
    await new Promise<void>((r) => closed.listen(0, "127.0.0.1", r));
    const port = (closed.address() as AddressInfo).port;
    await new Promise<void>((r) => closed.close(() => r()));
    const down = await kitwright(["upload", dir, "--library", lib, "--server", `http://127.0.0.1:${port}`]);
    expect([down.code, down.stderr]).toEqual([3, expect.stringMatching(new RegExp(`cannot reach http://127\\.0\\.0\\.1:${port} \\(ECONNREFUSED\\)`))]);
    // a web server that is not Kitwright
    const other = http.createServer((_, res) => res.writeHead(404, { "content-type": "text/html" }).end("<h1>Not here</h1>"));
    await new Promise<void>((r) => other.listen(0, "127.0.0.1", r));
    const otherUrl = `http://127.0.0.1:${(other.address() as AddressInfo).port}`;
    const notOurs = await kitwright(["upload", dir, "--library", lib, "--server", otherUrl]);
    await new Promise<void>((r) => other.close(() => r()));
    expect([notOurs.code, notOurs.stderr]).toEqual([3, expect.stringMatching(/does not answer as a Kitwright server \(GET \/api\/whoami answered 404 text\/html\)/)]);
    // a viewer's token may not upload; a revoked token is refused
    const viewer = (await createApiToken({ userId: w.users.viewer.id, input: { name: "viewer cli", studioId: w.studio.id, role: "viewer", expiresInDays: 1 } })).secret;
    const asViewer = await upload(dir, lib, [], { KITWRIGHT_TOKEN: viewer });
    expect([asViewer.code, asViewer.stderr]).toEqual([3, expect.stringMatching(/acts as viewer in ".*": uploading needs the role of editor or owner/)]);
    const gone = await createApiToken({ userId: w.users.editor.id, input: { name: "gone", studioId: w.studio.id, role: "editor", expiresInDays: 1 } });
    await revokeApiToken({ userId: w.users.editor.id, tokenId: gone.token.id });
    const revoked = await upload(dir, lib, [], { KITWRIGHT_TOKEN: gone.secret });
    expect([revoked.code, revoked.stderr]).toEqual([3, expect.stringMatching(/This API token \("gone"\) was revoked/)]);
    expect(await libraryFiles(lib)).toEqual({});
  });
});
