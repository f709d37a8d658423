// Sessions end when they should: signing out ends this device's session (a copied cookie stops working, the
// person's other devices stay signed in); a password reset ends every session of the account; so does removal
// from a studio. After a successful reset, no older reset link of the account works. (Common practice, OWASP
// Session Management Cheat Sheet: "invalidate the session on logout" and after a password change.)
import { afterAll, describe, expect, it } from "vitest";
import { GET as me } from "@/app/api/me/route";
import { POST as resetRequest } from "@/app/api/auth/password-reset/route";
import { POST as resetConfirm } from "@/app/api/auth/password-reset/confirm/route";
import * as member from "@/app/api/studios/[studioId]/members/[userId]/route";
import * as studioOne from "@/app/api/studios/[studioId]/route";
import { db, closeDb } from "@/lib/server/db";
import { purgeSessions } from "@/lib/server/auth/sessions";
import { call, makeStudioWithRoles, makeUser, signInThroughNextAuth, signOutThroughNextAuth } from "../helpers";
import { mailTo, tokenFrom } from "../mail";

afterAll(() => closeDb());

async function signedIn(email: string, password: string): Promise<string> {
  const r = await signInThroughNextAuth(email, password);
  if (!r.cookie) throw new Error(`sign-in failed: ${r.error}`);
  return r.cookie;
}

describe("sessions", () => {
  it("signing out ends this device's session: the copied cookie answers 401; another device stays signed in", async () => {
    const u = await makeUser();
    const laptop = await signedIn(u.email, u.password);
    const phone = await signedIn(u.email, u.password);
    expect((await call(me, { cookie: laptop })).json.user.id).toBe(u.id);
    expect((await call(me, { cookie: phone })).status).toBe(200);
    await signOutThroughNextAuth(laptop);
    const after = await call(me, { cookie: laptop });
    expect(after.status).toBe(401);
    expect(after.json.error.code).toBe("unauthenticated");
    expect((await call(me, { cookie: phone })).status).toBe(200);
  });

  it("a password reset ends every session of the account", async () => {
    const u = await makeUser();
    const a = await signedIn(u.email, u.password);
    const b = await signedIn(u.email, u.password);
    await call(resetRequest, { body: { email: u.email } });
    const token = tokenFrom((await mailTo(u.email, /Reset your Kitwright password/)).text, /\/reset\?token=/);
    expect((await call(resetConfirm, { body: { token, password: "a-fresh-password-1" } })).status).toBe(200);
    expect((await call(me, { cookie: a })).status).toBe(401);
    expect((await call(me, { cookie: b })).status).toBe(401);
    // the new password starts a new session
    const c = await signedIn(u.email, "a-fresh-password-1");
    expect((await call(me, { cookie: c })).status).toBe(200);
  });

  it("removal from a studio ends the removed member's sessions; the others' go on", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const viewer = await signedIn(users.viewer.email, users.viewer.password);
    const editor = await signedIn(users.editor.email, users.editor.password);
    expect((await call(studioOne.GET, { cookie: viewer, params: { studioId: studio.id } })).status).toBe(200);
    expect((await call(member.DELETE, { method: "DELETE", user: users.owner, params: { studioId: studio.id, userId: users.viewer.id } })).status).toBe(204);
    expect((await call(me, { cookie: viewer })).status).toBe(401);
    expect((await call(me, { cookie: editor })).status).toBe(200);
  });

  it("a cookie made before sessions could end (no session id) is not accepted", async () => {
    const u = await makeUser();
    const { encode } = await import("next-auth/jwt");
    const { env } = await import("@/lib/server/env");
    const old = `next-auth.session-token=${await encode({ token: { uid: u.id, sub: u.id }, secret: env().NEXTAUTH_SECRET })}`;
    expect((await call(me, { cookie: old })).status).toBe(401);
  });

  it("ended sessions are purged a day later, live ones kept", async () => {
    const u = await makeUser();
    const live = await signedIn(u.email, u.password);
    const gone = await signedIn(u.email, u.password);
    await signOutThroughNextAuth(gone);
    const rows = await db()("sessions").where({ user_id: u.id }).orderBy("created_at").select("id", "revoked_at");
    expect(rows.map((r: { revoked_at: Date | null }) => r.revoked_at === null)).toEqual([true, false]);
    await purgeSessions(new Date(Date.now() + 2 * 24 * 3600_000));
    expect(await db()("sessions").where({ user_id: u.id }).count({ n: "*" }).first()).toEqual({ n: 1 });
    expect((await call(me, { cookie: live })).status).toBe(200);
  });
});

describe("reset links", () => {
  it("a successful reset invalidates every older unused reset link of the account", async () => {
    const u = await makeUser();
    await call(resetRequest, { body: { email: u.email } });
    await call(resetRequest, { body: { email: u.email } });
    const links = await (async () => {
      for (let i = 0; i < 50; i++) {
        const { listCaughtMail } = await import("@/lib/server/mail-catcher");
        const all = (await listCaughtMail(500)).filter((m) => m.to.includes(u.email) && /Reset your Kitwright password/.test(m.subject));
        if (all.length >= 2) return all.map((m) => tokenFrom(m.text, /\/reset\?token=/));
        await new Promise((r) => setTimeout(r, 100));
      }
      throw new Error("two reset mails expected");
    })();
    expect(new Set(links).size).toBe(2);
    const [newest, older] = links as [string, string];
    expect((await call(resetConfirm, { body: { token: newest, password: "the-new-password-1" } })).status).toBe(200);
    const stale = await call(resetConfirm, { body: { token: older, password: "attacker-password-1" } });
    expect(stale.status).toBe(422);
    expect(stale.json.error.message).toMatch(/no longer valid|already been used/);
    const r = await signInThroughNextAuth(u.email, "the-new-password-1");
    expect(r.cookie).toBeTruthy();
  });
});
