import "server-only";
// Multipart intake: the request body is fed to busboy chunk by chunk (and to the part-header scanner, so a part
// busboy skips still gets an outcome); each file part is sent on by its name: a path that leaves its folder is
// refused, a .zip goes to the zip reader, anything else is stored as a WAV.
import fsp from "node:fs/promises";
import busboy from "busboy";
import { AppError } from "../../errors";
import type { UploadCtx } from "./context";
import { STREAM_BUFFER } from "./inspect";
import { busboyReadsAsFile, lenientFileName, mentionsFile, PartHeaderScanner, type PartHeader } from "./multipart-parts";
import { BAD_NAME_REASON, mb } from "./outcome";
import { cleanRelPath, MAX_PATH } from "./paths";
import { storeWav } from "./store";
import { receiveZip } from "./zip";

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

/**
 * Reads the whole multipart body into the upload: every file part is stored (or refused) with its own outcome in
 * ctx.results. Resolves once every file is stored and recorded and every temporary file removed, with the error
 * that stopped the body before its end (null when it was read whole). Throws only when the multipart header
 * cannot be read at all (nothing stored).
 */
export async function readParts(ctx: UploadCtx, body: ReadableStream<Uint8Array>, contentType: string, boundary: string): Promise<{ failed: Error | null }> {
  const tasks: Promise<void>[] = [];
  const tmpFiles: string[] = [];
  let bb: busboy.Busboy;
  try {
    bb = busboy({ headers: { "content-type": contentType }, preservePath: true, defParamCharset: "utf8", highWaterMark: STREAM_BUFFER, fileHwm: STREAM_BUFFER, limits: { fileSize: Number.MAX_SAFE_INTEGER, files: 50_000, fields: 50, parts: 50_100 } });
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
    if (ctx.batchTooLarge()) {
      ctx.results.push({ name: rel, status: "refused", code: "too-large", reason: `the batch went over its ${mb(ctx.maxBatch)} limit` });
      file.resume();
      return;
    }
    if (/\.zip$/i.test(rel)) {
      tasks.push(receiveZip(ctx, file, rel, tmpFiles));
      return;
    }
    tasks.push(storeWav(ctx, file, rel, () => file.resume()));
  });
  let failed: Error | null = null;
  try {
    await feedParser(body, bb, scanner);
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
  return { failed };
}
