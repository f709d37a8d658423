// The browser's one low-level door to Kitwright's API: JSON in and out (`api`), the bytes of a stored file
// (`apiBytes`), and `ApiError` carrying the server's { error: { code, message, details } }. Only the hooks
// modules of components/data call it; components use those hooks.
import type { ErrorBody } from "@/lib/api-types/errors";

export class ApiError extends Error {
  constructor(readonly status: number, readonly code: string, message: string, readonly details?: unknown) {
    super(message);
  }
}

export async function api<T = unknown>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(path, {
    method: init.method ?? (init.body === undefined ? "GET" : "POST"),
    headers: init.body === undefined ? undefined : { "content-type": "application/json" },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    credentials: "same-origin",
  });
  if (res.status === 204) return undefined as T;
  const data = await res.json().catch(() => ({}));
  if (!res.ok) {
    const err = (data as Partial<ErrorBody>).error;
    throw new ApiError(res.status, err?.code ?? "error", err?.message ?? `The server answered ${res.status}.`, err?.details);
  }
  return data as T;
}

/** The bytes of a stored file (sample audio). A refusal throws ApiError "the server answered <status> for <what>". */
export async function apiBytes(path: string, what: string): Promise<ArrayBuffer> {
  const res = await fetch(path, { credentials: "same-origin" });
  if (!res.ok) throw new ApiError(res.status, "error", `the server answered ${res.status} for ${what}`);
  return res.arrayBuffer();
}
