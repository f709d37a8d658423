// Personal API tokens through the real route handlers: made, listed with their last use, used with
// `Authorization: Bearer`, scoped to one studio, capped by the creator's role (then and now), revoked (401),
// and every use in the studio's activity log. The secret's digest is checked against node:crypto's SHA-256
// (FIPS 180-4), computed here independently of lib/server/ids.ts.
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, closeDb } from "@/lib/server/db";
import { closeQueues } from "@/lib/server/jobs";
import { jsonColumn } from "@/lib/server/json-column";
import { changeRole, removeMember } from "@/lib/server/studios";
import { addToStudio, call, makeStudioWithRoles, makeUser, uniq, type CallOptions } from "../helpers";
import { hitWav, multipart } from "../catalogue/helpers";
import * as tokensRoute from "@/app/api/me/tokens/route";
import * as tokenRoute from "@/app/api/me/tokens/[tokenId]/route";
import * as whoamiRoute from "@/app/api/whoami/route";
import * as meRoute from "@/app/api/me/route";
import * as libsRoute from "@/app/api/studios/[studioId]/libraries/route";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";
import * as byHashRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/by-hash/route";
import * as activityRoute from "@/app/api/studios/[studioId]/activity/route";

let w: Awaited<ReturnType<typeof makeStudioWithRoles>>;

beforeAll(async () => {
  w = await makeStudioWithRoles();
});
afterAll(async () => {
  await closeQueues();
  await closeDb();
});

const sha256 = (s: string | Uint8Array) => crypto.createHash("sha256").update(s).digest("hex");

async function makeToken(user: { id: string }, body: Record<string, unknown>) {
  return call(tokensRoute.POST, { method: "POST", body: { name: uniq("token"), studioId: w.studio.id, ...body }, user });
}

/** A request with the token and no cookie at all (as the command line sends it). */
function withToken(secret: string, o: CallOptions = {}): CallOptions {
  return { ...o, user: null, headers: { ...(o.headers ?? {}), authorization: `Bearer ${secret}` } };
}

async function usesOf(tokenId: string) {
  return db()("activity").where({ action: "token.used", subject_id: tokenId }).orderBy("id").select("studio_id", "actor_id", "details");
}

describe("personal API tokens", () => {
  it("are made for a studio with a role, the secret answered once and stored only as its SHA-256", async () => {
    const r = await makeToken(w.users.editor, { role: "editor", name: "build script" });
    expect(r.status).toBe(201);
    const { secret, token } = r.json as { secret: string; token: Record<string, unknown> };
    expect(secret).toMatch(/^kwt_[A-Za-z0-9_-]{43}$/); // 32 random bytes in base64url (RFC 4648 section 5): 43 characters
    expect(token).toMatchObject({ name: "build script", studioId: w.studio.id, studioName: w.studio.name, role: "editor", effectiveRole: "editor", hint: secret.slice(0, 8), lastUsedAt: null, revokedAt: null });
    // 90 days by default
    expect(new Date(token.expiresAt as string).getTime() - Date.now()).toBeGreaterThan(89.9 * 86400_000);
    const row = await db()("api_tokens").where({ id: token.id }).first();
    expect(row.token_hash).toBe(sha256(secret));
    expect(JSON.stringify(row)).not.toContain(secret.slice(8));
    // the list never holds the secret
    const list = await call(tokensRoute.GET, { user: w.users.editor });
    expect(list.status).toBe(200);
    expect(list.json.tokens.map((t: { id: string }) => t.id)).toContain(token.id);
    expect(JSON.stringify(list.json)).not.toContain(secret.slice(8));
    const made = await db()("activity").where({ action: "token.created", subject_id: token.id }).first();
    expect(made).toMatchObject({ studio_id: w.studio.id, actor_id: w.users.editor.id });
  });

  it("can hold at most the creator's role, and only in a studio they belong to", async () => {
    expect((await makeToken(w.users.editor, { role: "owner" })).status).toBe(403);
    const viewerAsks = await makeToken(w.users.viewer, { role: "editor" });
    expect(viewerAsks.status).toBe(403);
    expect(viewerAsks.json.error.message).toMatch(/You are a viewer in this studio: a token can hold at most that role/);
    expect((await makeToken(w.users.viewer, { role: "viewer" })).status).toBe(201);
    expect((await makeToken(w.users.owner, { role: "owner" })).status).toBe(201);
    expect((await makeToken(w.users.outsider, { role: "viewer" })).status).toBe(404);
    expect((await makeToken(w.users.editor, { role: "editor", name: " " })).status).toBe(422);
    expect(await db()("api_tokens").where({ user_id: w.users.outsider.id }).count({ n: "*" }).first()).toEqual({ n: 0 });
  });

  it("authenticate requests, update the last use and write every use to the studio's activity log", async () => {
    const { secret, token } = (await makeToken(w.users.editor, { role: "editor" })).json;
    const list = await call(libsRoute.GET, withToken(secret, { params: { studioId: w.studio.id } }));
    expect(list.status).toBe(200);
    const name = uniq("Lib");
    const made = await call(libsRoute.POST, withToken(secret, { method: "POST", params: { studioId: w.studio.id }, body: { name } }));
    expect(made.status).toBe(201);
    const lib = await db()("libraries").where({ id: made.json.id }).first();
    expect(lib).toMatchObject({ studio_id: w.studio.id, name });
    const created = await db()("activity").where({ action: "library.created", subject_id: made.json.id }).first();
    expect(created.actor_id).toBe(w.users.editor.id); // the token acts for its creator
    const uses = await usesOf(token.id);
    expect(uses.map((u) => [u.studio_id, u.actor_id, jsonColumn<Record<string, any>>(u.details).method, jsonColumn<Record<string, any>>(u.details).status])).toEqual([
      [w.studio.id, w.users.editor.id, "GET", 200],
      [w.studio.id, w.users.editor.id, "POST", 201],
    ]);
    expect(jsonColumn<Record<string, any>>(uses[1].details).path).toBe("/api/test");
    const mine = (await call(tokensRoute.GET, { user: w.users.editor })).json.tokens.find((t: { id: string }) => t.id === token.id);
    expect(Date.now() - new Date(mine.lastUsedAt).getTime()).toBeLessThan(60_000);
    // the owner reads the uses in the log
    const log = await call(activityRoute.GET, { params: { studioId: w.studio.id }, user: w.users.owner });
    expect(log.json.entries.filter((e: { action: string; subjectId: string }) => e.action === "token.used" && e.subjectId === token.id)).toHaveLength(2);
  });

  it("uploads and the hash lookup work with a token; refused uses are logged too", async () => {
    const editorToken = (await makeToken(w.users.editor, { role: "editor" })).json;
    const viewerToken = (await makeToken(w.users.editor, { role: "viewer" })).json;
    const lib = await call(libsRoute.POST, withToken(editorToken.secret, { method: "POST", params: { studioId: w.studio.id }, body: { name: uniq("Up") } }));
    const libraryId = lib.json.id as string;
    const a = hitWav(9101);
    const b = hitWav(9102);
    const { body, type } = await multipart([{ name: "Kick/a.wav", data: a }]);
    const up = await call(uploadRoute.POST, withToken(editorToken.secret, { method: "POST", params: { studioId: w.studio.id, libraryId }, rawBody: body, headers: { "content-type": type } }));
    expect(up.status).toBe(201);
    expect(up.json.counts).toEqual({ queued: 1, duplicate: 0, refused: 0 });
    // a viewer's token may read but not upload
    const refused = await call(uploadRoute.POST, withToken(viewerToken.secret, { method: "POST", params: { studioId: w.studio.id, libraryId }, rawBody: body, headers: { "content-type": type } }));
    expect(refused.status).toBe(403);
    const look = await call(byHashRoute.POST, withToken(viewerToken.secret, { method: "POST", params: { studioId: w.studio.id, libraryId }, body: { sha256: [sha256(a).toUpperCase(), sha256(b)] } }));
    expect(look.status).toBe(200);
    expect(look.json.known).toEqual([{ sha256: sha256(a), sampleId: up.json.files[0].sampleId, path: "Kick/a.wav" }]);
    const bad = await call(byHashRoute.POST, withToken(viewerToken.secret, { method: "POST", params: { studioId: w.studio.id, libraryId }, body: { sha256: ["abc"] } }));
    expect(bad.status).toBe(422);
    expect((await usesOf(viewerToken.token.id)).map((u) => jsonColumn<Record<string, any>>(u.details).status)).toEqual([403, 200, 422]);
  });

  it("act only in their own studio, even where the creator is an owner", async () => {
    const both = await makeUser();
    await addToStudio(w.studio.id, both, "editor");
    await addToStudio(w.otherStudio.id, both, "owner");
    const { secret, token } = (await makeToken(both, { role: "editor" })).json;
    const other = await call(libsRoute.GET, withToken(secret, { params: { studioId: w.otherStudio.id } }));
    expect(other.status).toBe(404);
    expect((await call(libsRoute.GET, withToken(secret, { params: { studioId: w.studio.id } }))).status).toBe(200);
    // the use is logged in the token's studio only, never in the other
    expect((await usesOf(token.id)).map((u) => [u.studio_id, jsonColumn<Record<string, any>>(u.details).status])).toEqual([
      [w.studio.id, 404],
      [w.studio.id, 200],
    ]);
    // the account's own routes are for sessions only
    expect((await call(meRoute.GET, withToken(secret))).status).toBe(403);
    expect((await call(tokensRoute.GET, withToken(secret))).status).toBe(403);
    expect((await call(tokensRoute.POST, withToken(secret, { method: "POST", body: { name: "more", studioId: w.studio.id, role: "viewer" } }))).status).toBe(403);
    const who = await call(whoamiRoute.GET, withToken(secret));
    expect(who.json).toEqual({ user: { id: both.id, email: both.email, name: both.name }, via: "token", token: { id: token.id, name: token.name, studioId: w.studio.id, studioName: w.studio.name, role: "editor" } });
  });

  it("never exceed the creator's current role: a demotion or a removal applies at once", async () => {
    const p = await makeUser();
    await addToStudio(w.studio.id, p, "owner");
    const { secret } = (await makeToken(p, { role: "owner" })).json;
    const mk = () => call(libsRoute.POST, withToken(secret, { method: "POST", params: { studioId: w.studio.id }, body: { name: uniq("Cap") } }));
    expect((await mk()).status).toBe(201);
    await changeRole({ studioId: w.studio.id, actorId: w.users.owner.id, userId: p.id, role: "viewer" });
    expect((await mk()).status).toBe(403);
    expect((await call(whoamiRoute.GET, withToken(secret))).json.token.role).toBe("viewer");
    const listed = (await call(tokensRoute.GET, { user: p })).json.tokens[0];
    expect([listed.role, listed.effectiveRole]).toEqual(["owner", "viewer"]);
    await removeMember({ studioId: w.studio.id, actorId: w.users.owner.id, userId: p.id });
    expect((await call(libsRoute.GET, withToken(secret, { params: { studioId: w.studio.id } }))).status).toBe(404);
    expect((await call(whoamiRoute.GET, withToken(secret))).json.token.role).toBe(null);
  });

  it("answer 401 once revoked or expired, and for anything that is not a live token", async () => {
    const { secret, token } = (await makeToken(w.users.editor, { role: "viewer", name: "to revoke" })).json;
    const get = (s: string, headers?: Record<string, string>) => call(libsRoute.GET, { params: { studioId: w.studio.id }, user: null, headers: headers ?? { authorization: `Bearer ${s}` } });
    expect((await get(secret)).status).toBe(200);
    // somebody else cannot revoke it
    expect((await call(tokenRoute.DELETE, { method: "DELETE", params: { tokenId: token.id }, user: w.users.owner })).status).toBe(404);
    expect((await get(secret)).status).toBe(200);
    const del = await call(tokenRoute.DELETE, { method: "DELETE", params: { tokenId: token.id }, user: w.users.editor });
    expect(del.status).toBe(204);
    const after = await get(secret);
    expect(after.status).toBe(401);
    expect(after.json.error.message).toMatch(/^This API token \("to revoke"\) was revoked on \d{4}-\d\d-\d\d/);
    expect((await db()("activity").where({ action: "token.revoked", subject_id: token.id }).first()).actor_id).toBe(w.users.editor.id);
    const listed = (await call(tokensRoute.GET, { user: w.users.editor })).json.tokens.find((t: { id: string }) => t.id === token.id);
    expect(listed.revokedAt).not.toBeNull();
    // revoking twice changes nothing
    expect((await call(tokenRoute.DELETE, { method: "DELETE", params: { tokenId: token.id }, user: w.users.editor })).status).toBe(204);
    expect(await db()("activity").where({ action: "token.revoked", subject_id: token.id }).count({ n: "*" }).first()).toEqual({ n: 1 });

    const old = (await makeToken(w.users.editor, { role: "viewer", name: "old", expiresInDays: 7 })).json;
    await db()("api_tokens").where({ id: old.token.id }).update({ expires_at: new Date(Date.now() - 1000) });
    const expired = await get(old.secret);
    expect([expired.status, expired.json.error.message]).toEqual([401, expect.stringMatching(/^This API token \("old"\) expired on/)]);

    const forever = (await makeToken(w.users.editor, { role: "viewer", expiresInDays: null })).json;
    expect(forever.token.expiresAt).toBeNull();
    expect((await get(forever.secret)).status).toBe(200);

    expect((await get(`kwt_${"A".repeat(43)}`)).json.error).toEqual({ code: "unauthenticated", message: expect.stringMatching(/not known/) });
    expect((await get("not-a-token")).status).toBe(401);
    expect((await get("", { authorization: "Bearer" })).json.error.message).toBe('Send a personal API token as "Authorization: Bearer <token>".');
    // another scheme (a proxy's Basic login) is no token: without a session it is "sign in", with one it works
    const basic = `Basic ${Buffer.from("a:b").toString("base64")}`;
    expect((await get("", { authorization: basic })).json.error.message).toBe("Sign in first.");
    expect((await call(libsRoute.GET, { params: { studioId: w.studio.id }, user: w.users.viewer, headers: { authorization: basic } })).status).toBe(200);
  });

  it("skip the same-origin check only without a cookie", async () => {
    const { secret } = (await makeToken(w.users.editor, { role: "editor" })).json;
    const post = (o: Partial<CallOptions>) => call(libsRoute.POST, { method: "POST", params: { studioId: w.studio.id }, body: { name: uniq("Origin") }, crossOrigin: true, ...o });
    // a script's request: no cookie, an Origin of another site (or none) is no forgery
    expect((await post(withToken(secret))).status).toBe(201);
    // a browser's request carries cookies: the check applies as to any other
    const withCookie = await post({ user: w.users.editor, headers: { authorization: `Bearer ${secret}` } });
    expect([withCookie.status, withCookie.json.error.message]).toEqual([403, "Requests from another site are refused."]);
    // and a bad token is still refused without a cookie
    expect((await post(withToken(secret.slice(0, -1) + (secret.endsWith("A") ? "B" : "A")))).status).toBe(401);
  });
});
