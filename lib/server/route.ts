import "server-only";
// The one wrapper for every route handler: session -> studio membership -> permission -> zod parsing of
// params, query and body -> handler -> errors mapped to { error: { code, message } }.
// Each wrapped handler carries `meta` (access kind and permission) so the role-matrix test can find routes
// without a rule.
// A request may instead carry a personal API token (`Authorization: Bearer kwt_...`, lib/server/auth/api-tokens.ts):
// it acts for the token's creator, on its own studio's routes only, with the token's role capped by the creator's
// current role; a route of the "user" kind accepts one only when it says `tokens: true`. A token request without
// any cookie skips the same-origin check (no browser sends it, so no other site can make a browser send it), and
// nothing else. Every use is recorded (last use, and a row in the studio's activity log).
import { NextResponse, type NextRequest } from "next/server";
import { getToken } from "next-auth/jwt";
import { z } from "zod";
import { env } from "./env";
import { AppError, forbidden, notFound, toErrorBody } from "./errors";
import { liveSessionUser } from "./auth/sessions";
import { recordTokenUse, tokenCaller, type TokenCaller } from "./auth/api-tokens";
import { requestHost } from "./client-address";
import { mediaType } from "./media-type";
import { can, isRole, type Permission, type Role } from "@/lib/permissions";

export const MAX_JSON_BYTES = 256 * 1024;

export type Access =
  | { kind: "public" }
  | { kind: "user" }
  | { kind: "studio"; permission: Permission };

export interface RouteMeta {
  access: Access;
  /** A "user" route that personal API tokens may call too (studio routes always may, on their own studio). */
  tokens?: boolean;
  /** The zod schemas the wrapper parses with: the OpenAPI test checks the document names these very ones. */
  schemas: { params?: z.ZodType; query?: z.ZodType; body?: z.ZodType };
}

type AnySchema = z.ZodType;
type Out<S> = S extends AnySchema ? z.infer<S> : undefined;

export interface Ctx<P, Q, B> {
  req: NextRequest;
  params: P;
  query: Q;
  body: B;
  user: { id: string; email: string; name: string } | null;
  studio: { id: string; role: Role } | null;
  /** The personal API token the request carries, if it authenticated with one, with its role now (capped). */
  token: (TokenCaller["token"] & { role: Role | null }) | null;
}

interface Spec<A extends Access, PS, QS, BS> {
  access: A;
  tokens?: boolean;
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

/**
 * The secret of `Authorization: Bearer <secret>` (RFC 6750 section 2.1), null without one. Another scheme is
 * left alone (a proxy's Basic login in front of the app, say): the session cookie decides then.
 */
export function bearerSecret(req: NextRequest): string | null {
  const h = req.headers.get("authorization");
  if (h === null || !/^Bearer(\s|$)/i.test(h)) return null;
  const m = /^Bearer[ ]+(\S+)[ ]*$/i.exec(h);
  if (!m) throw new AppError("unauthenticated", "Send a personal API token as \"Authorization: Bearer <token>\".");
  return m[1]!;
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
    let caller: TokenCaller | null = null;
    let answer: Response;
    try {
      const bearer = spec.access.kind === "public" ? null : bearerSecret(req);
      // a cookie-less token request is no browser's: it cannot be a forged cross-site request
      if (!(bearer && !req.headers.has("cookie"))) checkSameOrigin(req);
      const rawParams = normaliseParams((await ctx?.params) ?? {});
      let user: Ctx<unknown, unknown, unknown>["user"] = null;
      let studio: Ctx<unknown, unknown, unknown>["studio"] = null;
      const studioId = spec.access.kind === "studio" && typeof rawParams.studioId === "string" && UUID_SHAPE.test(rawParams.studioId) ? rawParams.studioId : null;
      let role: string | null = null;
      if (bearer) {
        caller = await tokenCaller(bearer);
        if (spec.access.kind === "user" && !spec.tokens) throw new AppError("forbidden", "A personal API token works only on its own studio's addresses; sign in to use this one.");
        user = caller.user;
        // a token acts only in its own studio: any other is one its holder is not a member of
        role = studioId === caller.token.studioId ? caller.role : null;
      } else if (spec.access.kind !== "public") {
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
      const out = await (handler as (c: Ctx<unknown, unknown, unknown>) => Promise<Response | object | null>)({ req, params, query, body, user, studio, token: caller ? { ...caller.token, role: caller.role } : null });
      // a signed-in person's answers are theirs alone: no shared cache keeps them, no cache at all by default
      const signedIn = spec.access.kind !== "public";
      if (out instanceof Response) {
        if (signedIn && !out.headers.has("cache-control")) out.headers.set("cache-control", "private, no-store");
        answer = out;
      } else {
        const headers = signedIn ? { "cache-control": "private, no-store" } : undefined;
        answer = out === null ? new NextResponse(null, { status: 204, headers }) : NextResponse.json(out, { status: req.method === "POST" && spec.creates !== false ? 201 : 200, headers });
      }
    } catch (e) {
      const { status, body } = toErrorBody(e);
      answer = NextResponse.json(body, { status, headers: { "cache-control": "no-store" } });
    }
    if (caller) {
      // the answer stands whatever happens here: a failed record is logged, never turned into an error
      await recordTokenUse(caller, { method: req.method, path: req.nextUrl.pathname, status: answer.status }).catch((e) => console.error("[route] recording a token's use failed:", e));
    }
    return answer;
  };
  const meta: RouteMeta = { access: spec.access, ...(spec.tokens ? { tokens: true } : {}), schemas: { params: spec.params, query: spec.query, body: spec.body } };
  return Object.assign(wrapped, { meta });
}
