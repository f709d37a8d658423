import "server-only";
// The end of an upload: a request that broke off keeps the files received whole and is refused; otherwise the activity row is written and the answer shaped from every file's outcome (201 with the
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
 * or a cut connection): the files received whole before the break are kept (each was stored and recorded
 * complete, and another request may already have answered "duplicate" of one of them: taking them back would
 * lose a file the library was said to hold); the file cut by the break was never recorded. The answer refuses
 * the request, names how many files were kept, and asks for the batch again (the kept ones then answer
 * "duplicate").
 */
export async function refuseBrokenUpload(ctx: UploadCtx, failed: Error, libraryName: string): Promise<never> {
  const { studioId, libraryId, userId } = ctx;
  const kept = ctx.recorder.queued.length;
  if (kept) {
    await ctx.recorder.measuringQueued();
    await logActivity(db(), { studioId, actorId: userId, action: "samples.uploaded", subjectType: "library", subjectId: libraryId, details: { library: libraryName, queued: kept, duplicate: 0, refused: 0, interrupted: true } });
  }
  const malformed = /malformed/i.test(failed.message);
  const keptWords = kept ? `The ${kept} file${kept > 1 ? "s" : ""} received whole before the break ${kept > 1 ? "were" : "was"} kept; send the batch again for the rest (the kept ones will answer "duplicate").` : "Nothing was stored.";
  throw new AppError(
    "invalid-input",
    malformed
      ? `The upload could not be read to the end: a part header is malformed (often a file name with control characters; rename the file). ${keptWords}`
      : `The upload was interrupted or malformed. ${keptWords}`,
    { files: ctx.results.filter((r) => r.status === "queued"), kept },
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
