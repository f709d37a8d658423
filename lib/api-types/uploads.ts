// Answers of POST /api/studios/:id/libraries/:libraryId/uploads (multipart; one outcome per file). Types only.

export type UploadStatus = "queued" | "duplicate" | "refused";
export interface UploadFileResult {
  name: string;
  status: UploadStatus;
  reason?: string;
  /** Stable code of the refusal: not-wav, rf64, too-large, bad-path, path-too-long, bad-name, too-many, zip-*, empty, interrupted, error. */
  code?: string;
  sampleId?: string;
}
/** 201: at least one file was accepted. A batch in which nothing was accepted answers 422 (413 when a file was
 * too large) with the same outcomes in `error.details.files`. */
export interface UploadSummary {
  files: UploadFileResult[];
  counts: { queued: number; duplicate: number; refused: number };
}
