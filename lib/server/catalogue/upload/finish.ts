import "server-only";
// The end of an upload: a request that broke off is taken back whole (rows, path words and stored files) and
// refused; otherwise the activity row is written and the answer shaped from every file's outcome (201 with the
// files; 422, or 413 when a file was too large, when nothing was accepted).
import { db } from "../../db";
import { logActivity } from "../../activity";
import { AppError } from "../../errors";
import { storage } from "../../storage";
import { sampleKey } from "../libraries";
import { deleteWordsOfSamples } from "../words";
import type { UploadCtx } from "./context";
import { mb, type UploadSummary } from "./outcome";

/**
 * A body that could not be read to the end (a malformed part header, say a file name with control characters,
 * or a cut connection) may have lost files after the break without naming them. Rather than answer for only
 * part of the batch, this takes back what the request stored and refuses it whole. (Jobs already queued for
 * those files find no row and are skipped: measureSample, "deleted meanwhile".)
 */
export async function refuseBrokenUpload(ctx: UploadCtx, failed: Error): Promise<never> {
  const { studioId, libraryId } = ctx;
  if (ctx.recorder.queued.length) {
    const ids = ctx.recorder.queued.map((q) => q.sampleId);
    await db().transaction(async (trx) => {
      await deleteWordsOfSamples(trx, libraryId, ids);
      await trx("samples").where({ studio_id: studioId, library_id: libraryId }).whereIn("id", ids).delete();
    });
    await Promise.all(ids.map((id) => storage().delete(sampleKey(studioId, libraryId, id)).catch(() => undefined)));
  }
  const malformed = /malformed/i.test(failed.message);
  throw new AppError(
    "invalid-input",
    malformed
      ? "The upload could not be read to the end: a part header is malformed (often a file name with control characters). Nothing was stored; rename the file and send the batch again."
      : "The upload was interrupted or malformed; nothing was stored.",
  );
}

/** Once every measure job is queued: the activity row (when anything was accepted) and the answer. */
export async function answerUpload(ctx: UploadCtx, libraryName: string): Promise<UploadSummary> {
  const { studioId, libraryId, userId, maxBatch } = ctx;
  await ctx.recorder.measuringQueued();
  const counts = { queued: 0, duplicate: 0, refused: 0 };
  for (const r of ctx.results) counts[r.status]++;
  const accepted = counts.queued + counts.duplicate;
  if (accepted > 0) {
    await logActivity(db(), { studioId, actorId: userId, action: "samples.uploaded", subjectType: "library", subjectId: libraryId, details: { library: libraryName, ...counts } });
  }
  if (!ctx.results.length) throw new AppError("invalid-input", "The upload holds no files.");
  if (ctx.batchTooLarge()) throw new AppError("too-large", `This upload went over ${mb(maxBatch)}; one batch may hold at most ${mb(maxBatch)}. Send the files in smaller batches.`, { files: ctx.results, counts });
  // nothing accepted: the answer's status says so (413 when a file was too large, else 422), with every outcome
  if (accepted === 0) {
    const tooLarge = ctx.results.filter((r) => r.code === "too-large");
    if (tooLarge.length) throw new AppError("too-large", `${tooLarge[0]!.name} is ${tooLarge[0]!.reason}; nothing was stored.`, { files: ctx.results, counts });
    const n = ctx.results.length;
    throw new AppError("invalid-input", n === 1 ? `${ctx.results[0]!.name} was refused: ${ctx.results[0]!.reason}.` : `None of the ${n} files was accepted; each one's reason is listed.`, { files: ctx.results, counts });
  }
  return { files: ctx.results, counts };
}
