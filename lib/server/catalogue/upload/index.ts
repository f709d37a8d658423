import "server-only";
// Upload of WAV files, folders and .zip packs into a library (POST .../uploads; the route declares no body and
// this reads it). The multipart body is streamed with busboy straight to storage, never held in memory
// (intake.ts); each file's first bytes are checked (RIFF....WAVE, RF64 refused; PK\x03\x04 for packs) and its
// SHA-256 and size computed on the way (inspect.ts); packs are read under zip-bomb limits (zip.ts); stored files
// are recorded `queued` and enqueued for measuring in batches (recorder.ts); a file already in the library (same
// hash) is a duplicate and not stored twice. One bad file never fails its batch: every file gets its own outcome
// (outcome.ts), and the answer is shaped from them (finish.ts).
import { env } from "../../env";
import { AppError } from "../../errors";
import { mediaType } from "../../media-type";
import { assertLibrary } from "../libraries";
import { createUploadCtx } from "./context";
import { answerUpload, refuseBrokenUpload } from "./finish";
import { readParts } from "./intake";
import { mb, type UploadSummary } from "./outcome";

export type { UploadFileResult, UploadStatus, UploadSummary } from "./outcome";
export { cleanRelPath, MAX_PATH } from "./paths";
export { ZIP_LIMITS } from "./zip";

/** Receives a multipart upload into a library. */
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

  const ctx = createUploadCtx({ studioId, libraryId, userId, maxFile, maxBatch });
  const { failed } = await readParts(ctx, req.body, type, boundary);
  if (failed) return refuseBrokenUpload(ctx, failed, lib.name);
  return answerUpload(ctx, lib.name);
}
