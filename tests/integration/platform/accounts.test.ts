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

  it("refuses a short password and unknown fields", async () => {
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

/** Median of `n` timings of `f`, in ms. */
async function medianMs(n: number, f: () => Promise<unknown>): Promise<number> {
  const t: number[] = [];
  for (let i = 0; i < n; i++) {
    const t0 = performance.now();
    await f();
    t.push(performance.now() - t0);
  }
  return t.sort((a, b) => a - b)[Math.floor(n / 2)]!;
}

describe("no account enumeration (OWASP Authentication Cheat Sheet, common practice: same answer, same time)", () => {
  it("sign-up answers a taken address exactly as a new one, changes nothing, and tells the owner by mail", async () => {
    const u = await makeUser();
    const before = await db()("users").where({ id: u.id }).first();
    const fresh = `${uniq("fresh")}@example.test`;
    const taken = await call(signup, { body: { name: "Someone Else", email: u.email, password: "another-password-1" } });
    const created = await call(signup, { body: { name: "Someone New", email: fresh, password: "another-password-1" } });
    expect([taken.status, taken.json]).toEqual([created.status, created.json]);
    expect(created.status).toBe(201);
    expect(await db()("users").where({ id: u.id }).first()).toEqual(before);
    const told = await mailTo(u.email, /already has a Kitwright account/);
    expect(told.text).toContain("/forgot");
    expect(told.text).not.toMatch(/token=/);
    await mailTo(fresh, /Confirm your e-mail/);
  });

  it("sign-up takes as long for a taken address as for a new one (both hash the password; mail goes after the answer)", async () => {
    const u = await makeUser();
    const t = { taken: [] as number[], fresh: [] as number[] };
    for (let i = 0; i < 5; i++) {
      t.taken.push(await medianMs(1, () => call(signup, { body: { name: "T", email: u.email, password: "another-password-1" } })));
      t.fresh.push(await medianMs(1, () => call(signup, { body: { name: "F", email: `${uniq("f")}@example.test`, password: "another-password-1" } })));
    }
    const med = (xs: number[]) => xs.sort((a, b) => a - b)[2]!;
    const [a, b] = [med(t.taken), med(t.fresh)];
    // a generous margin: before, a taken address answered in a few ms and a new one after a bcrypt (~100+ ms)
    expect(Math.abs(a - b), `taken ${a.toFixed(0)} ms, new ${b.toFixed(0)} ms`).toBeLessThan(0.5 * Math.max(a, b));
  });

  it("forgot-password and a new confirmation link answer a real and an unknown address alike, as fast", async () => {
    const u = await makeUser({ verified: false });
    const ghost = () => `${uniq("ghost")}@example.test`;
    const real = await call(resetRequest, { body: { email: u.email } });
    const none = await call(resetRequest, { body: { email: ghost() } });
    expect([real.status, real.json]).toEqual([none.status, none.json]);
    const again = await call(verification, { body: { email: u.email } });
    const againNone = await call(verification, { body: { email: ghost() } });
    expect([again.status, again.json]).toEqual([againNone.status, againNone.json]);
    for (const [f, what] of [[resetRequest, "reset"], [verification, "confirmation"]] as const) {
      const a = await medianMs(7, () => call(f, { body: { email: u.email } }));
      const b = await medianMs(7, () => call(f, { body: { email: ghost() } }));
      // before, the real address waited for the mail to be handed to SMTP (~170 ms against ~12 ms)
      expect(Math.abs(a - b), `${what}: real ${a.toFixed(0)} ms, unknown ${b.toFixed(0)} ms`).toBeLessThan(Math.max(30, 0.5 * Math.max(a, b)));
    }
    // and the real address still gets its mail
    await mailTo(u.email, /Reset your Kitwright password/);
    await mailTo(u.email, /Confirm your e-mail/);
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
