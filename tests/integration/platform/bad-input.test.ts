// Bad input: malformed JSON, oversize bodies, unknown fields, wrong types -> a 4xx with a clear message.
import { afterAll, describe, expect, it } from "vitest";
import * as studios from "@/app/api/studios/route";
import * as invitations from "@/app/api/studios/[studioId]/invitations/route";
import * as member from "@/app/api/studios/[studioId]/members/[userId]/route";
import { GET as health } from "@/app/api/health/route";
import { closeDb, db } from "@/lib/server/db";
import { call, makeStudioWithRoles, makeUser } from "../helpers";

afterAll(() => closeDb());

describe("bad input", () => {
  it("malformed JSON -> 422 naming the problem", async () => {
    const me = await makeUser();
    const r = await call(studios.POST, { user: me, rawBody: "{ name: oops", headers: { "content-type": "application/json" } });
    expect(r.status).toBe(422);
    expect(r.json.error).toEqual({ code: "invalid-input", message: "The request body is not valid JSON." });
  });

  it("a body that is not JSON -> 422", async () => {
    const me = await makeUser();
    const r = await call(studios.POST, { user: me, rawBody: "name=x", headers: { "content-type": "application/x-www-form-urlencoded" } });
    expect(r.status).toBe(422);
    expect(r.json.error.message).toMatch(/Send the body as JSON/);
  });

  it("oversize body -> 413", async () => {
    const me = await makeUser();
    const r = await call(studios.POST, { user: me, body: { name: "x".repeat(300 * 1024) } });
    expect(r.status).toBe(413);
    expect(r.json.error.code).toBe("too-large");
  });

  it("unknown fields and wrong types -> 422 with the field named", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const params = { studioId: studio.id };
    const unknown = await call(invitations.POST, { user: users.owner, params, body: { email: "a@example.test", role: "viewer", admin: true } });
    expect(unknown.status).toBe(422);
    expect(unknown.json.error.message).toMatch(/admin/);
    const wrongType = await call(invitations.POST, { user: users.owner, params, body: { email: 42, role: "viewer" } });
    expect(wrongType.status).toBe(422);
    expect(wrongType.json.error.message).toMatch(/^body\.email:/);
    const badRole = await call(invitations.POST, { user: users.owner, params, body: { email: "a@example.test", role: "superuser" } });
    expect(badRole.status).toBe(422);
    expect(badRole.json.error.message).toMatch(/^body\.role:/);
    const badId = await call(member.PATCH, { method: "PATCH", user: users.owner, params: { ...params, userId: "not-a-uuid" }, body: { role: "viewer" } });
    expect(badId.status).toBe(422);
    expect(badId.json.error.message).toMatch(/params\.userId/);
  });

  it("a rejected write leaves nothing behind", async () => {
    const me = await makeUser();
    const before = await db()("studios").where({ created_by: me.id }).count({ n: "*" });
    await call(studios.POST, { user: me, body: { name: "" } });
    await call(studios.POST, { user: me, body: { name: "ok", extra: 1 } });
    const after = await db()("studios").where({ created_by: me.id }).count({ n: "*" });
    expect(after[0].n).toBe(before[0].n);
  });

  it("health reports the database, Redis and storage", async () => {
    const r = await call(health);
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ ok: true, database: { ok: true }, redis: { ok: true }, storage: { ok: true, kind: "local" } });
  });
});
