import "server-only";
// What the stages of one upload share: the library it goes into, the limits, every file's outcome so far, the
// files being received (so a batch that goes over its limit, or a request that breaks, can stop them) and the
// recorder.
import type { Inspect } from "./inspect";
import { mb, Refusal, type UploadFileResult } from "./outcome";
import { Recorder } from "./recorder";

export interface UploadCtx {
  studioId: string;
  libraryId: string;
  userId: string;
  maxFile: number;
  maxBatch: number;
  /** Every file's outcome, in the order the files were met. */
  results: UploadFileResult[];
  /** Files being received; stopped when the batch goes over its limit or the request breaks. */
  active: Set<Inspect>;
  /** Counts received bytes against the batch limit. */
  addBytes: (n: number) => void;
  /** True once the batch went over its limit (every file after that is refused). */
  batchTooLarge: () => boolean;
  /** Records stored files in the database, in upload order, many per transaction. */
  recorder: Recorder;
}

export function createUploadCtx(u: { studioId: string; libraryId: string; userId: string; maxFile: number; maxBatch: number }): UploadCtx {
  let total = 0;
  let tooLarge = false;
  const ctx: UploadCtx = {
    ...u,
    results: [],
    active: new Set(),
    addBytes: (n) => {
      total += n;
      if (total > u.maxBatch && !tooLarge) {
        tooLarge = true;
        for (const a of ctx.active) a.destroy(new Refusal("too-large", `the batch went over its ${mb(u.maxBatch)} limit`));
      }
    },
    batchTooLarge: () => tooLarge,
    recorder: new Recorder({ studioId: u.studioId, libraryId: u.libraryId, userId: u.userId }),
  };
  return ctx;
}
