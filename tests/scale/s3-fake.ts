// The S3 fake of the scale test and scripts/scale.sh (npm s3rver) in a process of its own, so the object store
// is a separate service as on several machines: `node --import tsx tests/scale/s3-fake.ts --port P --dir D --bucket B`.
// Prints "[s3-fake] listening" when ready; stops on SIGTERM.
// One change to the fake: a PUT becomes visible whole or not at all, as on S3. s3rver writes the object's bytes in
// place and its metadata after them, so a PUT whose sender is killed mid-body leaves an object without metadata,
// and every later listing of the bucket fails (HTTP 500); here the bytes go to a temporary name and are renamed
// into place once complete, after the metadata.
import crypto from "node:crypto";
import fs from "node:fs";
import { Transform, type Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
// @ts-expect-error -- the package ships no type declarations
import S3rverImport from "s3rver";
// @ts-expect-error -- the package ships no type declarations
import FilesystemStore from "s3rver/lib/stores/filesystem";

interface S3rverObject { bucket: string; key: string; content: Buffer | Readable; metadata: Record<string, string> }
interface Store { getResourcePath(bucket: string, key: string, what: string): string; putMetadata(bucket: string, key: string, metadata: Record<string, string>, md5: string): Promise<void> }
(FilesystemStore as { prototype: { putObject(this: Store, o: S3rverObject): Promise<{ size: number; md5: string }> } }).prototype.putObject = async function (this: Store, object: S3rverObject) {
  const objectPath = this.getResourcePath(object.bucket, object.key, "object");
  await fs.promises.mkdir(objectPath.slice(0, objectPath.lastIndexOf("/")), { recursive: true });
  const tmp = `${objectPath}.incoming-${crypto.randomBytes(6).toString("hex")}`;
  const md5 = crypto.createHash("md5");
  let size = 0;
  try {
    if (Buffer.isBuffer(object.content)) {
      await fs.promises.writeFile(tmp, object.content);
      md5.update(object.content);
      size = object.content.length;
    } else {
      const count = new Transform({ transform(chunk: Buffer, _e, cb) { md5.update(chunk); size += chunk.length; cb(null, chunk); } });
      await pipeline(object.content, count, fs.createWriteStream(tmp));
    }
    const digest = md5.digest("hex");
    await this.putMetadata(object.bucket, object.key, object.metadata, digest);
    await fs.promises.rename(tmp, objectPath);
    return { size, md5: digest };
  } catch (e) {
    await fs.promises.rm(tmp, { force: true });
    throw e;
  }
};

interface FakeS3 { run(): Promise<unknown>; close(): Promise<unknown> }
const S3rver = S3rverImport as new (o: Record<string, unknown>) => FakeS3;

const arg = (name: string) => {
  const i = process.argv.indexOf(`--${name}`);
  if (i < 0 || !process.argv[i + 1]) throw new Error(`usage: s3-fake.ts --port P --dir D --bucket B (missing --${name})`);
  return process.argv[i + 1]!;
};
const dir = arg("dir");
fs.mkdirSync(dir, { recursive: true });
const server = new S3rver({ port: Number(arg("port")), address: "127.0.0.1", silent: process.env.KW_S3_FAKE_VERBOSE !== "1", directory: dir, configureBuckets: [{ name: arg("bucket"), configs: [] }] });
server.run().then(
  () => process.stdout.write("[s3-fake] listening\n"),
  (e: Error) => {
    process.stderr.write(`[s3-fake] could not start: ${e.message}\n`);
    process.exit(1);
  },
);
process.on("SIGTERM", () => void server.close().then(() => process.exit(0)));
