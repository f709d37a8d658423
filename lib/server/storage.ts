import "server-only";
// Sample storage behind one interface: local disk under the data folder by default, or an S3-compatible
// object store (AWS SDK v3) when KW_S3_BUCKET is set. Keys are relative paths with "/" separators
// ("libraries/<libraryId>/<sampleId>.wav"). Writes are all-or-nothing: an aborted stream leaves no object.
import fs from "node:fs";
import fsp from "node:fs/promises";
import path from "node:path";
import crypto from "node:crypto";
import { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { DeleteObjectCommand, DeleteObjectsCommand, GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client, type S3ClientConfig } from "@aws-sdk/client-s3";
import os from "node:os";
import { env } from "./env";

/** Bytes a file write may buffer ahead of the disk. */
const WRITE_BUFFER = 1024 * 1024;

/** Byte range, both ends inclusive (as in HTTP Range). */
export interface ByteRange { start: number; end: number }

/** A stored object as listed: its key and when it was last written (ms since the epoch). */
export interface StoredObject { key: string; modifiedMs: number }

export interface Storage {
  kind: string;
  check(): Promise<void>;
  /** Stores a stream under key; resolves with the bytes written. On error nothing is left under key. */
  put(key: string, body: Readable | Uint8Array): Promise<{ bytes: number }>;
  /** Whole object as bytes. */
  getBytes(key: string): Promise<Uint8Array>;
  /** A stream of the object or of one byte range of it. */
  getStream(key: string, range?: ByteRange): Promise<Readable>;
  /** Size in bytes, or null when there is no such object. */
  size(key: string): Promise<number | null>;
  exists(key: string): Promise<boolean>;
  delete(key: string): Promise<void>;
  /** Deletes every object whose key starts with prefix (a "folder" ending in "/"). */
  deletePrefix(prefix: string): Promise<number>;
  /** Every whole object whose key starts with prefix (a "folder" ending in "/"), in pages; writes in progress are not listed. */
  list(prefix: string): AsyncGenerator<StoredObject[]>;
}

function safeKey(key: string): string {
  const parts = key.split("/");
  if (!key || key.startsWith("/") || parts.some((p) => p === "" || p === "." || p === "..") || key.includes("\\") || key.includes("\0")) {
    throw new Error(`invalid storage key "${key}"`);
  }
  return key;
}

export class LocalStorage implements Storage {
  readonly kind = "local";
  constructor(readonly root: string) {}
  private file(key: string): string {
    return path.join(this.root, ...safeKey(key).split("/"));
  }
  async check(): Promise<void> {
    await fsp.mkdir(this.root, { recursive: true });
    const probe = path.join(this.root, `.probe-${process.pid}`);
    await fsp.writeFile(probe, "ok");
    await fsp.unlink(probe);
  }
  async put(key: string, body: Readable | Uint8Array): Promise<{ bytes: number }> {
    const target = this.file(key);
    await fsp.mkdir(path.dirname(target), { recursive: true });
    const tmp = `${target}.part-${crypto.randomBytes(6).toString("hex")}`; // PART_FILE below
    let bytes = 0;
    const src = body instanceof Uint8Array ? Readable.from([Buffer.from(body.buffer, body.byteOffset, body.byteLength)]) : body;
    src.on("data", (c: Buffer) => (bytes += c.length));
    try {
      // a 1 MB buffer lets the next chunks arrive while one is being written (16 KB made the upload wait on
      // every disk write in turn)
      await pipeline(src, fs.createWriteStream(tmp, { highWaterMark: WRITE_BUFFER }));
      await fsp.rename(tmp, target);
    } catch (e) {
      await fsp.rm(tmp, { force: true });
      throw e;
    }
    return { bytes };
  }
  async getBytes(key: string): Promise<Uint8Array> {
    const b = await fsp.readFile(this.file(key));
    return new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  }
  async getStream(key: string, range?: ByteRange): Promise<Readable> {
    const f = this.file(key);
    await fsp.access(f);
    return fs.createReadStream(f, range ? { start: range.start, end: range.end } : undefined);
  }
  async size(key: string): Promise<number | null> {
    try {
      return (await fsp.stat(this.file(key))).size;
    } catch {
      return null;
    }
  }
  async exists(key: string): Promise<boolean> {
    return (await this.size(key)) !== null;
  }
  async delete(key: string): Promise<void> {
    await fsp.rm(this.file(key), { force: true });
  }
  async deletePrefix(prefix: string): Promise<number> {
    const dir = this.file(prefix.replace(/\/+$/, ""));
    let n = 0;
    try {
      n = (await fsp.readdir(dir, { recursive: true })).length;
    } catch {
      return 0;
    }
    await fsp.rm(dir, { recursive: true, force: true });
    return n;
  }
  async *list(prefix: string): AsyncGenerator<StoredObject[]> {
    let page: StoredObject[] = [];
    for await (const f of walkFiles(this.file(prefix.replace(/\/+$/, "")))) {
      if (PART_FILE.test(f)) continue;
      const st = await fsp.stat(f).catch(() => null);
      if (!st) continue;
      page.push({ key: path.relative(this.root, f).split(path.sep).join("/"), modifiedMs: st.mtimeMs });
      if (page.length === 1000) {
        yield page;
        page = [];
      }
    }
    if (page.length) yield page;
  }
}

export interface S3Options {
  bucket: string;
  endpoint?: string;
  region?: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  /** Path-style URLs (needed by most self-hosted S3-compatible stores and local fakes). */
  forcePathStyle?: boolean;
}

export class S3Storage implements Storage {
  readonly kind = "s3";
  readonly client: S3Client;
  readonly bucket: string;
  constructor(o: S3Options) {
    // checksums only where S3 requires them: many S3-compatible stores do not read aws-chunked trailers
    const cfg: S3ClientConfig = { region: o.region ?? "us-east-1", forcePathStyle: o.forcePathStyle ?? !!o.endpoint, requestChecksumCalculation: "WHEN_REQUIRED", responseChecksumValidation: "WHEN_REQUIRED" };
    if (o.endpoint) cfg.endpoint = o.endpoint;
    if (o.accessKeyId && o.secretAccessKey) cfg.credentials = { accessKeyId: o.accessKeyId, secretAccessKey: o.secretAccessKey };
    this.client = new S3Client(cfg);
    this.bucket = o.bucket;
  }
  async check(): Promise<void> {
    await this.client.send(new ListObjectsV2Command({ Bucket: this.bucket, MaxKeys: 1 }));
  }
  async put(key: string, body: Readable | Uint8Array): Promise<{ bytes: number }> {
    safeKey(key);
    if (body instanceof Uint8Array) {
      await this.client.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentLength: body.byteLength, ContentType: "audio/wav" }));
      return { bytes: body.byteLength };
    }
    // A plain PUT needs the length first: spool the stream to a temporary file (never to memory).
    const tmp = path.join(os.tmpdir(), `kw-s3-${crypto.randomBytes(8).toString("hex")}`); // S3_SPOOL below
    try {
      await pipeline(body, fs.createWriteStream(tmp));
      const bytes = (await fsp.stat(tmp)).size;
      await this.client.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: fs.createReadStream(tmp), ContentLength: bytes, ContentType: "audio/wav" }));
      return { bytes };
    } finally {
      await fsp.rm(tmp, { force: true });
    }
  }
  async getBytes(key: string): Promise<Uint8Array> {
    const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: safeKey(key) }));
    return await out.Body!.transformToByteArray();
  }
  async getStream(key: string, range?: ByteRange): Promise<Readable> {
    const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: safeKey(key), Range: range ? `bytes=${range.start}-${range.end}` : undefined }));
    return out.Body as Readable;
  }
  async size(key: string): Promise<number | null> {
    try {
      const h = await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: safeKey(key) }));
      return h.ContentLength ?? 0;
    } catch (e) {
      const status = (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
      if (status === 404 || (e as Error).name === "NotFound" || (e as Error).name === "NoSuchKey") return null;
      throw e;
    }
  }
  async exists(key: string): Promise<boolean> {
    return (await this.size(key)) !== null;
  }
  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: safeKey(key) }));
  }
  async deletePrefix(prefix: string): Promise<number> {
    let n = 0;
    let token: string | undefined;
    do {
      const page = await this.client.send(new ListObjectsV2Command({ Bucket: this.bucket, Prefix: prefix, ContinuationToken: token }));
      const keys = (page.Contents ?? []).map((c) => ({ Key: c.Key! }));
      if (keys.length) {
        await this.client.send(new DeleteObjectsCommand({ Bucket: this.bucket, Delete: { Objects: keys, Quiet: true } }));
        n += keys.length;
      }
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    return n;
  }
  async *list(prefix: string): AsyncGenerator<StoredObject[]> {
    let token: string | undefined;
    do {
      const page = await this.client.send(new ListObjectsV2Command({ Bucket: this.bucket, Prefix: prefix, ContinuationToken: token }));
      const objects = (page.Contents ?? []).map((c) => ({ key: c.Key!, modifiedMs: c.LastModified ? c.LastModified.getTime() : 0 }));
      if (objects.length) yield objects;
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
  }
}

/** Partial files of local writes in progress (`put` above): `<key>.part-<12 hex>`. */
const PART_FILE = /\.part-[0-9a-f]{12}$/;
/** Where an uploaded .zip pack is spooled while it is read (lib/server/catalogue/upload/zip.ts). */
const ZIP_SPOOL = /^kw-zip-[0-9a-f]{16}\.zip$/;
/** Where S3Storage.put spools a stream before its PUT (left behind when the process is killed meanwhile). */
const S3_SPOOL = /^kw-s3-[0-9a-f]{16}$/;
export function zipSpoolPath(tmpDir = os.tmpdir()): string {
  return path.join(tmpDir, `kw-zip-${crypto.randomBytes(8).toString("hex")}.zip`);
}

async function* walkFiles(dir: string): AsyncGenerator<string> {
  let entries: fs.Dirent[];
  try {
    entries = await fsp.readdir(dir, { withFileTypes: true });
  } catch {
    return;
  }
  for (const e of entries) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) yield* walkFiles(p);
    else if (e.isFile()) yield p;
  }
}

/**
 * Deletes upload leftovers older than `olderThanMs` (default an hour; a live upload writes to its file
 * continuously): partial files under the local storage root (`storageRoot`, by default the configured local
 * storage's, none with S3) and .zip and S3 spools in the temp folder (this machine's). Returns how many. Run by the worker's
 * maintenance schedule (workers/maintenance.ts).
 */
export async function sweepPartials({ storageRoot, tmpDir = os.tmpdir(), olderThanMs = 3600_000, now = Date.now() }: { storageRoot?: string | null; tmpDir?: string; olderThanMs?: number; now?: number } = {}): Promise<number> {
  const root = storageRoot === undefined ? (storage() instanceof LocalStorage ? (storage() as LocalStorage).root : null) : storageRoot;
  let n = 0;
  const sweep = async (file: string) => {
    const st = await fsp.stat(file).catch(() => null);
    if (st && now - st.mtimeMs > olderThanMs && (await fsp.rm(file, { force: true }).then(() => true, () => false))) n++;
  };
  if (root) for await (const f of walkFiles(root)) if (PART_FILE.test(f)) await sweep(f);
  for (const name of await fsp.readdir(tmpDir).catch(() => [] as string[])) if (ZIP_SPOOL.test(name) || S3_SPOOL.test(name)) await sweep(path.join(tmpDir, name));
  return n;
}

let cached: Storage | undefined;
export function storage(): Storage {
  if (!cached) {
    const e = env();
    cached = e.KW_S3_BUCKET
      ? new S3Storage({ bucket: e.KW_S3_BUCKET, endpoint: e.KW_S3_ENDPOINT, region: e.KW_S3_REGION, accessKeyId: e.KW_S3_ACCESS_KEY, secretAccessKey: e.KW_S3_SECRET_KEY })
      : new LocalStorage(path.resolve(e.KW_STORAGE_DIR));
  }
  return cached;
}
