// Uploads into a library: each file in its own multipart request, sent with XMLHttpRequest because fetch
// reports no upload progress. A request's answer becomes the file's outcomes (201; or 422/413, when nothing in
// it was accepted, with the same outcomes in error.details.files) or a reason it failed (connection lost,
// server restarting or busy: sending again is safe). Sending files makes the library's progress and sample
// pages stale; the hook asks for them again.
import { useCallback, useMemo } from "react";
import { useQueryClient } from "@tanstack/react-query";
import { paths } from "./paths";
import { progressKeys } from "./progress";
import { sampleKeys } from "./samples";
import type { ErrorBody } from "@/lib/api-types/errors";
import type { UploadFileResult, UploadSummary } from "@/lib/api-types/uploads";

export type UploadAnswer = { ok: true; files: UploadFileResult[] } | { ok: false; reason: string };

/** Reads one upload request's status and JSON body (null when there was none) as the file's answer. */
export function readUploadAnswer(status: number, body: unknown): UploadAnswer {
  const outcomes = status === 201 ? (body as Partial<UploadSummary> | null)?.files : ((body as Partial<ErrorBody> | null)?.error?.details as { files?: unknown } | undefined)?.files;
  if (Array.isArray(outcomes)) return { ok: true, files: outcomes as UploadFileResult[] };
  const reason = (body as Partial<ErrorBody> | null)?.error?.message ?? (status === 0 ? "the connection failed" : `the server answered ${status}`);
  return { ok: false, reason };
}

function sendFile(url: string, file: File, path: string, onProgress: (loaded: number) => void): Promise<UploadAnswer> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => onProgress(e.loaded);
    xhr.onload = () => resolve(readUploadAnswer(xhr.status, xhr.response));
    xhr.onerror = () => resolve(readUploadAnswer(0, null));
    const fd = new FormData();
    fd.append("file", file, path);
    xhr.send(fd);
  });
}

/** Sending files into a library: `send` one file (its relative path as the part's file name) with progress;
 * `fileSent` after each file (progress is read again), `batchSent` after the last (progress and samples). */
export function useUploads(studioId: string, libraryId: string) {
  const qc = useQueryClient();
  const url = paths.uploads(studioId, libraryId);
  const fileSent = useCallback(() => void qc.invalidateQueries({ queryKey: progressKeys.library(libraryId) }), [qc, libraryId]);
  const batchSent = useCallback(() => {
    void qc.invalidateQueries({ queryKey: progressKeys.library(libraryId) });
    void qc.invalidateQueries({ queryKey: sampleKeys.library(libraryId) });
  }, [qc, libraryId]);
  return useMemo(() => ({ send: (file: File, path: string, onProgress: (loaded: number) => void) => sendFile(url, file, path, onProgress), fileSent, batchSent }), [url, fileSent, batchSent]);
}
