// The role matrix: every API route x {anonymous, viewer, editor, owner, member of another studio}, and the same
// again with a personal API token of each role (no cookie) and a token of another studio.
// Routes are found on disk (app/api/**/route.ts) and each exported handler must carry the access rule
// that route() attaches; a route without one fails this suite. Expected statuses come from the rule and
// the permissions table (lib/permissions.ts), not from a hand-written list.
import fs from "node:fs";
import path from "node:path";
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/server/db";
import { can, ROLES, type Role } from "@/lib/permissions";
import type { RouteMeta } from "@/lib/server/route";
import { createApiToken } from "@/lib/server/auth/api-tokens";
import { call, makeStudioWithRoles, type TestUser } from "../helpers";

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
const API = path.resolve("app/api");

function routeFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? routeFiles(p) : e.name === "route.ts" ? [p] : [];
  });
}

type Handler = ((...a: never[]) => Promise<Response>) & { meta?: RouteMeta & { external?: boolean } };
interface Entry { file: string; url: string; method: (typeof METHODS)[number]; handler: Handler; segments: string[] }

const files = routeFiles(API);
let entries: Entry[] = [];
let world: Awaited<ReturnType<typeof makeStudioWithRoles>>;
/** A token of each role in the studio (made by the member of that role), and the outsider's in their own studio. */
let tokens: Record<Role | "outsider", string>;

beforeAll(async () => {
  for (const file of files) {
    const mod = (await import(/* @vite-ignore */ file)) as Record<string, unknown>;
    const rel = path.relative(API, path.dirname(file)).split(path.sep);
    for (const method of METHODS) {
      const h = mod[method] as Handler | undefined;
      if (h) entries.push({ file: path.relative(process.cwd(), file), url: `/api/${rel.join("/")}`, method, handler: h, segments: rel });
    }
  }
  world = await makeStudioWithRoles();
  const made = await Promise.all(ROLES.map((r) => createApiToken({ userId: world.users[r].id, input: { name: `matrix ${r}`, studioId: world.studio.id, role: r, expiresInDays: 1 } })));
  const outsider = await createApiToken({ userId: world.users.outsider.id, input: { name: "matrix outsider", studioId: world.otherStudio.id, role: "owner", expiresInDays: 1 } });
  tokens = { ...Object.fromEntries(ROLES.map((r, i) => [r, made[i]!.secret])), outsider: outsider.secret } as Record<Role | "outsider", string>;
}, 120_000);
afterAll(() => closeDb());

function paramsFor(e: Entry, studioId: string): Record<string, string | string[]> {
  const out: Record<string, string | string[]> = {};
  for (const s of e.segments) {
    const catchAll = s.match(/^\[\.\.\.(\w+)\]$/);
    const one = s.match(/^\[(\w+)\]$/);
    if (catchAll) out[catchAll[1]] = ["session"];
    else if (one) out[one[1]] = one[1] === "studioId" ? studioId : crypto.randomUUID();
  }
  return out;
}

describe("role matrix", () => {
  it("finds the API routes", () => {
    expect(files.length).toBeGreaterThanOrEqual(14);
    expect(entries.length).toBeGreaterThanOrEqual(18);
  });

  it("every exported handler carries an access rule (made by route())", () => {
    const missing = entries.filter((e) => !e.handler.meta?.access).map((e) => `${e.method} ${e.url}`);
    expect(missing).toEqual([]);
  });

  it("every handler answers each caller as its rule says", async () => {
    const failures: string[] = [];
    const callers: { who: string; user: TestUser | null; role: Role | null; outsider?: boolean }[] = [
      { who: "anonymous", user: null, role: null },
      ...ROLES.map((r) => ({ who: r, user: world.users[r], role: r })),
      { who: "other studio", user: world.users.outsider, role: null, outsider: true },
    ];
    for (const e of entries) {
      const access = e.handler.meta!.access;
      if (e.handler.meta!.external) continue; // next-auth's own endpoints
      for (const c of callers) {
        const body = e.method === "GET" || e.method === "DELETE" ? undefined : {};
        const r = await call(e.handler as never, { method: e.method, path: e.url, params: paramsFor(e, world.studio.id), body, user: c.user });
        const s = r.status;
        let ok: boolean;
        let want: string;
        if (access.kind === "public") {
          ok = s !== 401 && s !== 403 && s < 500;
          want = "not 401/403/5xx";
        } else if (!c.user) {
          ok = s === 401;
          want = "401";
        } else if (access.kind === "user") {
          ok = s !== 401 && s !== 403 && s < 500;
          want = "not 401/403/5xx";
        } else if (c.outsider) {
          ok = s === 404;
          want = "404";
        } else if (!can(c.role, access.permission)) {
          ok = s === 403;
          want = "403";
        } else {
          ok = ![401, 403].includes(s) && s < 500;
          want = "allowed (not 401/403/5xx)";
        }
        if (!ok) failures.push(`${e.method} ${e.url} as ${c.who}: got ${s}, want ${want} (${JSON.stringify(r.json).slice(0, 160)})`);
      }
    }
    expect(failures).toEqual([]);
  }, 300_000);

  it("every handler answers a personal API token (no cookie) as its rule says for the token's role", async () => {
    const failures: string[] = [];
    const callers: { who: string; secret: string; role: Role | null; outsider?: boolean }[] = [
      ...ROLES.map((r) => ({ who: `${r}'s token`, secret: tokens[r], role: r })),
      { who: "another studio's token", secret: tokens.outsider, role: null, outsider: true },
    ];
    for (const e of entries) {
      const meta = e.handler.meta!;
      // public routes ignore a token; next-auth's own endpoints are not ours
      if (meta.external || meta.access.kind === "public") continue;
      const access = meta.access;
      for (const c of callers) {
        const body = e.method === "GET" || e.method === "DELETE" ? undefined : {};
        const r = await call(e.handler as never, { method: e.method, path: e.url, params: paramsFor(e, world.studio.id), body, user: null, headers: { authorization: `Bearer ${c.secret}` } });
        const s = r.status;
        let ok: boolean;
        let want: string;
        if (access.kind === "user") {
          // the account's own routes are for sessions; only a route that says so takes a token
          ok = meta.tokens ? ![401, 403].includes(s) && s < 500 : s === 403;
          want = meta.tokens ? "allowed (not 401/403/5xx)" : "403";
        } else if (c.outsider) {
          ok = s === 404;
          want = "404";
        } else if (!can(c.role, access.permission)) {
          ok = s === 403;
          want = "403";
        } else {
          ok = ![401, 403].includes(s) && s < 500;
          want = "allowed (not 401/403/5xx)";
        }
        if (!ok) failures.push(`${e.method} ${e.url} with ${c.who}: got ${s}, want ${want} (${JSON.stringify(r.json).slice(0, 160)})`);
      }
    }
    expect(failures).toEqual([]);
  }, 300_000);

  it("state-changing requests from another origin are refused (403) before anything else", async () => {
    const writes = entries.filter((e) => e.method !== "GET" && !e.handler.meta!.external);
    expect(writes.length).toBeGreaterThan(5);
    for (const e of writes) {
      const r = await call(e.handler as never, { method: e.method, path: e.url, params: paramsFor(e, world.studio.id), body: {}, user: world.users.owner, crossOrigin: true });
      expect([e.url, r.status, r.json?.error?.message]).toEqual([e.url, 403, "Requests from another site are refused."]);
    }
  }, 120_000);
});
