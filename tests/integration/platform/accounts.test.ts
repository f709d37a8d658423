// Accounts: sign-up with e-mail verification, sign-in rules and rate limits, password reset.
import { afterAll, describe, expect, it } from "vitest";
import { POST as signup } from "@/app/api/auth/signup/route";
import { POST as verification } from "@/app/api/auth/verification/route";
import { POST as resetRequest } from "@/app/api/auth/password-reset/route";
import { POST as resetConfirm } from "@/app/api/auth/password-reset/confirm/route";
import { checkCredentials, RATE } from "@/lib/server/auth/accounts";
import { db, closeDb } from "@/lib/server/db";
import { call, makeUser, uniq } from "../helpers";
import { mailTo, tokenFrom } from "../mail";

afterAll(() => closeDb());

describe("sign-up and verification", () => {
  it("creates an unverified account, mails a single-use link, and only then allows sign-in", async () => {
    const email = `${uniq("new")}@example.test`;
    const r = await call(signup, { body: { name: "Nadia Test", email, password: "a-long-password" } });
    expect(r.status).toBe(201);
    expect(r.json.verified).toBe(false);
    const row = await db()("users").where({ email }).first();
    expect(row.email_verified_at).toBeNull();
    expect(row.password_hash).toMatch(/^\$2[aby]\$11\$/); // bcrypt, cost 11
    await expect(checkCredentials(email, "a-long-password", "10.9.0.1")).rejects.toThrow(/Confirm your e-mail/);

    const mail = await mailTo(email, /Confirm your e-mail/);
    const token = tokenFrom(mail.text, /\/verify\?token=/);
    expect((await call(verification, { body: { token } })).status).toBe(200);
    expect((await db()("users").where({ email }).first()).email_verified_at).not.toBeNull();
    const again = await call(verification, { body: { token } });
    expect(again.status).toBe(422);
    expect(again.json.error.message).toMatch(/already been used/);
    // tokens are stored hashed, never as sent
    expect(await db()("auth_tokens").where({ token_hash: token }).first()).toBeUndefined();

    await expect(checkCredentials(email, "a-long-password", "10.9.0.1")).resolves.toMatchObject({ email });
  });

  it("refuses a taken address, a short password and unknown fields", async () => {
    const u = await makeUser();
    expect((await call(signup, { body: { name: "X", email: u.email, password: "a-long-password" } })).status).toBe(409);
    const short = await call(signup, { body: { name: "X", email: `${uniq()}@example.test`, password: "short" } });
    expect(short.status).toBe(422);
    expect(short.json.error.message).toMatch(/password.*10 characters/);
    const extra = await call(signup, { body: { name: "X", email: `${uniq()}@example.test`, password: "a-long-password", role: "owner" } });
    expect(extra.status).toBe(422);
  });

  it("an expired link says so", async () => {
    const email = `${uniq("exp")}@example.test`;
    await call(signup, { body: { name: "Exp", email, password: "a-long-password" } });
    const token = tokenFrom((await mailTo(email, /Confirm/)).text, /\/verify\?token=/);
    await db()("auth_tokens").whereIn("user_id", db()("users").where({ email }).select("id")).update({ expires_at: new Date(Date.now() - 1000) });
    const r = await call(verification, { body: { token } });
    expect(r.status).toBe(422);
    expect(r.json.error.message).toMatch(/expired/);
  });
});

describe("sign-in rate limits", () => {
  it(`after ${RATE.perPair} failures from one address, that address waits (even with the right password); another address does not`, async () => {
    const u = await makeUser();
    for (let i = 0; i < RATE.perPair; i++) {
      await expect(checkCredentials(u.email, "wrong-password", "10.1.0.1")).rejects.toThrow(/do not match/);
    }
    await expect(checkCredentials(u.email, u.password, "10.1.0.1")).rejects.toThrow(/Too many failed sign-ins for this account from your network\. Try again in 1 minute/);
    await expect(checkCredentials(u.email, u.password, "10.1.99.1")).resolves.toMatchObject({ id: u.id });
  });

  it(`slows an address after ${RATE.perAddress} failures across accounts`, async () => {
    const ip = `10.2.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`;
    for (let i = 0; i < RATE.perAddress; i++) {
      await expect(checkCredentials(`${uniq("nobody")}@example.test`, "whatever-pass", ip)).rejects.toThrow(/do not match/);
    }
    const u = await makeUser();
    await expect(checkCredentials(u.email, u.password, ip)).rejects.toThrow(/Too many failed sign-ins from your network/);
    await expect(checkCredentials(u.email, u.password, "10.3.0.1")).resolves.toMatchObject({ id: u.id });
  });
});

describe("password reset", () => {
  it("mails a one-hour single-use link; the new password works and the old one does not", async () => {
    const u = await makeUser();
    const req = await call(resetRequest, { body: { email: u.email } });
    expect(req.status).toBe(202);
    const token = tokenFrom((await mailTo(u.email, /Reset your Kitwright password/)).text, /\/reset\?token=/);
    const row = await db()("auth_tokens").where({ user_id: u.id, kind: "reset-password" }).first();
    const ttl = new Date(row.expires_at).getTime() - Date.now();
    expect(ttl).toBeGreaterThan(3500_000);
    expect(ttl).toBeLessThanOrEqual(3600_000);
    expect((await call(resetConfirm, { body: { token, password: "brand-new-password" } })).status).toBe(200);
    await expect(checkCredentials(u.email, u.password, "10.4.0.1")).rejects.toThrow(/do not match/);
    await expect(checkCredentials(u.email, "brand-new-password", "10.4.0.1")).resolves.toMatchObject({ id: u.id });
    expect((await call(resetConfirm, { body: { token, password: "another-password" } })).status).toBe(422);
  });

  it("answers the same for unknown addresses (no account enumeration) and sends nothing", async () => {
    const email = `${uniq("ghost")}@example.test`;
    const r = await call(resetRequest, { body: { email } });
    expect(r.status).toBe(202);
    await expect(mailTo(email, /Reset/, 500)).rejects.toThrow(/no mail/);
  });
});
