import "server-only";
// Storing one WAV (a part of the request or an entry of a zip pack): through inspection straight to storage,
// then handed to the recorder. Every failure becomes the file's own outcome.
import type { Readable } from "node:stream";
import { AppError } from "../../errors";
import { newId } from "../../ids";
import { storage } from "../../storage";
import { sampleKey } from "../libraries";
import type { UploadCtx } from "./context";
import { Inspect } from "./inspect";
import { ERROR_REASON, interruptedRefusal, isInterruption, Refusal, type UploadFileResult } from "./outcome";
import type { Stored } from "./recorder";

/**
 * Streams one WAV (from the request or a zip entry) to storage and hands it to the recorder. Resolves once the
 * file is stored (its recording is awaited through ctx.recorder.recorded). Never throws.
 */
export async function storeWav(ctx: UploadCtx, src: Readable, relPath: string, drain: () => void, sourceError: (e: Error) => Refusal = interruptedRefusal): Promise<void> {
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
      const interrupted = isInterruption((e as Error)?.message ?? String(e));
      Object.assign(result, { code: interrupted ? "interrupted" : "error", reason: interrupted ? "the upload was interrupted" : ERROR_REASON });
      if (!interrupted) console.error(e);
    }
  } finally {
    ctx.active.delete(inspect);
    // a refused file still hands its ticket in, so the files after it are not held back
    void ctx.recorder.submit(ticket, stored);
  }
}
