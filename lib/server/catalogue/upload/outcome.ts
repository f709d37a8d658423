import "server-only";
// What an upload answers for each file: a status, a stable code when it is refused, and a reason in our words
// (a library's or the database's own message goes to the server's log, never to the person).

import type { UploadFileResult, UploadStatus, UploadSummary } from "@/lib/api-types/uploads";

export type { UploadFileResult, UploadStatus, UploadSummary };

/** A file refused by a check: its code and reason are the file's outcome. */
export class Refusal extends Error {
  constructor(readonly code: string, message: string) {
    super(message);
  }
}

/** The reason given when storing fails on our side (the error itself goes to the server's log). */
export const ERROR_REASON = "the file could not be stored (an error on our side, logged); send it again";

export const BAD_NAME_REASON = "the part's file name could not be read (it holds a raw '\"' or another character not allowed in a MIME header); rename the file and send it again";

export const interruptedRefusal = () => new Refusal("interrupted", "the upload was interrupted");

/** An error of the request's stream that says the sender went away (Node's and busboy's wordings). */
export const isInterruption = (message: string) => /aborted|premature|unexpected end|ECONNRESET/i.test(message);

/** Bytes as megabytes with one decimal, for reasons. */
export const mb = (n: number) => `${Math.round((n / 1024 / 1024) * 10) / 10} MB`;
