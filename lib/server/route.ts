import "server-only";
// The one wrapper for every route handler: session -> studio membership -> permission -> zod parsing of
// params, query and body -> handler -> errors mapped to { error: { code, message } }.
// Each wrapped handler carries `meta` (access kind and permission) so the role-matrix test can find routes
// without a rule.
import { NextResponse, type NextRequest } from "next/server";
import { getToken } from "next-auth/jwt";
import { z } from "zod";
import { env } from "./env";
import { AppError, forbidden, notFound, toErrorBody } from "./errors";
import { liveSessionUser } from "./auth/sessions";
import { requestHost } from "./client-address";
import { mediaType } from "./media-type";
import { can, isRole, type Permission, type Role } from "@/lib/permissions";

export const MAX_JSON_BYTES = 256 * 1024;

export type Access =
  | { kind: "public" }
  | { kind: "user" }
  | { kind: "studio"; permission: Permission };

export interface RouteMeta { access: Access }

type AnySchema = z.ZodType;
type Out<S> = S extends AnySchema ? z.infer<S> : undefined;

export interface Ctx<P, Q, B> {
  req: NextRequest;
  params: P;
  query: Q;
  body: B;
  user: { id: string; email: string; name: string } | null;
  studio: { id: string; role: Role } | null;
}

interface Spec<A extends Access, PS, QS, BS> {
  access: A;
  params?: PS;
  query?: QS;
  body?: BS;
  /** A POST that computes and creates nothing (a preview) answers 200 instead of 201. */
  creates?: false;
}

type Handler<A extends Access, P, Q, B> = (
  ctx: Ctx<P, Q, B> & (A extends { kind: "public" } ? unknown : { user: NonNullable<Ctx<P, Q, B>["user"]> }) &
    (A extends { kind: "studio" } ? { studio: NonNullable<Ctx<P, Q, B>["studio"]> } : unknown),
) => Promise<Response | object | null>;

export type WrappedHandler = ((req: NextRequest, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>) & { meta: RouteMeta };

function zodMessage(err: z.ZodError, where: string): AppError {
  const issues = err.issues.map((i) => ({ path: [where, ...i.path.map(String)].join("."), message: i.message }));
  const first = issues[0];
  return new AppError("invalid-input", first ? `${first.path}: ${first.message}` : `Invalid ${where}.`, { issues });
}

const UUID_SHAPE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Route params as the handler sees them: every id (a UUID, RFC 9562) in lower case. Our ids are generated in
 * lower case and MariaDB compares them without regard to case, so an upper-case spelling in a URL finds the
 * row; without this it would also be written in that spelling (a sample's library id, a counter row).
 */
export function normaliseParams(raw: Record<string, string | string[]>): Record<string, string | string[]> {
  const low = (v: string) => (UUID_SHAPE.test(v) ? v.toLowerCase() : v);
  return Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v.map(low) : low(v)]));
}

function parseWith<S extends AnySchema | undefined>(schema: S, value: unknown, where: string): Out<S> {
  if (!schema) return undefined as Out<S>;
  const r = schema.safeParse(value);
  if (!r.success) throw zodMessage(r.error, where);
  return r.data as Out<S>;
}

/** State-changing requests must come from our own origin (the Origin header, else Sec-Fetch-Site). */
export function checkSameOrigin(req: NextRequest): void {
  if (["GET", "HEAD", "OPTIONS"].includes(req.method)) return;
  const origin = req.headers.get("origin");
  // X-Forwarded-Host only counts when a trusted proxy sent it (lib/server/client-address.ts)
  const host = requestHost(req.headers);
  if (origin) {
    let originHost: string;
    try {
      originHost = new URL(origin).host;
    } catch {
      throw new AppError("forbidden", "Requests from another site are refused.");
    }
    if (originHost !== host && origin !== new URL(env().KW_APP_URL).origin) throw new AppError("forbidden", "Requests from another site are refused.");
    return;
  }
  const site = req.headers.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") throw new AppError("forbidden", "Requests from another site are refused.");
}

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** The path of the first string (or key) holding a lone UTF-16 surrogate, which JSON's \uXXXX escapes can spell. */
export function loneSurrogateAt(value: unknown, path: string): string | null {
  if (typeof value === "string") return LONE_SURROGATE.test(value) ? path : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const p = loneSurrogateAt(value[i], `${path}.${i}`);
      if (p) return p;
    }
    return null;
  }
  if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      if (LONE_SURROGATE.test(k)) return `${path} (a field name)`;
      const p = loneSurrogateAt(v, `${path}.${k}`);
      if (p) return p;
    }
  }
  return null;
}

async function readJson(req: NextRequest): Promise<unknown> {
  const len = Number(req.headers.get("content-length") ?? "0");
  if (len > MAX_JSON_BYTES) throw new AppError("too-large", `The request body is larger than ${MAX_JSON_BYTES / 1024} KB.`);
  const bytes = new Uint8Array(await req.arrayBuffer());
  if (bytes.byteLength > MAX_JSON_BYTES) throw new AppError("too-large", `The request body is larger than ${MAX_JSON_BYTES / 1024} KB.`);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new AppError("invalid-input", "The request body is not valid UTF-8 text; send JSON in UTF-8.");
  }
  if (!text.trim()) return {};
  if (mediaType(req.headers.get("content-type"))?.type !== "application/json") throw new AppError("invalid-input", "Send the body as JSON (Content-Type: application/json).");
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new AppError("invalid-input", "The request body is not valid JSON.");
  }
  // a lone surrogate cannot be stored as UTF-8 (MariaDB's JSON refuses it): refuse it here, by name
  const at = loneSurrogateAt(value, "body");
  if (at) throw new AppError("invalid-input", `${at}: the text is not valid Unicode (it holds a lone UTF-16 surrogate, \\uD800-\\uDFFF without its pair).`);
  return value;
}

export async function sessionUser(req: NextRequest): Promise<{ id: string; email: string; name: string } | null> {
  return (await sessionUserWithRole(req, null))?.user ?? null;
}

/** The signed-in user of a live session and, when a studio is named, their role in it: one query for all. */
async function sessionUserWithRole(req: NextRequest, studioId: string | null): Promise<{ user: { id: string; email: string; name: string }; role: string | null } | null> {
  const e = env();
  const token = await getToken({ req, secret: e.NEXTAUTH_SECRET, secureCookie: e.KW_APP_URL.startsWith("https://") });
  return liveSessionUser(token, studioId);
}

export function route<A extends Access, PS extends AnySchema | undefined = undefined, QS extends AnySchema | undefined = undefined, BS extends AnySchema | undefined = undefined>(
  spec: Spec<A, PS, QS, BS>,
  handler: Handler<A, Out<PS>, Out<QS>, Out<BS>>,
): WrappedHandler {
  const wrapped = async (req: NextRequest, ctx: { params: Promise<Record<string, string | string[]>> }) => {
    try {
      checkSameOrigin(req);
      const rawParams = normaliseParams((await ctx?.params) ?? {});
      let user: Ctx<unknown, unknown, unknown>["user"] = null;
      let studio: Ctx<unknown, unknown, unknown>["studio"] = null;
      const studioId = spec.access.kind === "studio" && typeof rawParams.studioId === "string" && UUID_SHAPE.test(rawParams.studioId) ? rawParams.studioId : null;
      let role: string | null = null;
      if (spec.access.kind !== "public") {
        const who = await sessionUserWithRole(req, studioId);
        if (!who) throw new AppError("unauthenticated", "Sign in first.");
        user = who.user;
        role = who.role;
      }
      if (spec.access.kind === "studio") {
        // Not a member: the studio's existence is not admitted (404, not 403).
        const r = role && isRole(role) ? role : null;
        if (!studioId || !r) throw notFound("The studio");
        if (!can(r, spec.access.permission)) throw forbidden();
        studio = { id: studioId, role: r };
      }
      const params = parseWith(spec.params, rawParams, "params");
      const query = parseWith(spec.query, Object.fromEntries(req.nextUrl.searchParams), "query");
      const body = spec.body ? parseWith(spec.body, await readJson(req), "body") : (undefined as Out<BS>);
      const out = await (handler as (c: Ctx<unknown, unknown, unknown>) => Promise<Response | object | null>)({ req, params, query, body, user, studio });
      // a signed-in person's answers are theirs alone: no shared cache keeps them, no cache at all by default
      const signedIn = spec.access.kind !== "public";
      if (out instanceof Response) {
        if (signedIn && !out.headers.has("cache-control")) out.headers.set("cache-control", "private, no-store");
        return out;
      }
      const headers = signedIn ? { "cache-control": "private, no-store" } : undefined;
      if (out === null) return new NextResponse(null, { status: 204, headers });
      return NextResponse.json(out, { status: req.method === "POST" && spec.creates !== false ? 201 : 200, headers });
    } catch (e) {
      const { status, body } = toErrorBody(e);
      return NextResponse.json(body, { status, headers: { "cache-control": "no-store" } });
    }
  };
  return Object.assign(wrapped, { meta: { access: spec.access } });
}
