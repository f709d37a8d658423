// The caught-mail page (/mail) shows each person only their own mail: a signed-out visitor must never read a
// reset link of someone else (asking for a reset of any address, then reading the link, would take the account).
// What the page shows is decided by lib/server/mail-catcher.ts (caughtMailFor); the browser test
// (tests/e2e/platform.test.ts) checks the page itself.
import { afterAll, describe, expect, it } from "vitest";
import { POST as signup } from "@/app/api/auth/signup/route";
import { POST as resetRequest } from "@/app/api/auth/password-reset/route";
import * as invitations from "@/app/api/studios/[studioId]/invitations/route";
import { caughtMailFor, MAIL_KEY_COOKIE, mailPageEnabled, mailVisibleTo, type CaughtMail } from "@/lib/server/mail-catcher";
import { closeDb } from "@/lib/server/db";
import { settled } from "@/lib/server/later";
import { call, makeStudioWithRoles, makeUser, uniq } from "../helpers";
import { mailTo } from "../mail";

afterAll(async () => {
  await settled();
  await closeDb();
});

/** Signs up in a "browser" (the cookie the answer sets); returns the browser's mail key. */
async function signUpInBrowser(email: string, key?: string): Promise<string> {
  const r = await call(signup, { body: { name: "Browser Person", email, password: "a-long-password" }, headers: key ? { cookie: `${MAIL_KEY_COOKIE}=${key}` } : {} });
  expect(r.status).toBe(201);
  const set = r.res.headers.getSetCookie().find((c) => c.startsWith(`${MAIL_KEY_COOKIE}=`));
  expect(set).toMatch(/HttpOnly/i);
  expect(set).toMatch(/SameSite=lax/i);
  return set!.slice(MAIL_KEY_COOKIE.length + 1).split(";")[0]!;
}

const subjects = (ms: CaughtMail[]) => ms.map((m) => `${m.recipients.join(",")}: ${m.subject}`);

describe("who sees which caught mail", () => {
  it("a signed-out visitor sees nothing at all without a key, whatever was asked for", async () => {
    const victim = await makeUser();
    await call(resetRequest, { body: { email: victim.email } });
    await mailTo(victim.email, /Reset your Kitwright password/);
    expect(await caughtMailFor({ user: null, browserKey: null })).toEqual([]);
    expect(await caughtMailFor({ user: null, browserKey: "not-a-key" })).toEqual([]);
  });

  it("signed out, a browser sees the verification mail of the account it created, and never a reset link it asked for someone else", async () => {
    const victim = await makeUser();
    const email = `${uniq("mine")}@example.test`;
    const key = await signUpInBrowser(email);
    // the same browser asks for the victim's reset link, and signs up with the victim's address too
    await call(resetRequest, { body: { email: victim.email }, headers: { cookie: `${MAIL_KEY_COOKIE}=${key}` } });
    expect(await signUpInBrowser(victim.email, key)).toBe(key);
    await mailTo(victim.email, /Reset your Kitwright password/);
    await mailTo(victim.email, /already has a Kitwright account/);
    await mailTo(email, /Confirm your e-mail/);
    const seen = await caughtMailFor({ user: null, browserKey: key });
    expect(subjects(seen)).toEqual([`${email}: Confirm your e-mail address for Kitwright`]);
    // another browser sees none of it
    const other = await signUpInBrowser(`${uniq("other")}@example.test`);
    expect(subjects(await caughtMailFor({ user: null, browserKey: other })).some((s) => s.startsWith(email))).toBe(false);
  });

  it("signed in, a person sees the mail to their own address only", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const me = await makeUser();
    await call(resetRequest, { body: { email: me.email } });
    await call(invitations.POST, { user: users.owner, params: { studioId: studio.id }, body: { email: users.outsider.email, role: "viewer" } });
    await mailTo(me.email, /Reset/);
    await mailTo(users.outsider.email, /invited you/);
    const mine = await caughtMailFor({ user: me, browserKey: null });
    expect(subjects(mine)).toEqual([`${me.email}: Reset your Kitwright password`]);
    // the inviter does not read the invitation sent to someone else
    expect(subjects(await caughtMailFor({ user: users.owner, browserKey: null })).some((s) => s.includes(users.outsider.email))).toBe(false);
  });

  it("only the account named in KW_MAIL_PAGE_ALL_TO (the demo's owner) sees every message", () => {
    const m = { id: "1", to: "a@example.test", subject: "s", date: "", text: "", recipients: ["a@example.test"], browserTag: null };
    expect(mailVisibleTo(m, { user: { email: "owner@example.test" }, browserKey: null }, "owner@example.test")).toBe(true);
    expect(mailVisibleTo(m, { user: { email: "owner@example.test" }, browserKey: null }, undefined)).toBe(false);
    expect(mailVisibleTo(m, { user: { email: "someone@example.test" }, browserKey: null }, "owner@example.test")).toBe(false);
    expect(mailVisibleTo(m, { user: null, browserKey: null }, "owner@example.test")).toBe(false);
  });
});

describe("where the page exists", () => {
  it("only with the SMTP fake configured; in a production build only with the local profiles' opt-in", () => {
    const dir = "/tmp/mail";
    expect(mailPageEnabled({ KW_MAIL_FAKE_DIR: undefined, NODE_ENV: "development", KW_MAIL_PAGE: "1" })).toBe(false);
    expect(mailPageEnabled({ KW_MAIL_FAKE_DIR: dir, NODE_ENV: "production", KW_MAIL_PAGE: "0" })).toBe(false);
    expect(mailPageEnabled({ KW_MAIL_FAKE_DIR: dir, NODE_ENV: "production", KW_MAIL_PAGE: "1" })).toBe(true);
    expect(mailPageEnabled({ KW_MAIL_FAKE_DIR: dir, NODE_ENV: "development", KW_MAIL_PAGE: "0" })).toBe(true);
    expect(mailPageEnabled({ KW_MAIL_FAKE_DIR: dir, NODE_ENV: "test", KW_MAIL_PAGE: "0" })).toBe(true);
  });
});
