// Studios, members, invitations, the last-owner rule, immediate loss of access, and the activity log.
import { afterAll, describe, expect, it } from "vitest";
import * as studios from "@/app/api/studios/route";
import * as studioOne from "@/app/api/studios/[studioId]/route";
import * as members from "@/app/api/studios/[studioId]/members/route";
import * as member from "@/app/api/studios/[studioId]/members/[userId]/route";
import * as invitations from "@/app/api/studios/[studioId]/invitations/route";
import * as invitation from "@/app/api/studios/[studioId]/invitations/[invitationId]/route";
import * as activity from "@/app/api/studios/[studioId]/activity/route";
import { POST as accept } from "@/app/api/invitations/accept/route";
import { POST as signup } from "@/app/api/auth/signup/route";
import { db, closeDb } from "@/lib/server/db";
import { call, makeStudioWithRoles, makeUser, uniq } from "../helpers";
import { mailTo, tokenFrom } from "../mail";

afterAll(() => closeDb());

describe("studios", () => {
  it("creating a studio makes me its owner and logs it", async () => {
    const me = await makeUser();
    const name = uniq("Tidewater Room");
    const r = await call(studios.POST, { user: me, body: { name } });
    expect(r.status).toBe(201);
    const list = await call(studios.GET, { user: me });
    expect(list.json.studios).toContainEqual({ id: r.json.id, name, role: "owner" });
    const log = await call(activity.GET, { user: me, params: { studioId: r.json.id } });
    expect(log.json.entries.map((e: { action: string }) => e.action)).toEqual(["studio.created"]);
  });

  it("owners rename; editors may not (403); outsiders learn nothing (404)", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const params = { studioId: studio.id };
    expect((await call(studioOne.PATCH, { method: "PATCH", user: users.editor, params, body: { name: "Nope" } })).status).toBe(403);
    expect((await call(studioOne.PATCH, { method: "PATCH", user: users.outsider, params, body: { name: "Nope" } })).status).toBe(404);
    expect((await call(studioOne.PATCH, { method: "PATCH", user: users.owner, params, body: { name: "Renamed Room" } })).status).toBe(200);
    expect((await call(studioOne.GET, { user: users.viewer, params })).json).toMatchObject({ name: "Renamed Room", role: "viewer" });
  });
});

describe("invitations", () => {
  it("an owner invites by e-mail; the invited person accepts with the right address and gets the role", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const invitee = await makeUser();
    const params = { studioId: studio.id };
    const sent = await call(invitations.POST, { user: users.owner, params, body: { email: invitee.email.toUpperCase(), role: "editor" } });
    expect(sent.status).toBe(201);
    const mail = await mailTo(invitee.email, /invited you to the studio/);
    expect(mail.text).toContain("as an editor");
    const token = tokenFrom(mail.text, /\/invite\//);

    const wrongPerson = await makeUser();
    const wrong = await call(accept, { user: wrongPerson, body: { token } });
    expect(wrong.status).toBe(403);
    expect(wrong.json.error.message).toContain(invitee.email);

    const ok = await call(accept, { user: invitee, body: { token } });
    expect(ok.status).toBe(201);
    expect(ok.json.studioId).toBe(studio.id);
    const list = await call(members.GET, { user: invitee, params });
    expect(list.json.members).toContainEqual(expect.objectContaining({ userId: invitee.id, role: "editor" }));
    expect((await call(accept, { user: invitee, body: { token } })).json.error.message).toMatch(/already been accepted/);
  });

  it("a new person signs up from the invitation: the address counts as confirmed and they join at once", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const email = `${uniq("newbie")}@example.test`;
    await call(invitations.POST, { user: users.owner, params: { studioId: studio.id }, body: { email, role: "viewer" } });
    const token = tokenFrom((await mailTo(email, /invited you/)).text, /\/invite\//);
    const r = await call(signup, { body: { name: "Newbie", email, password: "a-long-password", invite: token } });
    expect(r.json).toMatchObject({ verified: true, studioId: studio.id });
    const u = await db()("users").where({ email }).first();
    expect(u.email_verified_at).not.toBeNull();
    expect(await db()("memberships").where({ studio_id: studio.id, user_id: u.id }).first()).toMatchObject({ role: "viewer" });
  });

  it("withdrawn invitations cannot be accepted; members cannot be invited twice; nothing half-written", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const params = { studioId: studio.id };
    const email = `${uniq("later")}@example.test`;
    const inv = await call(invitations.POST, { user: users.owner, params, body: { email, role: "viewer" } });
    const token = tokenFrom((await mailTo(email, /invited you/)).text, /\/invite\//);
    expect((await call(invitation.DELETE, { method: "DELETE", user: users.owner, params: { ...params, invitationId: inv.json.id } })).status).toBe(204);
    const later = await makeUser();
    await db()("users").where({ id: later.id }).update({ email });
    expect((await call(accept, { user: { id: later.id }, body: { token } })).json.error.message).toMatch(/withdrawn/);

    const before = await db()("invitations").where({ studio_id: studio.id }).count({ n: "*" });
    const dup = await call(invitations.POST, { user: users.owner, params, body: { email: users.viewer.email, role: "editor" } });
    expect(dup.status).toBe(409);
    const after = await db()("invitations").where({ studio_id: studio.id }).count({ n: "*" });
    expect(after[0].n).toBe(before[0].n);
  });

  it("only owners see and send invitations", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const params = { studioId: studio.id };
    expect((await call(invitations.GET, { user: users.editor, params })).status).toBe(403);
    expect((await call(invitations.POST, { user: users.editor, params, body: { email: "x@example.test", role: "owner" } })).status).toBe(403);
    expect((await call(invitations.GET, { user: users.owner, params })).status).toBe(200);
  });
});

describe("members", () => {
  it("the last owner can be neither demoted nor removed; with a second owner both work", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const p = (userId: string) => ({ studioId: studio.id, userId });
    const demote = await call(member.PATCH, { method: "PATCH", user: users.owner, params: p(users.owner.id), body: { role: "editor" } });
    expect(demote.status).toBe(409);
    expect(demote.json.error.message).toMatch(/at least one owner/);
    expect((await call(member.DELETE, { method: "DELETE", user: users.owner, params: p(users.owner.id) })).status).toBe(409);
    expect((await call(member.PATCH, { method: "PATCH", user: users.owner, params: p(users.editor.id), body: { role: "owner" } })).status).toBe(200);
    expect((await call(member.PATCH, { method: "PATCH", user: users.owner, params: p(users.owner.id), body: { role: "viewer" } })).status).toBe(200);
  });

  it("a removed member loses access at once, even with a valid session", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const params = { studioId: studio.id };
    expect((await call(studioOne.GET, { user: users.viewer, params })).status).toBe(200);
    expect((await call(member.DELETE, { method: "DELETE", user: users.owner, params: { ...params, userId: users.viewer.id } })).status).toBe(204);
    expect((await call(studioOne.GET, { user: users.viewer, params })).status).toBe(404);
  });

  it("the activity log records who did what, newest first, for owners only", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const params = { studioId: studio.id };
    await call(member.PATCH, { method: "PATCH", user: users.owner, params: { ...params, userId: users.viewer.id }, body: { role: "editor" } });
    await call(studioOne.PATCH, { method: "PATCH", user: users.owner, params, body: { name: "Logged Room" } });
    const log = await call(activity.GET, { user: users.owner, params });
    expect(log.json.entries.slice(0, 2).map((e: { action: string; actorName: string; details: unknown }) => [e.action, e.actorName, e.details])).toEqual([
      ["studio.renamed", "Owner", { from: studio.name, to: "Logged Room" }],
      ["member.role-changed", "Owner", { from: "viewer", to: "editor" }],
    ]);
    expect((await call(activity.GET, { user: users.editor, params })).status).toBe(403);
  });
});
