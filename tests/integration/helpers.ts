// Helpers for integration tests: factories (shared with the demo seed), sessions, and calling route
// handlers in-process with a real NextRequest (the same code path as over HTTP, without a server).
import crypto from "node:crypto";
import { NextRequest } from "next/server";
import { encode } from "next-auth/jwt";
// next-auth does not export its core handler; the route handler (app/api/auth/[...nextauth]) wraps this very one
import { AuthHandler } from "@/node_modules/next-auth/core/index.js";
import { db } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { authOptions } from "@/lib/server/auth/options";
import { startSession } from "@/lib/server/auth/sessions";
import { addMember, createStudio, createUser, type Role } from "@/db/factories";
import { CREATOR_ROLE, ROLES } from "@/lib/permissions";
import type { WrappedHandler } from "@/lib/server/route";

export const uniq = (p = "t") => `${p}-${crypto.randomBytes(5).toString("hex")}`;

export type TestUser = { id: string; email: string; name: string; password: string };

export async function makeUser(opts: { verified?: boolean; name?: string } = {}): Promise<TestUser> {
  const tag = uniq("u");
  return createUser(db(), { email: `${tag}@example.test`, name: opts.name ?? `User ${tag}`, password: "correct-horse-9", verified: opts.verified });
}

/** A studio with one member in each role of lib/permissions.ts (owner, editor, viewer), plus an outsider who owns another studio. */
export async function makeStudioWithRoles() {
  const [outsider, ...people] = await Promise.all([makeUser({ name: "Outsider" }), ...ROLES.map((r) => makeUser({ name: r.charAt(0).toUpperCase() + r.slice(1) }))]);
  const byRole = Object.fromEntries(ROLES.map((r, i) => [r, people[i]!])) as Record<Role, TestUser>;
  const studio = await createStudio(db(), { name: uniq("Studio"), ownerId: byRole[CREATOR_ROLE].id });
  for (const role of ROLES) if (role !== CREATOR_ROLE) await addMember(db(), { studioId: studio.id, userId: byRole[role].id, role });
  const otherStudio = await createStudio(db(), { name: uniq("Other"), ownerId: outsider.id });
  return { studio, otherStudio, users: { ...byRole, outsider } as Record<Role | "outsider", TestUser> };
}

export async function addToStudio(studioId: string, user: TestUser, role: Role) {
  await addMember(db(), { studioId, userId: user.id, role });
}

/** A session cookie for the user, with its own session row, as signing in makes it (lib/server/auth/options.ts). */
export async function sessionCookie(user: { id: string } | null): Promise<string | undefined> {
  if (!user) return undefined;
  const sid = await startSession(user.id);
  const token = await encode({ token: { uid: user.id, sid, sub: user.id }, secret: env().NEXTAUTH_SECRET });
  return `next-auth.session-token=${token}`;
}

/**
 * Calls next-auth itself (its core handler with our options: credentials, callbacks, events), as
 * app/api/auth/[...nextauth] does for a browser. Returns the status, the body, the cookies it sets and the
 * redirect; `cookies` are the ones the browser would send.
 */
export async function nextAuth(action: "csrf" | "callback" | "signout" | "session", o: { providerId?: string; method?: string; body?: Record<string, string>; cookies?: Record<string, string>; headers?: Record<string, string> } = {}) {
  const base = new URL(env().KW_APP_URL);
  const r = await AuthHandler({
    req: { origin: base.origin, method: o.method ?? (o.body ? "POST" : "GET"), action, providerId: o.providerId, body: o.body, query: {}, cookies: o.cookies ?? {}, headers: { host: base.host, ...(o.headers ?? {}) } },
    options: authOptions(),
  });
  const set = Object.fromEntries((r.cookies ?? []).map((c) => [c.name, c.value]));
  return { status: r.status ?? 200, body: r.body as any, redirect: r.redirect, cookies: set };
}

/**
 * Signs in through next-auth's credentials callback, the way the sign-in form does. Resolves to the session
 * cookie (`name=value`) or `{ error }` with the message shown to the person.
 */
export async function signInThroughNextAuth(email: string, password: string, headers: Record<string, string> = {}): Promise<{ cookie: string; error?: undefined } | { cookie?: undefined; error: string }> {
  const csrf = await nextAuth("csrf");
  const jar = { ...csrf.cookies };
  const r = await nextAuth("callback", { providerId: "credentials", body: { csrfToken: csrf.body.csrfToken, email, password, json: "true" }, cookies: jar, headers });
  const token = r.cookies["next-auth.session-token"];
  if (token) return { cookie: `next-auth.session-token=${token}` };
  const err = new URL(r.redirect ?? "/", env().KW_APP_URL).searchParams.get("error");
  return { error: err ?? `no session (status ${r.status})` };
}

/** Signs out through next-auth, as the header's button does, with the given session cookie. */
export async function signOutThroughNextAuth(cookie: string): Promise<void> {
  const csrf = await nextAuth("csrf");
  const [name, value] = [cookie.slice(0, cookie.indexOf("=")), cookie.slice(cookie.indexOf("=") + 1)];
  await nextAuth("signout", { body: { csrfToken: csrf.body.csrfToken }, cookies: { ...csrf.cookies, [name]: value } });
}

export interface CallOptions {
  method?: string;
  path?: string; // for the URL (query string included); defaults to /api/test
  params?: Record<string, string | string[]>;
  body?: unknown; // JSON-encoded unless a string/Uint8Array is given
  rawBody?: string | Uint8Array;
  headers?: Record<string, string>;
  user?: { id: string } | null;
  /** A session cookie to send as it is (instead of a new session for `user`). */
  cookie?: string;
  crossOrigin?: boolean;
}

/** Calls a wrapped route handler in-process. Same-origin by default, like the browser app. */
export async function call(handler: WrappedHandler | ((req: NextRequest, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>), o: CallOptions = {}): Promise<{ status: number; json: any; res: Response }> {
  const base = env().KW_APP_URL;
  const method = o.method ?? (o.body === undefined && o.rawBody === undefined ? "GET" : "POST");
  const headers: Record<string, string> = { host: new URL(base).host, ...(o.headers ?? {}) };
  if (method !== "GET" && method !== "HEAD") headers.origin = o.crossOrigin ? "https://evil.example" : new URL(base).origin;
  const cookie = o.cookie ?? (await sessionCookie(o.user ?? null));
  if (cookie) headers.cookie = cookie;
  let body: BodyInit | undefined;
  if (o.rawBody !== undefined) body = o.rawBody as BodyInit;
  else if (o.body !== undefined) {
    body = JSON.stringify(o.body);
    headers["content-type"] ??= "application/json";
  }
  const req = new NextRequest(new URL(o.path ?? "/api/test", base), { method, headers, body });
  const res = await handler(req, { params: Promise.resolve(o.params ?? {}) });
  const text = await res.text();
  let json: unknown = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = text;
  }
  return { status: res.status, json, res };
}
