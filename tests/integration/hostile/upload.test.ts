// Hostile input through the upload API (POST /api/studios/:studioId/libraries/:libraryId/uploads, multipart/form-data
// per RFC 7578): a batch of mutated WAVs from the seeded corpus, then measured in-process exactly as the worker does
// (measureSample + measureWav); plus disguised files, zip packs with escaping paths (the "zip slip" pattern,
// common practice, no published source), a zip bomb, an oversize body, names with control characters or markup,
// and a very long path. Pass: no 5xx, every file has an outcome, every stored file ends catalogued or rejected
// with a reason, nothing is written outside the library's storage folder.
import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { createLibrary } from "@/lib/server/catalogue/libraries";
import { measureSample } from "@/lib/server/catalogue/measure";
import { catalogueLibrary } from "@/lib/server/catalogue/catalogue-library";
import { measureWav } from "@/lib/audio";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";
import { call, makeStudioWithRoles, uniq } from "../helpers";
import { bases, mutant } from "@/tests/hostile/mutate";
import { zipOf } from "@/tests/hostile/zip";

type FileResult = { name: string; status: "queued" | "duplicate" | "refused"; code?: string; reason?: string; sampleId?: string };

async function multipart(files: { name: string; data: Uint8Array }[]): Promise<{ body: Uint8Array; type: string }> {
  const fd = new FormData();
  for (const f of files) fd.append("file", new Blob([f.data as BlobPart]), f.name);
  const r = new Request("http://localhost/", { method: "POST", body: fd });
  return { body: new Uint8Array(await r.arrayBuffer()), type: r.headers.get("content-type")! };
}

let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;

/** Every upload of this suite: a 5xx fails the test whatever else it checks. */
async function send(body: Uint8Array, type: string, headers: Record<string, string> = {}) {
  const r = await call(uploadRoute.POST, { method: "POST", params: { studioId: ctx.studio.id, libraryId }, rawBody: body, headers: { "content-type": type, ...headers }, user: ctx.users.editor, path: `/api/studios/${ctx.studio.id}/libraries/${libraryId}/uploads` });
  expect(r.status, `5xx: ${JSON.stringify(r.json)}`).toBeLessThan(500);
  return r;
}

async function upload(files: { name: string; data: Uint8Array }[], headers: Record<string, string> = {}) {
  const { body, type } = await multipart(files);
  return send(body, type, headers);
}

/** A multipart body written by hand, part headers exactly as given (RFC 7578), for names a browser would escape. */
function rawMultipart(parts: { disposition: string; data: Uint8Array }[]): { body: Uint8Array; type: string } {
  const b = `kw-${crypto.randomUUID()}`;
  const chunks: Buffer[] = [];
  for (const p of parts) chunks.push(Buffer.from(`--${b}\r\nContent-Disposition: ${p.disposition}\r\nContent-Type: audio/wav\r\n\r\n`, "utf8"), Buffer.from(p.data), Buffer.from("\r\n"));
  chunks.push(Buffer.from(`--${b}--\r\n`));
  return { body: new Uint8Array(Buffer.concat(chunks)), type: `multipart/form-data; boundary=${b}` };
}

/** The zip writer's output with its end record claiming `count` entries (PKZIP APPNOTE 4.3.16: total entries). */
function withEntryCount(zip: Uint8Array, count: number): Uint8Array {
  const b = Buffer.from(zip);
  b.writeUInt16LE(count, b.length - 22 + 8);
  b.writeUInt16LE(count, b.length - 22 + 10);
  return new Uint8Array(b);
}

/** The zip writer's output with the first entry's uncompressed size (local header and directory) set to `size`. */
function withEntrySize(zip: Uint8Array, size: number): Uint8Array {
  const b = Buffer.from(zip);
  b.writeUInt32LE(size, 22); // local file header: uncompressed size at 22 (APPNOTE 4.3.7)
  const cd = b.readUInt32LE(b.length - 22 + 16); // end record: central directory offset
  b.writeUInt32LE(size, cd + 24); // central directory header: uncompressed size at 24 (APPNOTE 4.3.12)
  return new Uint8Array(b);
}

/** Base file k with a few random bytes near its end: still a valid WAV, never a duplicate of an earlier upload. */
function fresh(k: number): Uint8Array {
  const b = bases()[k % 7]!.bytes.slice();
  b.set(crypto.getRandomValues(new Uint8Array(4)), b.length - 6);
  return b;
}

function storedFiles(): string[] {
  const dir = path.resolve(env().KW_STORAGE_DIR, `studios/${ctx.studio.id}/libraries/${libraryId}`);
  return fs.existsSync(dir) ? fs.readdirSync(dir) : [];
}

function expectOutcomes(files: FileResult[]) {
  for (const f of files) {
    expect(["queued", "duplicate", "refused"]).toContain(f.status);
    if (f.status === "refused") {
      expect(f.code, f.name).toBeTruthy();
      expect((f.reason ?? "").length, f.name).toBeGreaterThan(5);
    } else expect(f.sampleId, f.name).toBeTruthy();
  }
}

beforeAll(async () => {
  ctx = await makeStudioWithRoles();
  libraryId = (await createLibrary({ studioId: ctx.studio.id, actorId: ctx.users.owner.id, name: uniq("Hostile") })).id;
});

describe("hostile uploads", () => {
  it("300 mutated WAVs in one batch: no 5xx, one outcome per file, every stored file ends catalogued or rejected with a reason", async () => {
    const b = bases();
    const files = Array.from({ length: 300 }, (_, i) => mutant(i, 2, b)).map((m) => ({ name: `corpus/${m.name}`, data: m.bytes }));
    const r = await upload(files);
    expect(r.status).toBe(201);
    const out = r.json.files as FileResult[];
    expect(out).toHaveLength(300);
    expectOutcomes(out);
    // files whose first bytes are not RIFF....WAVE are refused at the door (sniffing, not the extension)
    for (const f of out.filter((x) => x.name.includes("-not-wav-") || x.name.includes("-empty-"))) {
      const bytes = files.find((x) => x.name === f.name)!.data;
      const isRiffWave = bytes.length >= 12 && String.fromCharCode(...bytes.subarray(0, 4)) === "RIFF" && String.fromCharCode(...bytes.subarray(8, 12)) === "WAVE";
      if (!isRiffWave) expect(f.status, f.name).toBe("refused");
    }
    // measure what was queued, the way the worker does (inline instead of on its thread pool)
    const queued = out.filter((f) => f.status === "queued");
    expect(queued.length).toBeGreaterThan(50);
    for (const q of queued) await measureSample({ sampleId: q.sampleId!, studioId: ctx.studio.id }, async (bytes) => measureWav(bytes));
    // and catalogue the library, as the worker's cataloguing job does: every measured sample is placed
    await catalogueLibrary({ studioId: ctx.studio.id, libraryId });
    const rows = await db()("samples").where({ library_id: libraryId }).select("id", "state", "reject_code", "reject_reason", "rel_path");
    expect(rows).toHaveLength(queued.length);
    for (const row of rows) {
      expect(["catalogued", "rejected"], row.rel_path).toContain(row.state);
      if (row.state === "rejected") expect((row.reject_reason ?? "").length, row.rel_path).toBeGreaterThan(10);
    }
    // the undamaged controls are catalogued; one stored file per row, no leftovers
    for (const row of rows.filter((x: { rel_path: string }) => x.rel_path.includes("-valid-"))) expect(row.state, row.rel_path).toBe("catalogued");
    expect(storedFiles().filter((f) => f.includes(".part"))).toEqual([]);
    expect(storedFiles()).toHaveLength(rows.length);
  });

  it("a text file, a PNG and an MP3 renamed .wav are refused as not-wav (magic bytes, RIFF 1991 header)", async () => {
    const png = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...new Array(40).fill(7)]);
    const mp3 = Uint8Array.from([0x49, 0x44, 0x33, 4, 0, 0, 0, 0, 0, 10, ...new Array(40).fill(9)]);
    const r = await upload([{ name: "kick.wav", data: new TextEncoder().encode("not audio at all, just words\n".repeat(10)) }, { name: "snare.wav", data: png }, { name: "tom.wav", data: mp3 }]);
    // nothing accepted: the batch as a whole says so (422), with every file's outcome
    expect(r.status).toBe(422);
    expect((r.json.error.details.files as FileResult[]).map((f) => [f.status, f.code])).toEqual([["refused", "not-wav"], ["refused", "not-wav"], ["refused", "not-wav"]]);
  });

  it("zip entries whose paths escape the pack are refused; nothing lands outside the library's folder", async () => {
    const good = fresh(0);
    const other = fresh(1);
    const r = await upload([{ name: "pack.zip", data: zipOf([
      { name: "../../escaped.wav", data: good },
      { name: "/abs/escaped.wav", data: good },
      { name: "C:\\win\\escaped.wav", data: good },
      { name: "ok/../../../escaped2.wav", data: good },
      { name: "Kit/inside.wav", data: other },
    ]) }]);
    expect(r.status).toBe(201);
    const files = r.json.files as FileResult[];
    expectOutcomes(files);
    expect(files.filter((f) => f.code === "bad-path")).toHaveLength(4);
    expect(files.find((f) => f.name === "Kit/inside.wav")?.status).toBe("queued");
    const root = path.resolve(env().KW_STORAGE_DIR);
    for (const p of ["escaped.wav", "../escaped.wav", "../../escaped.wav", "abs/escaped.wav", "escaped2.wav"]) expect(fs.existsSync(path.resolve(root, p)), p).toBe(false);
  });

  it("a zip bomb (a 64 MB entry deflated about 1000:1) is refused and never stored; a zip inside a zip is refused, its siblings land", async () => {
    const bomb = await upload([{ name: "bomb.zip", data: zipOf([{ name: "huge.wav", data: new Uint8Array(64 * 1024 * 1024) }, { name: "fine.wav", data: fresh(3) }]) }]);
    // every file refused (the pack as a whole): the batch says so, 422 with the outcomes
    expect(bomb.status).toBe(422);
    const bombFiles = bomb.json.error.details.files as FileResult[];
    expectOutcomes(bombFiles);
    // refused as a possible bomb (the whole pack or the entry), and the 64 MB entry is never stored
    expect(bombFiles.find((f) => f.code === "zip-ratio")?.reason).toMatch(/zip bomb/);
    expect(bombFiles.filter((f) => f.status !== "refused").map((f) => f.name).join(" ")).not.toMatch(/huge\.wav/);
    expect(await db()("samples").where({ library_id: libraryId }).where("rel_path", "like", "%huge.wav").first()).toBeUndefined();
    const nested = await upload([{ name: "nested.zip", data: zipOf([{ name: "inner.zip", data: zipOf([{ name: "x.wav", data: fresh(2) }]) }, { name: "fine.wav", data: fresh(3) }]) }]);
    expect(nested.status).toBe(201);
    const files = nested.json.files as FileResult[];
    expectOutcomes(files);
    expect(files.find((f) => f.name.includes("inner.zip"))?.status).toBe("refused");
    expect(files.find((f) => f.name.includes("fine.wav"))?.status).toBe("queued");
  });

  it("an oversize body (declared Content-Length over the batch limit, RFC 9110 413) is refused before it is read", async () => {
    const r = await upload([{ name: "a.wav", data: fresh(4) }], { "content-length": String(env().KW_UPLOAD_MAX_BATCH_BYTES + 1) });
    expect(r.status).toBe(413);
    expect(r.json.error.code).toBe("too-large");
    expect(await db()("samples").where({ library_id: libraryId, rel_path: "a.wav" }).first()).toBeUndefined();
  });

  it("non-ASCII file names are kept as sent (UTF-8 in the part header, RFC 7578 4.2)", async () => {
    const name = "Caisse claire é/frisée ß 01.wav";
    const r = await upload([{ name, data: fresh(11) }]);
    expect(r.status).toBe(201);
    const row = await db()("samples").where({ id: (r.json.files as FileResult[])[0]!.sampleId }).first("rel_path", "file_name");
    expect(row).toEqual({ rel_path: name, file_name: "frisée ß 01.wav" });
  });

  it("names with markup get an outcome and are stored as plain text (pages render them escaped)", async () => {
    const names = ["<script>alert(1)</script>.wav", "<img src=x onerror=alert(1)>/snare.wav", "tab\there & \"quotes\".wav"];
    const r = await upload(names.map((name, i) => ({ name, data: fresh(i) })));
    expect(r.status).toBe(201);
    const files = r.json.files as FileResult[];
    expect(files.map((f) => [f.name, f.status])).toEqual(names.map((n) => [n, "queued"]));
    for (const f of files) {
      const row = await db()("samples").where({ id: f.sampleId }).first("rel_path", "file_name");
      expect(row.rel_path).toBe(f.name);
    }
  });

  it("a name with a control character (not allowed in a MIME part header, RFC 7578 4.2 / RFC 5322): never a 5xx, never a silent loss", async () => {
    const names = ["before.wav", "evil\u0001\u001b[31mred\u0007.wav", "after.wav"];
    const r = await upload(names.map((name, i) => ({ name, data: fresh(i) })));
    expect(r.status).toBeLessThan(500);
    // busboy stops at the malformed part header: the request is refused whole, with the likely cause named
    if (r.status === 422) expect(r.json.error.message).toMatch(/control characters/);
    if (r.status === 201) {
      // the good files land and the bad name has its own outcome
      const files = r.json.files as FileResult[];
      expectOutcomes(files);
      expect(files.find((f) => f.name === "before.wav")?.status).toBe("queued");
      expect(files.find((f) => f.name === "after.wav")?.status).toBe("queued");
      expect(files).toHaveLength(3);
    } else {
      // refused as a whole: a clear error, and then truly nothing stored
      expect(r.json.error.message.length).toBeGreaterThan(10);
      expect(await db()("samples").where({ library_id: libraryId }).whereIn("rel_path", ["before.wav", "after.wav"]).first()).toBeUndefined();
    }
  });

  it("a path of 5,000 characters is refused with a reason; one of 900 characters is stored whole", async () => {
    const long = `${"deep/".repeat(1000)}x.wav`;
    const okName = `${"long-folder/".repeat(74)}x.wav`;
    expect(okName.length).toBe(893);
    const r = await upload([{ name: long, data: fresh(5) }, { name: okName, data: fresh(6) }]);
    expect(r.status).toBe(201);
    const files = r.json.files as FileResult[];
    expect(files[0]!.status).toBe("refused");
    expect(files[0]!.reason).toMatch(/longer than 1000 characters/);
    expect(files[1]!.status).toBe("queued");
    const row = await db()("samples").where({ id: files[1]!.sampleId }).first("rel_path", "file_name");
    expect(row.rel_path).toBe(okName);
    expect(row.file_name).toBe("x.wav");
  });

  it("a part whose file name holds a raw '\"' (not allowed unescaped in a quoted-string, RFC 7578 4.2 / RFC 9110 5.6.4) gets its own outcome; the others land", async () => {
    const { body, type } = rawMultipart([
      { disposition: 'form-data; name="file"; filename="before-q.wav"', data: fresh(20) },
      { disposition: 'form-data; name="file"; filename="Kit/a"b.wav"', data: fresh(21) },
      { disposition: 'form-data; name="file"; filename="after-q.wav"', data: fresh(22) },
    ]);
    const r = await send(body, type);
    expect(r.status).toBe(201);
    const files = r.json.files as FileResult[];
    expectOutcomes(files);
    expect(files.map((f) => [f.name, f.status])).toEqual([["before-q.wav", "queued"], ['Kit/a"b.wav', "refused"], ["after-q.wav", "queued"]]);
    expect(files[1]).toMatchObject({ code: "bad-name" });
    expect(files[1]!.reason).toMatch(/file name could not be read/);
    expect(r.json.counts).toEqual({ queued: 2, duplicate: 0, refused: 1 });
  });

  it("a zip whose end record claims more entries than its directory holds is refused in our words, not as an interrupted upload", async () => {
    const zip = withEntryCount(zipOf([{ name: "one.wav", data: fresh(30) }, { name: "two.wav", data: fresh(31) }]), 3);
    const r = await upload([{ name: "counted.zip", data: zip }, { name: "beside.wav", data: fresh(32) }]);
    expect(r.status).toBe(201);
    const files = r.json.files as FileResult[];
    expectOutcomes(files);
    const pack = files.find((f) => f.name.startsWith("counted.zip"))!;
    expect(pack).toMatchObject({ status: "refused", code: "zip-damaged" });
    expect(pack.reason).toMatch(/directory/);
    expect(pack.reason).not.toMatch(/interrupted/);
    expect(files.find((f) => f.name === "beside.wav")?.status).toBe("queued");
  });

  it("a zip entry larger than its directory says is refused in our words (no library message quoted)", async () => {
    const data = fresh(33);
    const zip = withEntrySize(zipOf([{ name: "liar.wav", data }, { name: "honest.wav", data: fresh(34) }]), data.length - 100);
    const r = await upload([{ name: "sizes.zip", data: zip }]);
    expect(r.status).toBe(201);
    const files = r.json.files as FileResult[];
    expectOutcomes(files);
    const liar = files.find((f) => f.name.endsWith("liar.wav"))!;
    expect(liar).toMatchObject({ status: "refused", code: "zip-damaged" });
    expect(liar.reason).toMatch(/does not match the size its directory gives/);
    expect(liar.reason).not.toMatch(/too many bytes|expected \d/);
    expect(files.find((f) => f.name.endsWith("honest.wav"))?.status).toBe("queued");
    expect(await db()("samples").where({ library_id: libraryId }).where("rel_path", "like", "%liar.wav").first()).toBeUndefined();
  });

  it("no reason quotes a library's or the database's own message: every reason is one of ours", async () => {
    const junkZip = new Uint8Array([0x50, 0x4b, 0x03, 0x04, ...new Array(60).fill(1)]);
    const r = await upload([{ name: "junk.zip", data: junkZip }, { name: "kept.wav", data: fresh(35) }]);
    expect(r.status).toBe(201);
    const junk = (r.json.files as FileResult[]).find((f) => f.name.startsWith("junk.zip"))!;
    expect(junk).toMatchObject({ status: "refused", code: "zip-damaged" });
    expect(junk.reason).toBe("the zip pack could not be read: its central directory is missing or damaged");
  });
});
