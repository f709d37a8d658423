// Libraries, uploads, listening, labelling and permissions, through the real route handlers against the
// test MariaDB/Redis. Measuring runs inline here (measureSample + catalogueLibrary); the worker process is
// exercised in batch.test.ts.
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  process.env.KW_UPLOAD_MAX_FILE_BYTES = "100000";
  process.env.KW_UPLOAD_MAX_BATCH_BYTES = "2000000";
});

import fs from "node:fs";
import path from "node:path";
import { NextRequest } from "next/server";
import { call, makeStudioWithRoles, sessionCookie, uniq } from "../helpers";
import { db, closeDb } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { closeQueues, measureJobId, measureQueue } from "@/lib/server/jobs";
import { measureSample } from "@/lib/server/catalogue/measure";
import { catalogueLibrary } from "@/lib/server/catalogue/catalogue-library";
import { measureWav } from "@/lib/audio";
import { badHeaderWav, hitWav, multipart, notWav, rf64, zipOf } from "./helpers";
import * as libsRoute from "@/app/api/studios/[studioId]/libraries/route";
import * as libRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/route";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";
import * as samplesRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/route";
import * as relabelRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/relabel/route";
import * as confirmRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/confirm/route";
import * as audioRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/[sampleId]/audio/route";
import * as sampleRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/[sampleId]/route";
import * as instrumentsRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/instruments/route";
import * as instrumentRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/instruments/[instrumentId]/route";
import * as mergeRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/instruments/merge/route";
import * as healthRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/health/route";
import * as progressRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/progress/route";
import * as plotsRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/plots/route";

let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;

async function upload(files: { name: string; data: Uint8Array }[], user = ctx.users.editor, lib = libraryId, studioId = ctx.studio.id) {
  const { body, type } = await multipart(files);
  return call(uploadRoute.POST, { method: "POST", params: { studioId, libraryId: lib }, rawBody: body, headers: { "content-type": type }, user });
}

/** Sends a multipart body that arrives as the given stream (to cut it, or hold part of it back). */
async function uploadStream(stream: ReadableStream<Uint8Array>, type: string) {
  const cookie = await sessionCookie(ctx.users.editor);
  const base = env().KW_APP_URL;
  const req = new NextRequest(new URL("/api/x", base), { method: "POST", headers: { host: new URL(base).host, origin: new URL(base).origin, cookie: cookie!, "content-type": type }, body: stream, duplex: "half" } as unknown as ConstructorParameters<typeof NextRequest>[1]);
  return uploadRoute.POST(req, { params: Promise.resolve({ studioId: ctx.studio.id, libraryId }) });
}

async function measureAll(lib: string) {
  const rows = await db()("samples").where({ library_id: lib, state: "queued" }).select("id", "studio_id");
  for (const r of rows) await measureSample({ sampleId: r.id, studioId: r.studio_id }, async (b) => measureWav(b));
  await catalogueLibrary({ studioId: ctx.studio.id, libraryId: lib });
}

/** Calls a handler and keeps the body as bytes. */
async function rawGet(handler: typeof audioRoute.GET, params: Record<string, string>, headers: Record<string, string>, user: { id: string }) {
  const cookie = await sessionCookie(user);
  const req = new NextRequest(new URL("/api/test", env().KW_APP_URL), { headers: { host: new URL(env().KW_APP_URL).host, cookie: cookie!, ...headers } });
  const res = await handler(req, { params: Promise.resolve(params) });
  return { res, bytes: new Uint8Array(await res.arrayBuffer()) };
}

beforeAll(async () => {
  ctx = await makeStudioWithRoles();
  const r = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name: uniq("Lib"), description: "test pack" }, user: ctx.users.editor });
  expect(r.status).toBe(201);
  libraryId = r.json.id;
});

afterAll(async () => {
  await closeQueues();
  await closeDb();
});

describe("libraries", () => {
  it("creates, lists with counts, renames, refuses a clashing name", async () => {
    const name = uniq("Second");
    const c = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name }, user: ctx.users.owner });
    expect(c.status).toBe(201);
    const clash = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name }, user: ctx.users.owner });
    expect(clash.status).toBe(409);
    const p = await call(libRoute.PATCH, { method: "PATCH", params: { studioId: ctx.studio.id, libraryId: c.json.id }, body: { name: `${name} renamed`, description: "about" }, user: ctx.users.editor });
    expect(p.status).toBe(200);
    expect(p.json.name).toBe(`${name} renamed`);
    expect(p.json.description).toBe("about");
    const l = await call(libsRoute.GET, { params: { studioId: ctx.studio.id }, user: ctx.users.viewer });
    expect(l.json.libraries.map((x: { id: string }) => x.id)).toContain(c.json.id);
    expect(l.json.libraries[0].counts).toMatchObject({ queued: expect.any(Number), total: expect.any(Number) });
  });
});

describe("uploads", () => {
  it("queues good files, reports duplicates and refuses bad ones with reasons, keeping folder paths", async () => {
    const r = await upload([
      { name: "Kick/kick_v1_rr1.wav", data: hitWav(1, { freq: 60 }) },
      { name: "Kick/kick_v2_rr1.wav", data: hitWav(2, { freq: 60, gain: 0.9 }) },
      { name: "Snare/readme.wav", data: notWav(1) },
      { name: "Snare/snare_big.wav", data: rf64(3) },
      { name: "Snare/copy of kick.wav", data: hitWav(1, { freq: 60 }) },
      { name: "../escape.wav", data: hitWav(4) },
    ]);
    expect(r.status).toBe(201);
    const by = Object.fromEntries(r.json.files.map((f: { name: string }) => [f.name, f]));
    expect(by["Kick/kick_v1_rr1.wav"].status, JSON.stringify(r.json.files)).toBe("queued");
    expect(by["Kick/kick_v2_rr1.wav"].status).toBe("queued");
    expect(by["Snare/readme.wav"]).toMatchObject({ status: "refused", code: "not-wav" });
    expect(by["Snare/readme.wav"].reason).toMatch(/not a WAV/);
    expect(by["Snare/snare_big.wav"]).toMatchObject({ status: "refused", code: "rf64" });
    expect(by["Snare/copy of kick.wav"].status).toBe("duplicate");
    expect(r.json.files.find((f: { name: string }) => f.name.includes("escape")).code).toBe("bad-path");
    expect(r.json.counts).toEqual({ queued: 2, duplicate: 1, refused: 3 });
    const rows = await db()("samples").where({ library_id: libraryId }).select("rel_path", "state", "size_bytes", "storage_key");
    expect(rows.map((x) => x.rel_path).sort()).toEqual(["Kick/kick_v1_rr1.wav", "Kick/kick_v2_rr1.wav"]);
    for (const row of rows) expect(fs.statSync(path.resolve(env().KW_STORAGE_DIR, row.storage_key)).size).toBe(Number(row.size_bytes));
    // refused files left nothing behind in the library's folder
    const dir = path.resolve(env().KW_STORAGE_DIR, `studios/${ctx.studio.id}/libraries/${libraryId}`);
    expect(fs.readdirSync(dir).sort()).toEqual(rows.map((x) => path.basename(x.storage_key)).sort());
  });

  it("a re-upload of the same files is reported as duplicates and not stored twice", async () => {
    const before = await db()("samples").where({ library_id: libraryId }).count({ n: "*" }).first();
    const r = await upload([{ name: "again/kick_v1_rr1.wav", data: hitWav(1, { freq: 60 }) }]);
    expect(r.json.files[0].status).toBe("duplicate");
    expect(r.json.files[0].reason).toContain("Kick/kick_v1_rr1.wav");
    const after = await db()("samples").where({ library_id: libraryId }).count({ n: "*" }).first();
    expect(Number(after!.n)).toBe(Number(before!.n));
  });

  it("two uploads of the same new files at once: each file is stored once, the other copy is a duplicate", async () => {
    // the files are recorded in batches; a batch that meets a row another request wrote meanwhile (unique
    // library + hash) is recorded again file by file, so each file still gets its own outcome
    const files = Array.from({ length: 40 }, (_, i) => ({ name: `Race/race_${i}.wav`, data: hitWav(9000 + i, { freq: 100 + i }) }));
    const [a, b] = await Promise.all([upload(files), upload(files.map((f) => ({ ...f, name: f.name.replace("Race/", "Race2/") })))]);
    expect(a.status).toBe(201);
    expect(b.status).toBe(201);
    for (let i = 0; i < files.length; i++) {
      const pair = [a.json.files[i], b.json.files[i]].map((f: { status: string }) => f.status).sort();
      expect(pair, `file ${i}: ${JSON.stringify([a.json.files[i], b.json.files[i]])}`).toEqual(["duplicate", "queued"]);
    }
    const rows = await db()("samples").where({ library_id: libraryId }).where("rel_path", "like", "Race%").select("id", "storage_key", "size_bytes");
    expect(rows).toHaveLength(files.length);
    for (const row of rows) expect(fs.statSync(path.resolve(env().KW_STORAGE_DIR, row.storage_key)).size).toBe(Number(row.size_bytes));
    // every recorded sample has its path words (searchable), and nothing else was written
    const words = await db()("sample_words").whereIn("sample_id", rows.map((r) => r.id)).countDistinct({ n: "sample_id" }).first();
    expect(Number(words!.n)).toBe(files.length);
  });

  it("reads zip packs: WAV entries land, escaping paths and other files are refused", async () => {
    const zip = zipOf([
      { name: "Toms/tom_hi_v1.wav", data: hitWav(10, { freq: 220 }) },
      { name: "Toms/../../etc/evil.wav", data: hitWav(11) },
      { name: "/abs/evil2.wav", data: hitWav(12) },
      { name: "Toms/notes.txt", data: notWav(2) },
      { name: "Toms/", data: new Uint8Array(0), deflate: false },
    ]);
    const r = await upload([{ name: "packs/toms.zip", data: zip }]);
    expect(r.status).toBe(201);
    const files = r.json.files as { name: string; status: string; code?: string }[];
    expect(files.find((f) => f.name === "packs/Toms/tom_hi_v1.wav"), JSON.stringify(files)).toMatchObject({ status: "queued" });
    expect(files.filter((f) => f.code === "bad-path")).toHaveLength(2);
    expect(files.find((f) => f.name.endsWith("notes.txt"))?.code).toBe("not-wav");
    expect(await db()("samples").where({ library_id: libraryId }).where("rel_path", "like", "%evil%").count({ n: "*" }).first()).toMatchObject({ n: 0 });
  });

  it("refuses a zip bomb (compression ratio far above any WAV)", async () => {
    const zeros = new Uint8Array(40 * 1024 * 1024); // deflates about 1000:1
    const r = await upload([{ name: "bomb.zip", data: zipOf([{ name: "big.wav", data: zeros }]) }, { name: "ok.wav", data: hitWav(20) }]);
    expect(r.status).toBe(201);
    const bomb = r.json.files.find((f: { code?: string }) => f.code === "zip-ratio");
    expect(bomb?.reason).toMatch(/zip bomb/);
    expect(r.json.files.find((f: { name: string }) => f.name === "ok.wav").status).toBe("queued");
  });

  it("an oversize file is refused with 413 and a clear message; in a mixed batch the others land", async () => {
    const big = hitWav(30, { seconds: 1.5 }); // 132 kB > 100 kB limit of this test
    const alone = await upload([{ name: "huge.wav", data: big }]);
    expect(alone.status).toBe(413);
    expect(alone.json.error.message).toMatch(/huge\.wav is larger than the 0\.1 MB limit per file/);
    const mixed = await upload([{ name: "huge2.wav", data: hitWav(31, { seconds: 1.5 }) }, { name: "small.wav", data: hitWav(32) }]);
    expect(mixed.status).toBe(201);
    expect(mixed.json.files.map((f: { status: string }) => f.status)).toEqual(["refused", "queued"]);
    expect(await db()("samples").where({ library_id: libraryId, rel_path: "huge2.wav" }).first()).toBeUndefined();
  });

  it("a batch over its limit is refused with 413", async () => {
    const junk = new Uint8Array(2_100_000);
    const r = await upload([{ name: "a.wav", data: junk }]);
    expect(r.status).toBe(413);
    expect(r.json.error.message).toMatch(/one batch may hold at most/);
  });

  it("an aborted upload leaves no partial file and no row", async () => {
    const { body, type } = await multipart([{ name: "cut/one.wav", data: hitWav(40) }, { name: "cut/two.wav", data: hitWav(41, { seconds: 1 }) }]);
    const cutAt = body.length - 30_000; // inside the second file
    const stream = new ReadableStream<Uint8Array>({
      start(c) {
        c.enqueue(body.subarray(0, cutAt));
        setTimeout(() => c.error(new Error("aborted")), 20);
      },
    });
    const res = await uploadStream(stream, type);
    const out = await res.json();
    const two = await db()("samples").where({ library_id: libraryId, rel_path: "cut/two.wav" }).first();
    expect(two).toBeUndefined();
    if (res.status === 201) expect(out.files.find((f: { name: string }) => f.name === "cut/two.wav")?.status).toBe("refused");
    const dir = path.resolve(env().KW_STORAGE_DIR, `studios/${ctx.studio.id}/libraries/${libraryId}`);
    expect(fs.readdirSync(dir).filter((f) => f.includes(".part"))).toEqual([]);
  });

  it("queues a file's measuring while the rest of the upload is still coming in, one job per new file", async () => {
    const { body, type } = await multipart([{ name: "early/first.wav", data: hitWav(50, { freq: 330 }) }, { name: "early/second.wav", data: hitWav(51, { freq: 370 }) }]);
    const boundary = `--${/boundary=(.+)$/.exec(type)![1]}`;
    const secondPart = Buffer.from(body).indexOf(boundary, Buffer.from(body).indexOf(boundary) + boundary.length);
    const cutAt = secondPart + 200; // the first file and its closing boundary are in; the second is not
    const jobOf = async (relPath: string) => {
      const row = await db()("samples").where({ library_id: libraryId, rel_path: relPath }).first("id");
      return row ? measureQueue().getJob(measureJobId(row.id)) : undefined;
    };
    let firstQueuedEarly = false;
    const stream = new ReadableStream<Uint8Array>({
      async start(c) {
        c.enqueue(body.subarray(0, cutAt));
        for (let i = 0; i < 100 && !firstQueuedEarly; i++) {
          firstQueuedEarly = !!(await jobOf("early/first.wav"));
          if (!firstQueuedEarly) await new Promise((r) => setTimeout(r, 50));
        }
        c.enqueue(body.subarray(cutAt));
        c.close();
      },
    });
    const res = await uploadStream(stream, type);
    expect(res.status).toBe(201);
    expect(firstQueuedEarly, "the first file's job was queued before the second file arrived").toBe(true);
    expect((await res.json()).counts).toEqual({ queued: 2, duplicate: 0, refused: 0 });
    expect(await jobOf("early/second.wav")).toBeTruthy();
  });
});

describe("measuring, browsing, listening, labelling", () => {
  let sampleId: string;
  beforeAll(async () => {
    await upload([{ name: "Broken/bad header.wav", data: badHeaderWav(50) }, { name: "Snare/snare_v1_rr1.wav", data: hitWav(51, { freq: 200 }) }, { name: "Snare/snare_v1_rr2.wav", data: hitWav(52, { freq: 200 }) }]);
    await measureAll(libraryId);
    sampleId = (await db()("samples").where({ library_id: libraryId, rel_path: "Snare/snare_v1_rr1.wav" }).first("id")).id;
  });

  it("catalogues good files and rejects a bad header with the decoder's reason", async () => {
    const bad = await db()("samples").where({ library_id: libraryId, rel_path: "Broken/bad header.wav" }).first();
    expect(bad.state).toBe("rejected");
    expect(bad.reject_code).toBe("bad-header");
    expect(bad.reject_reason).toMatch(/channel/i);
    const good = await db()("samples").where({ id: sampleId }).first();
    expect(good.state).toBe("catalogued");
    expect(good.family).toBe("snare"); // from the folder and file name
    expect(good.family_source).toBe("name");
    expect(Number(good.duration_sec)).toBeCloseTo(0.2, 3);
    const prog = await call(progressRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
    expect(prog.json.rejected).toBe(1);
    expect(prog.json.pending).toBe(prog.json.queued + prog.json.measuring);
  });

  it("pages, sorts and filters on the server", async () => {
    const r = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, path: "/x?sort=path&dir=desc&pageSize=2&page=1&state=catalogued", user: ctx.users.viewer });
    expect(r.status).toBe(200);
    expect(r.json.rows).toHaveLength(2);
    const all = await db()("samples").where({ library_id: libraryId, state: "catalogued" }).orderBy("rel_path", "desc").select("rel_path");
    expect(r.json.total).toBe(all.length);
    expect(r.json.rows.map((x: { path: string }) => x.path)).toEqual(all.slice(0, 2).map((x) => x.rel_path));
    const f = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, path: "/x?family=snare&q=rr2", user: ctx.users.viewer });
    expect(f.json.rows.map((x: { path: string }) => x.path)).toEqual(["Snare/snare_v1_rr2.wav"]);
    const bad = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, path: "/x?sort=nope", user: ctx.users.viewer });
    expect(bad.status).toBe(422);
    const one = await call(sampleRoute.GET, { params: { studioId: ctx.studio.id, libraryId, sampleId }, user: ctx.users.viewer });
    expect(one.json.peaks.min).toHaveLength(400);
    expect(Math.max(...one.json.peaks.max)).toBeGreaterThan(0.2);
    // what the sound alone said is kept beside the name's labels: the trained model's families, best first
    const sound = one.json.sound as { family: string; source: string; confidence: number; fit: { family: string; fit: number }[] };
    expect(sound.source).toBe("model");
    expect(sound.fit[0]!.family).toBe(sound.family);
    expect(sound.fit.map((f) => f.fit)).toEqual([...sound.fit.map((f) => f.fit)].sort((a, b) => b - a));
    expect(sound.confidence).toBeGreaterThan(0);
  });

  it("serves the WAV with range requests (RFC 9110: 206 exact bytes, suffix ranges, 416)", async () => {
    const file = await db()("samples").where({ id: sampleId }).first("storage_key", "size_bytes");
    const whole = fs.readFileSync(path.resolve(env().KW_STORAGE_DIR, file.storage_key));
    const p = { studioId: ctx.studio.id, libraryId, sampleId };
    const full = await rawGet(audioRoute.GET, p, {}, ctx.users.viewer);
    expect(full.res.status).toBe(200);
    expect(full.res.headers.get("accept-ranges")).toBe("bytes");
    expect(Number(full.res.headers.get("content-length"))).toBe(whole.length);
    expect(Buffer.from(full.bytes).equals(whole)).toBe(true);
    const head = await rawGet(audioRoute.GET, p, { range: "bytes=0-11" }, ctx.users.viewer);
    expect(head.res.status).toBe(206);
    expect(head.res.headers.get("content-range")).toBe(`bytes 0-11/${whole.length}`);
    expect(head.res.headers.get("content-length")).toBe("12");
    expect(Buffer.from(head.bytes).toString("latin1", 0, 4)).toBe("RIFF");
    expect(Buffer.from(head.bytes).equals(whole.subarray(0, 12))).toBe(true);
    const mid = await rawGet(audioRoute.GET, p, { range: "bytes=100-199" }, ctx.users.viewer);
    expect(Buffer.from(mid.bytes).equals(whole.subarray(100, 200))).toBe(true);
    const tail = await rawGet(audioRoute.GET, p, { range: "bytes=-4" }, ctx.users.viewer);
    expect(Buffer.from(tail.bytes).equals(whole.subarray(whole.length - 4))).toBe(true);
    const open = await rawGet(audioRoute.GET, p, { range: `bytes=${whole.length - 10}-` }, ctx.users.viewer);
    expect(open.bytes.length).toBe(10);
    const out = await rawGet(audioRoute.GET, p, { range: `bytes=${whole.length}-` }, ctx.users.viewer);
    expect(out.res.status).toBe(416);
    expect(out.res.headers.get("content-range")).toBe(`bytes */${whole.length}`);
  });

  it("relabel and confirm make the labels a person's, are logged, and survive a cataloguing", async () => {
    const ids = (await db()("samples").where({ library_id: libraryId, state: "catalogued" }).where("rel_path", "like", "Snare/%").select("id")).map((r) => r.id);
    const r = await call(relabelRoute.POST, { params: { studioId: ctx.studio.id, libraryId }, body: { sampleIds: ids, articulation: "rim-shot", mic: "top" }, user: ctx.users.editor });
    expect(r.status).toBe(201);
    expect(r.json.updated).toBe(ids.length);
    const kick = (await db()("samples").where({ library_id: libraryId, state: "catalogued" }).where("rel_path", "like", "Kick/%").select("id")).map((x) => x.id);
    const c = await call(confirmRoute.POST, { params: { studioId: ctx.studio.id, libraryId }, body: { sampleIds: kick }, user: ctx.users.editor });
    expect(c.json.confirmed).toBe(kick.length);
    // until the cataloguing has read the changed samples, the library says it is being catalogued (the page keeps polling)
    const during = await call(progressRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
    expect(during.json).toMatchObject({ pending: 0, cataloguing: true });
    await catalogueLibrary({ studioId: ctx.studio.id, libraryId });
    const after = await call(progressRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
    expect(after.json).toMatchObject({ pending: 0, cataloguing: false });
    const sn = await db()("samples").whereIn("id", ids).select("articulation", "articulation_source", "mic");
    for (const s of sn) expect(s).toMatchObject({ articulation: "rim-shot", articulation_source: "person", mic: "top" });
    const kk = await db()("samples").whereIn("id", kick).select("family", "family_source", "confirmed_by");
    for (const s of kk) expect(s).toMatchObject({ family: "kick", family_source: "person", confirmed_by: ctx.users.editor.id });
    const log = await db()("activity").where({ studio_id: ctx.studio.id }).whereIn("action", ["samples.relabelled", "samples.confirmed"]).select("action", "actor_id", "details");
    expect(log.map((l) => l.action).sort()).toEqual(["samples.confirmed", "samples.relabelled"]);
    const details = log.find((l) => l.action === "samples.relabelled")!.details;
    expect((typeof details === "string" ? JSON.parse(details) : details).set).toEqual({ articulation: "rim-shot", mic: "top" });
  });

  it("the library's velocity curve is selectable; changing it re-sorts the layers onto the new curve and is logged", async () => {
    const groups = async () => (await db()("layer_groups").where({ library_id: libraryId }).orderBy("group_key").select("group_key", "layers")).map((g) => ({ key: g.group_key as string, lows: (typeof g.layers === "string" ? JSON.parse(g.layers) : g.layers).map((l: { velocityLow: number }) => l.velocityLow) as number[] }));
    const before = await groups();
    expect(before.some((g) => g.lows.length > 1)).toBe(true);
    const r = await call(libRoute.PATCH, { method: "PATCH", params: { studioId: ctx.studio.id, libraryId }, body: { velocityCurve: "dannenberg" }, user: ctx.users.editor });
    expect(r.status).toBe(200);
    await catalogueLibrary({ studioId: ctx.studio.id, libraryId });
    expect((await db()("library_health").where({ library_id: libraryId }).first("curve")).curve).toBe("dannenberg");
    const after = await groups();
    // same groups, but the multi-layer ones now start their layers at other velocities (curves differ: DLS Level 1 vs Dannenberg ICMC 2006)
    expect(after.map((g) => g.key)).toEqual(before.map((g) => g.key));
    const changed = after.filter((g, i) => g.lows.length > 1 && g.lows.join() !== before[i]!.lows.join());
    expect(changed.length).toBeGreaterThan(0);
    expect(await db()("activity").where({ studio_id: ctx.studio.id, action: "library.curve-changed" }).first()).toBeTruthy();
    const bad = await call(libRoute.PATCH, { method: "PATCH", params: { studioId: ctx.studio.id, libraryId }, body: { velocityCurve: "linear" }, user: ctx.users.editor });
    expect(bad.status).toBe(422);
    await call(libRoute.PATCH, { method: "PATCH", params: { studioId: ctx.studio.id, libraryId }, body: { velocityCurve: "dls" }, user: ctx.users.editor });
    await catalogueLibrary({ studioId: ctx.studio.id, libraryId });
    expect(await groups()).toEqual(before);
  });

  it("renames and merges instruments with stable ids; health and plots answer", async () => {
    const inst = await call(instrumentsRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
    const list = inst.json.instruments as { id: string; key: string; name: string; family: string }[];
    expect(list.length).toBeGreaterThanOrEqual(2);
    const snare = list.find((i) => i.family === "snare")!;
    const rn = await call(instrumentRoute.PATCH, { method: "PATCH", params: { studioId: ctx.studio.id, libraryId, instrumentId: snare.id }, body: { name: "Brass snare" }, user: ctx.users.editor });
    expect(rn.status).toBe(200);
    await catalogueLibrary({ studioId: ctx.studio.id, libraryId });
    const again = await db()("instruments").where({ id: snare.id }).first();
    expect(again.name).toBe("Brass snare"); // kept across the cataloguing, same id
    const toms = list.filter((i) => i.family === "tom");
    if (toms.length) {
      const m = await call(mergeRoute.POST, { params: { studioId: ctx.studio.id, libraryId }, body: { sourceIds: toms.map((t) => t.id), targetId: snare.id }, user: ctx.users.editor });
      expect(m.status).toBe(201);
      await catalogueLibrary({ studioId: ctx.studio.id, libraryId });
      expect(await db()("instruments").whereIn("id", toms.map((t) => t.id)).first()).toBeUndefined();
    }
    const h = await call(healthRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
    expect(h.status).toBe(200);
    expect(h.json.computedAt).not.toBeNull();
    const pl = await call(plotsRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
    expect(pl.json.groups.length).toBeGreaterThan(0);
    expect(pl.json.points.length).toBe(Number((await db()("samples").where({ library_id: libraryId, state: "catalogued" }).count({ n: "*" }).first())!.n));
  });
});

describe("sample states", () => {
  it("a measured sample is `measured` until the cataloguing places it; only then `catalogued`, and the progress says so", async () => {
    const lib = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name: uniq("States") }, user: ctx.users.editor });
    const libId = lib.json.id as string;
    const up = await upload([{ name: "Tom/tom_hi_v1.wav", data: hitWav(71, { freq: 180 }) }, { name: "Tom/tom_hi_v2.wav", data: hitWav(72, { freq: 180, gain: 0.5 }) }], ctx.users.editor, libId);
    expect(up.status).toBe(201);
    const rows = await db()("samples").where({ library_id: libId }).select("id", "studio_id");
    const outs = [];
    for (const r of rows) outs.push(await measureSample({ sampleId: r.id, studioId: r.studio_id }, async (b) => measureWav(b)));
    expect(outs).toEqual(["measured", "measured"]);
    const measured = await db()("samples").where({ library_id: libId }).select("state", "instrument_key", "measurement");
    for (const m of measured) {
      expect(m).toMatchObject({ state: "measured", instrument_key: null });
      expect(m.measurement).toBeTruthy();
    }
    const before = await call(progressRoute.GET, { params: { studioId: ctx.studio.id, libraryId: libId }, user: ctx.users.viewer });
    expect(before.json).toMatchObject({ queued: 0, measuring: 0, measured: 2, catalogued: 0, pending: 0, cataloguing: true, total: 2 });
    const filtered = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId: libId }, path: "/x?state=measured", user: ctx.users.viewer });
    expect(filtered.json.total).toBe(2);

    expect(await catalogueLibrary({ studioId: ctx.studio.id, libraryId: libId })).toMatchObject({ samples: 2, instruments: 1 });
    const placed = await db()("samples").where({ library_id: libId }).select("state", "instrument_key", "family");
    for (const p of placed) expect(p).toMatchObject({ state: "catalogued", instrument_key: expect.any(String), family: "tom" });
    const after = await call(progressRoute.GET, { params: { studioId: ctx.studio.id, libraryId: libId }, user: ctx.users.viewer });
    expect(after.json).toMatchObject({ measured: 0, catalogued: 2, pending: 0, cataloguing: false, total: 2 });
  });
});

describe("permissions", () => {
  it("viewers get 403 on every write; editors cannot delete libraries", async () => {
    const s = ctx.studio.id;
    const inst = await db()("instruments").where({ library_id: libraryId }).first("id");
    const anySample = (await db()("samples").where({ library_id: libraryId }).first("id")).id;
    const { body, type } = await multipart([{ name: "v.wav", data: hitWav(99) }]);
    const writes = [
      () => call(libsRoute.POST, { params: { studioId: s }, body: { name: uniq("x") }, user: ctx.users.viewer }),
      () => call(libRoute.PATCH, { method: "PATCH", params: { studioId: s, libraryId }, body: { name: "x" }, user: ctx.users.viewer }),
      () => call(libRoute.DELETE, { method: "DELETE", params: { studioId: s, libraryId }, body: { confirmName: "x" }, user: ctx.users.viewer }),
      () => call(uploadRoute.POST, { method: "POST", params: { studioId: s, libraryId }, rawBody: body, headers: { "content-type": type }, user: ctx.users.viewer }),
      () => call(relabelRoute.POST, { params: { studioId: s, libraryId }, body: { sampleIds: [anySample], family: "tom" }, user: ctx.users.viewer }),
      () => call(confirmRoute.POST, { params: { studioId: s, libraryId }, body: { sampleIds: [anySample] }, user: ctx.users.viewer }),
      () => call(instrumentRoute.PATCH, { method: "PATCH", params: { studioId: s, libraryId, instrumentId: inst.id }, body: { name: "x" }, user: ctx.users.viewer }),
      () => call(mergeRoute.POST, { params: { studioId: s, libraryId }, body: { sourceIds: [inst.id], targetId: inst.id }, user: ctx.users.viewer }),
    ];
    for (const w of writes) expect((await w()).status).toBe(403);
    const ed = await call(libRoute.DELETE, { method: "DELETE", params: { studioId: s, libraryId }, body: { confirmName: "x" }, user: ctx.users.editor });
    expect(ed.status).toBe(403);
    expect(await db()("samples").where({ library_id: libraryId, rel_path: "v.wav" }).first()).toBeUndefined();
  });

  it("another studio's library id is 404 (never 403), for reads, listening and writes", async () => {
    const o = ctx.users.outsider;
    const other = ctx.otherStudio.id;
    const sampleId = (await db()("samples").where({ library_id: libraryId, state: "catalogued" }).first("id")).id;
    expect((await call(libRoute.GET, { params: { studioId: other, libraryId }, user: o })).status).toBe(404);
    expect((await call(samplesRoute.GET, { params: { studioId: other, libraryId }, user: o })).status).toBe(404);
    expect((await rawGet(audioRoute.GET, { studioId: other, libraryId, sampleId }, {}, o)).res.status).toBe(404);
    expect((await call(relabelRoute.POST, { params: { studioId: other, libraryId }, body: { sampleIds: [sampleId], family: "tom" }, user: o })).status).toBe(404);
    expect((await upload([{ name: "x.wav", data: hitWav(77) }], o as never, libraryId, other)).status).toBe(404);
    // not a member of the studio at all
    expect((await call(libRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: o })).status).toBe(404);
  });

  it("owners delete a library with its stored files after typing its name", async () => {
    const c = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name: uniq("Doomed") }, user: ctx.users.owner });
    await upload([{ name: "d.wav", data: hitWav(123) }], ctx.users.owner, c.json.id);
    const dir = path.resolve(env().KW_STORAGE_DIR, `studios/${ctx.studio.id}/libraries/${c.json.id}`);
    expect(fs.readdirSync(dir)).toHaveLength(1);
    const wrong = await call(libRoute.DELETE, { method: "DELETE", params: { studioId: ctx.studio.id, libraryId: c.json.id }, body: { confirmName: "nope" }, user: ctx.users.owner });
    expect(wrong.status).toBe(422);
    const d = await call(libRoute.DELETE, { method: "DELETE", params: { studioId: ctx.studio.id, libraryId: c.json.id }, body: { confirmName: c.json.name }, user: ctx.users.owner });
    expect(d.status).toBe(204);
    expect(fs.existsSync(dir)).toBe(false);
    expect(await db()("samples").where({ library_id: c.json.id }).first()).toBeUndefined();
    expect(await db()("activity").where({ action: "library.deleted", subject_id: c.json.id }).first()).toBeDefined();
  });
});

describe("library counters", () => {
  it("the trigger-kept counts per library and state equal a fresh COUNT(*) after uploads, measuring, rejections, relabels and deletions", async () => {
    const actual = (await db()("samples").groupBy("library_id", "state").select("library_id", "state").count({ n: "*" })) as { library_id: string; state: string; n: number | string }[];
    const kept = (await db()("library_sample_counts").where("n", "<>", 0).select("library_id", "state", "n")) as { library_id: string; state: string; n: number | string }[];
    const norm = (rows: { library_id: string; state: string; n: number | string }[]) => rows.map((r) => `${r.library_id}/${r.state}=${Number(r.n)}`).sort();
    expect(actual.length).toBeGreaterThan(0);
    expect(norm(kept)).toEqual(norm(actual));
    // and the samples list reports the same totals the counters give
    const all = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
    const counted = await db()("samples").where({ library_id: libraryId }).count({ n: "*" }).first();
    expect(all.json.total).toBe(Number(counted!.n));
    const rejected = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, path: "/api/test?state=rejected", user: ctx.users.viewer });
    const countedRejected = await db()("samples").where({ library_id: libraryId, state: "rejected" }).count({ n: "*" }).first();
    expect(rejected.json.total).toBe(Number(countedRejected!.n));
  });
});
