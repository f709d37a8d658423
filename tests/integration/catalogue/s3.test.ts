// The S3-compatible storage adapter (AWS SDK v3) against a local S3 fake started here on a free 43xx port:
// put (bytes and streams), get, byte ranges, size, exists, delete, delete by prefix, list.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
// @ts-expect-error -- the package ships no type declarations
import S3rverImport from "s3rver";
import { S3Storage } from "@/lib/server/storage";
import { hitWav } from "./helpers";

async function freePort(): Promise<number> {
  for (let p = 4300 + Math.floor(Math.random() * 90); p < 4400; p++) {
    const ok = await new Promise<boolean>((res) => {
      const s = net.createServer().once("error", () => res(false)).listen(p, "127.0.0.1", () => s.close(() => res(true)));
    });
    if (ok) return p;
  }
  throw new Error("no free port in 43xx");
}

interface FakeS3 { run(): Promise<unknown>; close(): Promise<unknown> }
const S3rver = S3rverImport as new (o: Record<string, unknown>) => FakeS3;
let server: FakeS3;
let store: S3Storage;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "kw-s3-"));

beforeAll(async () => {
  const port = await freePort();
  server = new S3rver({ port, address: "127.0.0.1", silent: true, directory: dir, configureBuckets: [{ name: "kw-test", configs: [] }] });
  await server.run();
  store = new S3Storage({ bucket: "kw-test", endpoint: `http://127.0.0.1:${port}`, accessKeyId: "S3RVER", secretAccessKey: "S3RVER", forcePathStyle: true });
});

afterAll(async () => {
  await server?.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

async function text(r: Readable): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const c of r) parts.push(Buffer.from(c));
  return Buffer.concat(parts);
}

describe("S3 storage adapter", () => {
  it("puts a stream and reads it back whole and by byte range", async () => {
    const wav = Buffer.from(hitWav(7));
    const put = await store.put("studios/a/libraries/b/one.wav", Readable.from([wav.subarray(0, 1000), wav.subarray(1000)]));
    expect(put.bytes).toBe(wav.length);
    await store.check();
    expect(await store.size("studios/a/libraries/b/one.wav")).toBe(wav.length);
    expect(Buffer.from(await store.getBytes("studios/a/libraries/b/one.wav")).equals(wav)).toBe(true);
    const head = await text(await store.getStream("studios/a/libraries/b/one.wav", { start: 0, end: 11 }));
    expect(head.equals(wav.subarray(0, 12))).toBe(true);
    const mid = await text(await store.getStream("studios/a/libraries/b/one.wav", { start: 500, end: 1499 }));
    expect(mid.equals(wav.subarray(500, 1500))).toBe(true);
  });

  it("exists, delete and delete by prefix", async () => {
    await store.put("studios/a/libraries/c/x.wav", new Uint8Array([1, 2, 3]));
    await store.put("studios/a/libraries/c/y.wav", new Uint8Array([4, 5]));
    await store.put("studios/a/libraries/d/z.wav", new Uint8Array([6]));
    expect(await store.exists("studios/a/libraries/c/x.wav")).toBe(true);
    await store.delete("studios/a/libraries/c/x.wav");
    expect(await store.exists("studios/a/libraries/c/x.wav")).toBe(false);
    expect(await store.size("studios/a/libraries/c/nothing.wav")).toBeNull();
    expect(await store.deletePrefix("studios/a/libraries/c/")).toBe(1);
    expect(await store.exists("studios/a/libraries/c/y.wav")).toBe(false);
    expect(await store.exists("studios/a/libraries/d/z.wav")).toBe(true);
  });

  it("lists the objects under a prefix with the time each was written", async () => {
    const before = Date.now() - 2000; // the store's clock keeps whole seconds
    await store.put("studios/l/libraries/m/one.wav", new Uint8Array([1]));
    await store.put("studios/l/libraries/m/two.wav", new Uint8Array([2, 2]));
    await store.put("studios/l/libraries/n/three.wav", new Uint8Array([3]));
    const listed: { key: string; modifiedMs: number }[] = [];
    for await (const page of store.list("studios/l/libraries/m/")) listed.push(...page);
    expect(listed.map((o) => o.key).sort()).toEqual(["studios/l/libraries/m/one.wav", "studios/l/libraries/m/two.wav"]);
    for (const o of listed) expect(o.modifiedMs).toBeGreaterThanOrEqual(before);
    for (const o of listed) expect(o.modifiedMs).toBeLessThanOrEqual(Date.now() + 2000);
  });

  it("a stream that fails leaves no object", async () => {
    const bad = new Readable({
      read() {
        this.push(Buffer.alloc(1000, 1));
        this.destroy(new Error("client went away"));
      },
    });
    await expect(store.put("studios/a/libraries/e/broken.wav", bad)).rejects.toThrow(/went away/);
    expect(await store.exists("studios/a/libraries/e/broken.wav")).toBe(false);
  });

  it("refuses keys that would leave their folder", async () => {
    await expect(store.put("../x.wav", new Uint8Array([1]))).rejects.toThrow(/invalid storage key/);
  });
});
