// The one error shape of every route (lib/server/route.ts): { error: { code, message, details? } }, read by the
// client data layer (components/data/api.ts). Types only: imported by the server and the browser alike.

export type ErrorCode =
  | "unauthenticated"
  | "forbidden"
  | "not-found"
  | "invalid-input"
  | "too-large"
  | "conflict"
  | "rate-limited"
  | "unavailable"
  | "internal";

export interface ErrorBody {
  error: { code: string; message: string; details?: unknown };
}
