import "server-only";
// Upload of WAV files, folders and .zip packs into a library. The multipart body is streamed with busboy
// straight to storage (never held in memory): each file's first bytes are checked (RIFF....WAVE; RF64
// refused; PK\x03\x04 for packs), its SHA-256 and size computed on the way, and it is recorded `queued` and
// enqueued for measuring. A file already in the library (same hash) is a duplicate and not stored twice.
// One bad file never fails its batch: every file gets its own outcome.
import crypto from "node:crypto";
import fs from "node:fs";
import fsp from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable, Transform, type TransformCallback } from "node:stream";
import { pipeline } from "node:stream/promises";
import busboy from "busboy";
import yauzl from "yauzl";
import { db } from "../db";
import { env } from "../env";
import { AppError } from "../errors";
import { mediaType } from "../media-type";
import { logActivity } from "../activity";
import { newId } from "../ids";
import { storage } from "../storage";
import { assertLibrary, sampleKey } from "./libraries";
import { enqueueMeasure } from "./queue";
import { deleteWordsOfSamples, insertSamplesWithWords } from "./words";
import { busboyReadsAsFile, lenientFileName, mentionsFile, PartHeaderScanner, type PartHeader } from "./multipart-parts";
import type { UploadFileResult, UploadSummary } from "@/lib/api-types/uploads";

/** Limits of .zip packs (zip-bomb guards). */
export const ZIP_LIMITS = {
  maxEntries: 20_000,
  maxTotalUncompressed: 8 * 1024 ** 3,
  /** Uncompressed / compressed size above which an entry (of at least 1 MB) is refused. */
  maxEntryRatio: 200,
  /** Whole-pack ratio above which the pack is refused. */
  maxPackRatio: 100,
};

class Refusal extends Error {
  constructor(readonly code: string, message: string) {
    super(message);
  }
}

/** The reason given when storing fails on our side (the error itself goes to the server's log). */
const ERROR_REASON = "the file could not be stored (an error on our side, logged); send it again";

const BAD_NAME_REASON = "the part's file name could not be read (it holds a raw '\"' or another character not allowed in a MIME header); rename the file and send it again";

const interruptedRefusal = () => new Refusal("interrupted", "the upload was interrupted");

/** A zip entry that fails while it is unpacked: sizes that disagree with the directory, or damaged data. */
function zipEntryRefusal(e: Error): Refusal {
  if (/bytes in the stream/i.test(e.message)) return new Refusal("zip-damaged", "the entry's unpacked size does not match the size its directory gives (a damaged or altered pack)");
  return new Refusal("zip-damaged", "the entry could not be unpacked (its compressed data is damaged)");
}

/**
 * Bytes each stage of an upload (parser, file stream, hash) may hold ahead of the next. With Node's 16 KB
 * defaults the request waited on every disk write in turn (2 GB at 64-78 MB/s); 256 KB per stage, with the
 * 1 MB file write buffer in storage.ts, keeps the socket, the hash and the disk busy at once (about 110 MB/s
 * here). Larger stages gained nothing more and left more memory to the garbage collector.
 */
const STREAM_BUFFER = 256 * 1024;

const mb = (n: number) => `${Math.round((n / 1024 / 1024) * 10) / 10} MB`;

/**
 * Relative path of an uploaded file: "/" separators, no empty, "." or ".." parts, not absolute, no drive
 * letters. Returns null when the path tries to leave its folder.
 */
export function cleanRelPath(raw: string): string | null {
  const p = raw.replace(/\\/g, "/");
  if (p.startsWith("/") || /^[a-zA-Z]:/.test(p) || p.includes("\0")) return null;
  const parts = p.split("/").filter((x) => x !== "" && x !== ".");
  if (!parts.length || parts.some((x) => x === "..")) return null;
  const out = parts.join("/");
  return out.length > MAX_PATH ? null : out;
}

/** Longest relative path kept (characters). */
export const MAX_PATH = 1000;

/** What the first bytes say: a WAV, an RF64/BW64 container, a zip pack, or something else. */
export function sniff(head: Uint8Array): "wav" | "rf64" | "zip" | "other" {
  const s = (a: number, b: number) => String.fromCharCode(...head.subarray(a, b));
  if (head.length >= 12 && s(0, 4) === "RIFF" && s(8, 12) === "WAVE") return "wav";
  if (head.length >= 4 && (s(0, 4) === "RF64" || s(0, 4) === "BW64")) return "rf64";
  if (head.length >= 4 && head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04) return "zip";
  return "other";
}

/** Passes bytes through while hashing, counting, enforcing a size limit and checking the magic bytes. */
class Inspect extends Transform {
  readonly hash = crypto.createHash("sha256");
  bytes = 0;
  private head = Buffer.alloc(0);
  private checked = false;
  constructor(private readonly want: "wav" | "zip", private readonly maxBytes: number, private readonly onBytes: (n: number) => void) {
    super({ highWaterMark: STREAM_BUFFER });
  }
  private check(final: boolean): Error | null {
    if (this.checked || (!final && this.head.length < 12)) return null;
    this.checked = true;
    const kind = sniff(this.head);
    if (this.want === "zip") return kind === "zip" ? null : new Refusal("not-zip", "not a zip pack (its first bytes are not PK\\x03\\x04)");
    if (kind === "wav") return null;
    if (kind === "rf64") return new Refusal("rf64", "RF64/BW64 (64-bit RIFF, EBU Tech 3306) files are not supported; export as a plain RIFF WAVE");
    if (this.head.length === 0) return new Refusal("empty", "the file is empty");
    return new Refusal("not-wav", "not a WAV file (its first bytes are not RIFF....WAVE)");
  }
  _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback): void {
    this.bytes += chunk.length;
    this.onBytes(chunk.length);
    if (this.bytes > this.maxBytes) return cb(new Refusal("too-large", `larger than the ${mb(this.maxBytes)} limit per file`));
    if (!this.checked) {
      this.head = Buffer.concat([this.head, chunk.subarray(0, 12)]);
      const err = this.check(false);
      if (err) return cb(err);
    }
    this.hash.update(chunk);
    cb(null, chunk);
  }
  _flush(cb: TransformCallback): void {
    cb(this.check(true));
  }
}

interface Ctx {
  studioId: string;
  libraryId: string;
  userId: string;
  maxFile: number;
  results: UploadFileResult[];
  queued: { sampleId: string }[];
  active: Set<Inspect>;
  addBytes: (n: number) => void;
  /** Records stored files in the database, in upload order, many per transaction. */
  recorder: Recorder;
}

/** A stored file waiting to be recorded. */
interface Stored { sampleId: string; key: string; relPath: string; sha256: string; bytes: number; result: UploadFileResult }

/**
 * Records stored files in upload order (so the first of two equal files is the one kept), in batches: one
 * duplicate lookup and one transaction (sample rows and their path words) for every file that is ready, rather
 * than a lookup and a commit per file. A file takes a ticket when it starts; the batch ends at the first ticket
 * not yet ready. A batch the database refuses as a whole (a file recorded meanwhile by another upload, the
 * library deleted) is recorded again file by file, so each file gets its own outcome.
 */
class Recorder {
  private tickets = 0;
  private next = 0;
  private ready = new Map<number, Stored | null>();
  private busy = false;
  private waiting = new Map<number, () => void>();
  readonly recorded: Promise<void>[] = [];
  private enqueueing: Promise<void> = Promise.resolve();
  private enqueueError: unknown = null;
  constructor(private readonly ctx: Omit<Ctx, "recorder">) {}

  ticket(): number {
    return this.tickets++;
  }
  /** Hands a stored file over (or `null`: the ticket's file was refused); resolves once it is recorded. */
  submit(ticket: number, item: Stored | null): Promise<void> {
    const done = new Promise<void>((resolve) => this.waiting.set(ticket, resolve));
    this.ready.set(ticket, item);
    this.recorded.push(done);
    void this.pump();
    return done;
  }
  private async pump(): Promise<void> {
    if (this.busy) return;
    this.busy = true;
    try {
      while (this.ready.has(this.next)) {
        const batch: { t: number; item: Stored | null }[] = [];
        while (this.ready.has(this.next) && batch.length < 500) {
          batch.push({ t: this.next, item: this.ready.get(this.next)! });
          this.ready.delete(this.next++);
        }
        const items = batch.flatMap((b) => (b.item ? [b.item] : []));
        if (items.length) await this.record(items);
        for (const b of batch) this.waiting.get(b.t)?.();
        for (const b of batch) this.waiting.delete(b.t);
      }
    } finally {
      this.busy = false;
    }
  }
  private async record(items: Stored[]): Promise<void> {
    const { ctx } = this;
    try {
      const known = new Map<string, { id: string; rel_path: string }>();
      for (let i = 0; i < items.length; i += 1000) {
        const rows = await db()("samples").where({ library_id: ctx.libraryId }).whereIn("sha256", items.slice(i, i + 1000).map((x) => x.sha256)).select("id", "rel_path", "sha256");
        for (const r of rows) known.set(r.sha256, r);
      }
      const fresh: Stored[] = [];
      const dups: { item: Stored; of: { id: string; rel_path: string } }[] = [];
      for (const it of items) {
        const of = known.get(it.sha256);
        if (of) dups.push({ item: it, of });
        else {
          known.set(it.sha256, { id: it.sampleId, rel_path: it.relPath });
          fresh.push(it);
        }
      }
      await insertSamplesWithWords(db(), fresh.map((it) => this.row(it)));
      for (const it of fresh) this.queued(it);
      this.measure(fresh);
      await Promise.all(dups.map(({ item, of }) => this.duplicate(item, of)));
    } catch {
      // the batch as a whole was refused: file by file, each with its own outcome
      for (const it of items) await this.recordOne(it);
    }
  }
  private row(it: Stored) {
    const { ctx } = this;
    return {
      id: it.sampleId,
      studio_id: ctx.studioId,
      library_id: ctx.libraryId,
      rel_path: it.relPath,
      path_key: it.relPath.slice(0, 500),
      file_name: path.posix.basename(it.relPath).slice(0, 255),
      sha256: it.sha256,
      size_bytes: it.bytes,
      storage_key: it.key,
      state: "queued",
      uploaded_by: ctx.userId,
    };
  }
  /**
   * Queues the measuring of recorded files while the upload goes on (so the first files are measured before
   * the last arrive, and a large batch never builds all its jobs at once), in order, on a chain of its own: a
   * Redis that is away holds the chain (ioredis queues the commands until it returns), never the recording.
   */
  private measure(items: Stored[]) {
    const { studioId, libraryId } = this.ctx;
    const jobs = items.map((it) => ({ sampleId: it.sampleId, studioId, libraryId }));
    if (!jobs.length) return;
    this.enqueueing = this.enqueueing.then(() => enqueueMeasure(jobs)).catch((e) => void (this.enqueueError ??= e));
  }
  /** Resolves once every recorded file's job is queued; throws the first error met on the way. */
  async measuringQueued(): Promise<void> {
    await this.enqueueing;
    if (this.enqueueError) throw this.enqueueError;
  }
  private queued(it: Stored) {
    Object.assign(it.result, { status: "queued", sampleId: it.sampleId });
    this.ctx.queued.push({ sampleId: it.sampleId });
  }
  private async duplicate(it: Stored, of: { id?: string; rel_path?: string } | undefined) {
    await storage().delete(it.key).catch(() => undefined);
    Object.assign(it.result, { status: "duplicate", sampleId: of?.id, reason: `same content as ${of?.rel_path ?? "another file"}` });
  }
  private async recordOne(it: Stored, attempt = 1): Promise<void> {
    const { ctx } = this;
    try {
      const dup = await db()("samples").where({ library_id: ctx.libraryId, sha256: it.sha256 }).first("id", "rel_path");
      if (dup) return await this.duplicate(it, dup);
      await insertSamplesWithWords(db(), [this.row(it)]);
      this.queued(it);
      this.measure([it]);
    } catch (e) {
      const errno = (e as { errno?: number }).errno;
      // two uploads into one library can deadlock on its unique (library, hash) index: InnoDB rolls one back
      // (1213) and that one tries again (as the server's message asks), after a short random pause
      if ((errno === 1213 || errno === 1205) && attempt < 5) {
        await new Promise((r) => setTimeout(r, 20 + Math.random() * 80 * attempt));
        return this.recordOne(it, attempt + 1);
      }
      if (errno === 1062) return await this.duplicate(it, await db()("samples").where({ library_id: ctx.libraryId, sha256: it.sha256 }).first("id", "rel_path").catch(() => undefined));
      await storage().delete(it.key).catch(() => undefined);
      if (errno === 1452) Object.assign(it.result, { code: "error", reason: "the library no longer exists" });
      else if (e instanceof AppError) Object.assign(it.result, { code: "error", reason: e.message });
      else {
        console.error(e);
        Object.assign(it.result, { code: "error", reason: ERROR_REASON });
      }
    }
  }
}

/**
 * Streams one WAV (from the request or a zip entry) to storage and hands it to the recorder. Resolves once the
 * file is stored (its recording is awaited through ctx.recorder.recorded). Never throws.
 */
async function storeWav(ctx: Ctx, src: Readable, relPath: string, drain: () => void, sourceError: (e: Error) => Refusal = interruptedRefusal): Promise<void> {
  const sampleId = newId();
  const key = sampleKey(ctx.studioId, ctx.libraryId, sampleId);
  const ticket = ctx.recorder.ticket();
  const inspect = new Inspect("wav", ctx.maxFile, ctx.addBytes);
  ctx.active.add(inspect);
  // a failure of the source (the request, a zip entry) is told in our words, never the library's message
  src.on("error", (e) => inspect.destroy(sourceError(e)));
  inspect.on("error", () => {
    src.unpipe(inspect);
    drain();
  });
  src.pipe(inspect);
  const result: UploadFileResult = { name: relPath, status: "refused" };
  ctx.results.push(result);
  let stored: Stored | null = null;
  try {
    const { bytes } = await storage().put(key, inspect);
    stored = { sampleId, key, relPath, sha256: inspect.hash.digest("hex"), bytes, result };
  } catch (e) {
    await storage().delete(key).catch(() => undefined);
    if (e instanceof Refusal) Object.assign(result, { code: e.code, reason: e.message });
    else if (e instanceof AppError) Object.assign(result, { code: "error", reason: e.message });
    else {
      const interrupted = /aborted|premature|unexpected end|ECONNRESET/i.test((e as Error)?.message ?? String(e));
      Object.assign(result, { code: interrupted ? "interrupted" : "error", reason: interrupted ? "the upload was interrupted" : ERROR_REASON });
      if (!interrupted) console.error(e);
    }
  } finally {
    ctx.active.delete(inspect);
    // a refused file still hands its ticket in, so the files after it are not held back
    void ctx.recorder.submit(ticket, stored);
  }
}

function decodeEntryName(entry: yauzl.Entry): string {
  const raw = entry.fileName as unknown as Buffer;
  // bit 11: UTF-8 names; otherwise IBM437, read as latin1 (close enough for ASCII names)
  return Buffer.isBuffer(raw) ? ((entry.generalPurposeBitFlag & 0x800) !== 0 ? raw.toString("utf8") : raw.toString("latin1")) : String(raw);
}

/** Reads a zip pack from a temporary file and stores its WAV entries (each with its own outcome). */
async function storeZip(ctx: Ctx, zipPath: string, zipName: string, zipBytes: number): Promise<void> {
  const base = path.posix.dirname(zipName) === "." ? "" : `${path.posix.dirname(zipName)}/`;
  const refuse = (name: string, code: string, reason: string) => ctx.results.push({ name, status: "refused", code, reason });
  let zip: yauzl.ZipFile;
  try {
    zip = await new Promise<yauzl.ZipFile>((res, rej) => yauzl.open(zipPath, { lazyEntries: true, decodeStrings: false, validateEntrySizes: true, autoClose: false }, (e, z) => (e || !z ? rej(e ?? new Error("no zip")) : res(z))));
  } catch {
    refuse(zipName, "zip-damaged", "the zip pack could not be read: its central directory is missing or damaged");
    return;
  }
  try {
    if (zip.entryCount > ZIP_LIMITS.maxEntries) {
      refuse(zipName, "zip-too-many", `the zip pack holds ${zip.entryCount} entries; at most ${ZIP_LIMITS.maxEntries} are accepted`);
      return;
    }
    // First pass over the central directory: sizes and ratios before anything is inflated.
    const entries: yauzl.Entry[] = [];
    try {
      await new Promise<void>((res, rej) => {
        zip.on("entry", (e: yauzl.Entry) => {
          entries.push(e);
          zip.readEntry();
        });
        zip.on("end", () => res());
        zip.on("error", rej);
        zip.readEntry();
      });
    } catch {
      refuse(zipName, "zip-damaged", "the zip pack's central directory does not match its contents (a damaged or altered pack); nothing in it was stored");
      return;
    }
    const total = entries.reduce((s, e) => s + e.uncompressedSize, 0);
    if (total > ZIP_LIMITS.maxTotalUncompressed) {
      refuse(zipName, "zip-too-large", `the zip pack would unpack to ${mb(total)}; at most ${mb(ZIP_LIMITS.maxTotalUncompressed)} are accepted`);
      return;
    }
    if (zipBytes > 0 && total / zipBytes > ZIP_LIMITS.maxPackRatio && total > 16 * 1024 * 1024) {
      refuse(zipName, "zip-ratio", `the zip pack unpacks to ${Math.round(total / zipBytes)} times its size (more than ${ZIP_LIMITS.maxPackRatio}); refused as a possible zip bomb`);
      return;
    }
    for (const entry of entries) {
      const rawName = decodeEntryName(entry);
      if (rawName.endsWith("/")) continue; // a folder
      const rel = cleanRelPath(rawName);
      const shown = `${zipName}: ${rawName}`;
      if (!rel || yauzl.validateFileName(rawName.replace(/\\/g, "/")) !== null) {
        refuse(shown, "bad-path", "the entry's path leaves the pack (absolute or with '..'); refused");
        continue;
      }
      if (!/\.wave?$/i.test(rel)) {
        refuse(`${base}${rel}`, "not-wav", "not a .wav file; skipped");
        continue;
      }
      if (entry.uncompressedSize > ctx.maxFile) {
        refuse(`${base}${rel}`, "too-large", `larger than the ${mb(ctx.maxFile)} limit per file`);
        continue;
      }
      if (entry.uncompressedSize > 1024 * 1024 && entry.compressedSize > 0 && entry.uncompressedSize / entry.compressedSize > ZIP_LIMITS.maxEntryRatio) {
        refuse(`${base}${rel}`, "zip-ratio", `compressed ${Math.round(entry.uncompressedSize / entry.compressedSize)} to 1 (more than ${ZIP_LIMITS.maxEntryRatio}); refused as a possible zip bomb`);
        continue;
      }
      if ((entry.generalPurposeBitFlag & 0x1) !== 0) {
        refuse(`${base}${rel}`, "zip-encrypted", "the entry is encrypted; refused");
        continue;
      }
      let stream: Readable;
      try {
        stream = await new Promise<Readable>((res, rej) => zip.openReadStream(entry, (e, s) => (e || !s ? rej(e ?? new Error("no stream")) : res(s))));
      } catch {
        refuse(`${base}${rel}`, "zip-damaged", "the entry could not be read from the pack (a damaged or altered pack)");
        continue;
      }
      await storeWav(ctx, stream, `${base}${rel}`, () => stream.resume(), zipEntryRefusal);
    }
  } finally {
    zip.close();
  }
}

/**
 * Feeds the request body to the multipart parser chunk by chunk, waiting whenever the parser is full; resolves
 * once the parser has read the whole body. Reading the web stream directly, rather than through
 * Readable.fromWeb and pipe, spares a stream layer and the objects it makes per chunk (bench/RESULTS.md,
 * finding 8).
 */
async function feedParser(body: ReadableStream<Uint8Array>, bb: busboy.Busboy, scanner: PartHeaderScanner): Promise<void> {
  const reader = body.getReader();
  let failure: Error | null = null;
  let wake: (() => void) | null = null;
  const closed = new Promise<void>((resolve, reject) => {
    bb.on("close", resolve);
    bb.on("error", (e: Error) => {
      failure = e;
      wake?.();
      reject(e);
    });
  });
  closed.catch(() => undefined); // awaited below; a parser error met while reading is thrown from the loop
  bb.on("drain", () => wake?.());
  try {
    for (;;) {
      const { value, done } = await reader.read();
      if (failure) throw failure;
      if (done) break;
      const chunk = Buffer.from(value.buffer, value.byteOffset, value.byteLength);
      scanner.write(chunk); // first: it has seen a part's header by the time busboy hands the part over
      if (!bb.write(chunk)) {
        await new Promise<void>((r) => (wake = r));
        wake = null;
        if (failure) throw failure;
      }
    }
  } catch (e) {
    void reader.cancel().catch(() => undefined);
    if (!failure) bb.destroy(e as Error);
    throw failure ?? e;
  }
  bb.end();
  await closed;
}

/** Receives a multipart upload into a library (the body is read here; the route declares no body). */
export async function receiveUpload({ studioId, libraryId, userId, req }: { studioId: string; libraryId: string; userId: string; req: Request }): Promise<UploadSummary> {
  const lib = await assertLibrary({ studioId, libraryId });
  const e = env();
  const maxFile = e.KW_UPLOAD_MAX_FILE_BYTES;
  const maxBatch = e.KW_UPLOAD_MAX_BATCH_BYTES;
  const type = req.headers.get("content-type") ?? "";
  const media = mediaType(type);
  if (media?.type !== "multipart/form-data") throw new AppError("invalid-input", "Send the files as multipart/form-data.");
  // RFC 2046 section 5.1.1: the boundary parameter is required, 1 to 70 characters
  const boundary = media.parameters.boundary ?? "";
  if (!boundary) throw new AppError("invalid-input", "The upload names no multipart boundary (Content-Type: multipart/form-data; boundary=...); nothing was stored.");
  if (boundary.length > 70) throw new AppError("invalid-input", "The upload's multipart boundary is longer than 70 characters (RFC 2046); nothing was stored.");
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > maxBatch) throw new AppError("too-large", `This upload is ${mb(declared)}; one batch may hold at most ${mb(maxBatch)}. Send the files in smaller batches.`);
  if (!req.body) throw new AppError("invalid-input", "The upload is empty.");

  let total = 0;
  let batchTooLarge = false;
  const base: Omit<Ctx, "recorder"> = {
    studioId,
    libraryId,
    userId,
    maxFile,
    results: [],
    queued: [],
    active: new Set(),
    addBytes: (n) => {
      total += n;
      if (total > maxBatch && !batchTooLarge) {
        batchTooLarge = true;
        for (const a of ctx.active) a.destroy(new Refusal("too-large", `the batch went over its ${mb(maxBatch)} limit`));
      }
    },
  };
  const ctx: Ctx = { ...base, recorder: new Recorder(base) };
  const tasks: Promise<void>[] = [];
  const tmpFiles: string[] = [];
  let bb: busboy.Busboy;
  try {
    bb = busboy({ headers: { "content-type": type }, preservePath: true, defParamCharset: "utf8", highWaterMark: STREAM_BUFFER, fileHwm: STREAM_BUFFER, limits: { fileSize: Number.MAX_SAFE_INTEGER, files: 50_000, fields: 50, parts: 50_100 } });
  } catch (err) {
    throw new AppError("invalid-input", `The upload's multipart header could not be read (${(err as Error).message.replace(/^Multipart: /, "")}); nothing was stored.`);
  }
  // busboy skips a part whose header it cannot read without a word: the scanner lists every part, so each
  // skipped part that names a file gets its own outcome, in its place among the others
  const parts: PartHeader[] = [];
  const scanner = new PartHeaderScanner(boundary, (p) => parts.push(p));
  const skippedParts = () => {
    while (parts.length && !busboyReadsAsFile(parts[0]!)) {
      const p = parts.shift()!;
      if (mentionsFile(p.disposition)) ctx.results.push({ name: lenientFileName(p.disposition!), status: "refused", code: "bad-name", reason: BAD_NAME_REASON });
    }
  };
  bb.on("file", (_field, file, info) => {
    skippedParts();
    parts.shift(); // this file's own part

    // browsers and undici percent-encode quotes and line breaks in multipart file names
    const rel = cleanRelPath((info.filename ?? "").replace(/%22/g, '"').replace(/%0D/gi, "").replace(/%0A/gi, ""));
    if (!rel) {
      const long = (info.filename ?? "").length > MAX_PATH;
      ctx.results.push({ name: info.filename || "(no name)", status: "refused", code: long ? "path-too-long" : "bad-path", reason: long ? `the file's path is longer than ${MAX_PATH} characters; shorten its folder names` : "the file's path leaves its folder (absolute or with '..'); refused" });
      file.resume();
      return;
    }
    if (batchTooLarge) {
      ctx.results.push({ name: rel, status: "refused", code: "too-large", reason: `the batch went over its ${mb(maxBatch)} limit` });
      file.resume();
      return;
    }
    if (/\.zip$/i.test(rel)) {
      const tmp = path.join(os.tmpdir(), `kw-zip-${crypto.randomBytes(8).toString("hex")}.zip`);
      tmpFiles.push(tmp);
      const inspect = new Inspect("zip", maxBatch, ctx.addBytes);
      ctx.active.add(inspect);
      file.on("error", (err) => inspect.destroy(err));
      inspect.on("error", () => {
        file.unpipe(inspect);
        file.resume();
      });
      file.pipe(inspect);
      tasks.push(
        pipeline(inspect, fs.createWriteStream(tmp))
          .then(
            () => storeZip(ctx, tmp, rel, inspect.bytes),
            // receiving the pack failed: refused by a check, or the request stopped (a full disk: ours)
            (err) => {
              const known = err instanceof Refusal ? err : /aborted|premature|unexpected end|ECONNRESET/i.test(String(err?.message)) ? interruptedRefusal() : null;
              if (!known) console.error(err);
              ctx.results.push({ name: rel, status: "refused", code: known?.code ?? "error", reason: known?.message ?? ERROR_REASON });
            },
          )
          .catch((err) => {
            console.error(err);
            ctx.results.push({ name: rel, status: "refused", code: "error", reason: ERROR_REASON });
          })
          .finally(() => {
            ctx.active.delete(inspect);
            return fsp.rm(tmp, { force: true });
          }),
      );
      return;
    }
    tasks.push(storeWav(ctx, file, rel, () => file.resume()));
  });
  let failed: Error | null = null;
  try {
    await feedParser(req.body, bb, scanner);
    skippedParts();
    // parts busboy would read but never handed over: over its count limit
    for (const p of parts.splice(0)) if (busboyReadsAsFile(p)) ctx.results.push({ name: p.disposition && mentionsFile(p.disposition) ? lenientFileName(p.disposition) : "(no name)", status: "refused", code: "too-many", reason: "the batch holds more files than one upload may; send the rest in another batch" });
  } catch (err) {
    failed = err as Error;
    for (const a of ctx.active) a.destroy(err as Error);
  }
  await Promise.allSettled(tasks);
  await Promise.allSettled(ctx.recorder.recorded);
  await Promise.all(tmpFiles.map((t) => fsp.rm(t, { force: true })));

  // A body that could not be read to the end (a malformed part header, say a file name with control
  // characters, or a cut connection) may have lost files after the break without naming them. Rather than
  // answer for only part of the batch, take back what this request stored and refuse it whole. (Jobs already
  // queued for those files find no row and are skipped: measureSample, "deleted meanwhile".)
  if (failed && ctx.queued.length) {
    const ids = ctx.queued.map((q) => q.sampleId);
    await db().transaction(async (trx) => {
      await deleteWordsOfSamples(trx, libraryId, ids);
      await trx("samples").where({ studio_id: studioId, library_id: libraryId }).whereIn("id", ids).delete();
    });
    await Promise.all(ids.map((id) => storage().delete(sampleKey(studioId, libraryId, id)).catch(() => undefined)));
  }
  if (failed) {
    const malformed = /malformed/i.test(failed.message);
    throw new AppError(
      "invalid-input",
      malformed
        ? "The upload could not be read to the end: a part header is malformed (often a file name with control characters). Nothing was stored; rename the file and send the batch again."
        : "The upload was interrupted or malformed; nothing was stored.",
    );
  }

  await ctx.recorder.measuringQueued();
  const counts = { queued: 0, duplicate: 0, refused: 0 };
  for (const r of ctx.results) counts[r.status]++;
  const accepted = counts.queued + counts.duplicate;
  if (accepted > 0) {
    await logActivity(db(), { studioId, actorId: userId, action: "samples.uploaded", subjectType: "library", subjectId: libraryId, details: { library: lib.name, ...counts } });
  }
  if (!ctx.results.length) throw new AppError("invalid-input", "The upload holds no files.");
  if (batchTooLarge) throw new AppError("too-large", `This upload went over ${mb(maxBatch)}; one batch may hold at most ${mb(maxBatch)}. Send the files in smaller batches.`, { files: ctx.results, counts });
  // nothing accepted: the answer's status says so (413 when a file was too large, else 422), with every outcome
  if (accepted === 0) {
    const tooLarge = ctx.results.filter((r) => r.code === "too-large");
    if (tooLarge.length) throw new AppError("too-large", `${tooLarge[0]!.name} is ${tooLarge[0]!.reason}; nothing was stored.`, { files: ctx.results, counts });
    const n = ctx.results.length;
    throw new AppError("invalid-input", n === 1 ? `${ctx.results[0]!.name} was refused: ${ctx.results[0]!.reason}.` : `None of the ${n} files was accepted; each one's reason is listed.`, { files: ctx.results, counts });
  }
  return { files: ctx.results, counts };
}
