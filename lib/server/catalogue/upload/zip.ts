import "server-only";
// Reading .zip packs: a pack is received to a temporary file (inspected like any file, under the batch's limit),
// then its central directory is checked against the limits (entries, total size, compression ratios: zip-bomb
// guards) before anything is inflated, and each WAV entry is stored with its own outcome.
import fs from "node:fs";
import fsp from "node:fs/promises";
import path from "node:path";
import type { Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import yauzl from "yauzl";
import type { UploadCtx } from "./context";
import { Inspect } from "./inspect";
import { ERROR_REASON, interruptedRefusal, isInterruption, mb, Refusal } from "./outcome";
import { cleanRelPath } from "./paths";
import { storeWav } from "./store";
import { zipSpoolPath } from "../../storage";

/** Limits of .zip packs (zip-bomb guards). */
export const ZIP_LIMITS = {
  maxEntries: 20_000,
  maxTotalUncompressed: 8 * 1024 ** 3,
  /** Uncompressed / compressed size above which an entry (of at least 1 MB) is refused. */
  maxEntryRatio: 200,
  /** Whole-pack ratio above which the pack is refused. */
  maxPackRatio: 100,
};

/** A zip entry that fails while it is unpacked: sizes that disagree with the directory, or damaged data. */
function zipEntryRefusal(e: Error): Refusal {
  if (/bytes in the stream/i.test(e.message)) return new Refusal("zip-damaged", "the entry's unpacked size does not match the size its directory gives (a damaged or altered pack)");
  return new Refusal("zip-damaged", "the entry could not be unpacked (its compressed data is damaged)");
}

/**
 * Receives a pack (a part of the request) into a temporary file, then stores its entries. Resolves once every
 * entry is stored (or the pack refused) and the temporary file removed; never throws. `tmpFiles` lists the
 * temporary file so the request removes it even when the pack's task is cut short.
 */
export function receiveZip(ctx: UploadCtx, file: Readable, rel: string, tmpFiles: string[]): Promise<void> {
  const tmp = zipSpoolPath();
  tmpFiles.push(tmp);
  const inspect = new Inspect("zip", ctx.maxBatch, ctx.addBytes);
  ctx.active.add(inspect);
  file.on("error", (err) => inspect.destroy(err));
  inspect.on("error", () => {
    file.unpipe(inspect);
    file.resume();
  });
  file.pipe(inspect);
  return pipeline(inspect, fs.createWriteStream(tmp))
    .then(
      () => storeZip(ctx, tmp, rel, inspect.bytes),
      // receiving the pack failed: refused by a check, or the request stopped (a full disk: ours)
      (err) => {
        const known = err instanceof Refusal ? err : isInterruption(String(err?.message)) ? interruptedRefusal() : null;
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
    });
}

function decodeEntryName(entry: yauzl.Entry): string {
  const raw = entry.fileName as unknown as Buffer;
  // bit 11: UTF-8 names; otherwise IBM437, read as latin1 (close enough for ASCII names)
  return Buffer.isBuffer(raw) ? ((entry.generalPurposeBitFlag & 0x800) !== 0 ? raw.toString("utf8") : raw.toString("latin1")) : String(raw);
}

/** Reads a zip pack from a temporary file and stores its WAV entries (each with its own outcome). */
async function storeZip(ctx: UploadCtx, zipPath: string, zipName: string, zipBytes: number): Promise<void> {
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
