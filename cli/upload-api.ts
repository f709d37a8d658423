// The HTTP API `kitwright upload` speaks: every address it calls (the OpenAPI test checks each one is in
// /api/openapi.json with the method used here), and one request helper that turns every way a call can fail
// (no server, not a Kitwright server, a refused token) into one sentence for the person at the terminal.
import type { UploadFileResult, UploadSummary } from "../lib/api-types/uploads";
import type { HashLookupAnswer, Whoami } from "../lib/api-types/tokens";
import type { ErrorBody } from "../lib/api-types/errors";

/** The addresses (OpenAPI path templates) and methods the command uses. */
export const UPLOAD_API = {
  whoami: { method: "GET", path: "/api/whoami" },
  library: { method: "GET", path: "/api/studios/{studioId}/libraries/{libraryId}" },
  byHash: { method: "POST", path: "/api/studios/{studioId}/libraries/{libraryId}/samples/by-hash" },
  upload: { method: "POST", path: "/api/studios/{studioId}/libraries/{libraryId}/uploads" },
} as const;

const fill = (template: string, ids: Record<string, string>) => template.replace(/\{(\w+)\}/g, (_, k: string) => encodeURIComponent(ids[k] ?? ""));

/** A failure the command cannot go past (exit code 3): the sentence says what to do. */
export class SetupError extends Error {}

/** A request that failed: `status` 0 when no answer came (network), else the HTTP status with the server's words. */
export class RequestError extends Error {
  constructor(readonly status: number, message: string, readonly body?: Partial<ErrorBody>) {
    super(message);
  }
}

export class UploadClient {
  constructor(readonly server: string, private readonly token: string) {}

  private async request<T>(call: { method: string; path: string }, ids: Record<string, string>, init: { json?: unknown; form?: FormData; signal?: AbortSignal } = {}): Promise<{ status: number; body: T }> {
    const url = new URL(fill(call.path, ids), this.server);
    const headers: Record<string, string> = { authorization: `Bearer ${this.token}`, accept: "application/json" };
    let body: BodyInit | undefined;
    if (init.json !== undefined) {
      headers["content-type"] = "application/json";
      body = JSON.stringify(init.json);
    } else if (init.form) body = init.form;
    let res: Response;
    try {
      res = await fetch(url, { method: call.method, headers, body, signal: init.signal, redirect: "manual" });
    } catch (e) {
      if ((e as Error).name === "AbortError") throw e;
      const cause = (e as { cause?: { code?: string; message?: string } }).cause;
      throw new RequestError(0, `cannot reach ${this.server} (${cause?.code ?? cause?.message ?? (e as Error).message})`);
    }
    const text = await res.text();
    let parsed: unknown;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      throw new RequestError(res.status, `${this.server} does not answer as a Kitwright server (${call.method} ${url.pathname} answered ${res.status} ${res.headers.get("content-type") ?? "without a type"})`);
    }
    const err = (parsed as Partial<ErrorBody> | null)?.error;
    if (!res.ok && !(res.status === 422 || res.status === 413) && err?.message) throw new RequestError(res.status, err.message, parsed as Partial<ErrorBody>);
    if (!res.ok && !err) throw new RequestError(res.status, `${call.method} ${url.pathname} answered ${res.status}`);
    return { status: res.status, body: parsed as T };
  }

  async whoami(): Promise<Whoami> {
    return (await this.request<Whoami>(UPLOAD_API.whoami, {})).body;
  }

  async library(studioId: string, libraryId: string): Promise<{ id: string; name: string }> {
    return (await this.request<{ id: string; name: string }>(UPLOAD_API.library, { studioId, libraryId })).body;
  }

  async known(studioId: string, libraryId: string, sha256: string[]): Promise<HashLookupAnswer> {
    const r = await this.request<HashLookupAnswer | ErrorBody>(UPLOAD_API.byHash, { studioId, libraryId }, { json: { sha256 } });
    if ("error" in r.body) throw new RequestError(r.status, r.body.error.message, r.body);
    return r.body;
  }

  /** Sends one file; answers its outcome (queued, duplicate, or refused with the server's reason). */
  async upload(studioId: string, libraryId: string, file: { relPath: string; blob: Blob }, signal?: AbortSignal): Promise<UploadFileResult> {
    const form = new FormData();
    form.append("file", file.blob, file.relPath);
    const r = await this.request<UploadSummary | ErrorBody>(UPLOAD_API.upload, { studioId, libraryId }, { form, signal });
    const files = "error" in r.body ? (r.body.error.details as { files?: UploadFileResult[] } | undefined)?.files : r.body.files;
    const out = files?.[0];
    if (out) return out;
    const message = "error" in r.body ? r.body.error.message : `the server answered ${r.status} with no outcome for the file`;
    throw new RequestError(r.status, message, "error" in r.body ? r.body : undefined);
  }
}
