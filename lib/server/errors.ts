import "server-only";
// One error class and one JSON shape for every failure: { error: { code, message } }.
import type { ErrorBody, ErrorCode } from "@/lib/api-types/errors";

const STATUS: Record<ErrorCode, number> = {
  unauthenticated: 401,
  forbidden: 403,
  "not-found": 404,
  "invalid-input": 422,
  "too-large": 413,
  conflict: 409,
  "rate-limited": 429,
  unavailable: 503,
  internal: 500,
};

export class AppError extends Error {
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.status = STATUS[code];
  }
}

export const notFound = (what = "That item") => new AppError("not-found", `${what} was not found.`);
export const forbidden = (msg = "Your role in this studio does not allow that.") => new AppError("forbidden", msg);

/** Database errors that mean "the database is not there" become a 503. */
export function isDatabaseDown(e: unknown): boolean {
  const code = (e as { code?: string })?.code;
  return ["ECONNREFUSED", "PROTOCOL_CONNECTION_LOST", "ETIMEDOUT", "EPIPE"].includes(code ?? "");
}

/** The database is up but every connection stayed busy for the whole wait: the server is overloaded. */
export function isDatabaseBusy(e: unknown): boolean {
  return (e as { code?: string })?.code === "ER_CON_COUNT_ERROR" || /Knex: Timeout acquiring a connection/.test((e as Error)?.message ?? "");
}

export function toErrorBody(e: unknown): { status: number; body: ErrorBody } {
  if (e instanceof AppError) {
    return { status: e.status, body: { error: { code: e.code, message: e.message, ...(e.details ? { details: e.details } : {}) } } };
  }
  if (isDatabaseBusy(e)) {
    return { status: 503, body: { error: { code: "unavailable", message: "The server is busy right now; try again in a moment." } } };
  }
  if (isDatabaseDown(e)) {
    return { status: 503, body: { error: { code: "unavailable", message: "The database is not reachable right now; try again shortly." } } };
  }
  console.error(e);
  return { status: 500, body: { error: { code: "internal", message: "Something went wrong on our side." } } };
}
