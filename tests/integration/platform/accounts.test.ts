// Accounts: sign-up with e-mail verification, sign-in rules and rate limits, password reset.
import fs from "node:fs";
import path from "node:path";
import bcrypt from "bcryptjs";
import { afterAll, describe, expect, it, vi } from "vitest";
import { POST as signup } from "@/app/api/auth/signup/route";
import { POST as verification } from "@/app/api/auth/verification/route";
import { POST as resetRequest } from "@/app/api/auth/password-reset/route";
import { POST as resetConfirm } from "@/app/api/auth/password-reset/confirm/route";
import { checkCredentials, RATE } from "@/lib/server/auth/accounts";
import { db, closeDb } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { settled } from "@/lib/server/later";
import type { WrappedHandler } from "@/lib/server/route";
import { call, makeUser, uniq, type CallOptions } from "../helpers";
import { mailTo, tokenFrom } from "../mail";

afterAll(async () => {
  await settled();
  await closeDb();
});

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

/**
 * What a handler did before it answered: the SQL statements it ran (first words), the bcrypt hashes it made
 * (their cost), and which of the given addresses already had a caught message at that moment. Taken as the
 * handler's promise settles, before anything scheduled after the answer (lib/server/later.ts) can run.
 */
async function workBeforeAnswer(handler: WrappedHandler, o: CallOptions, addresses: string[]) {
  const sql: string[] = [];
  const onQuery = (q: { sql: string }) => sql.push(q.sql.replace(/`/g, "").split(/\s+/).slice(0, 3).join(" ").toLowerCase());
  const hash = vi.spyOn(bcrypt, "hash");
  let mailed: string[] = [];
  const dir = env().KW_MAIL_FAKE_DIR!;
  await settled(); // work left behind by earlier calls must not be counted as this one's
  const earlier = new Set(fs.readdirSync(dir));
  const watched = (async (req: never, ctx: never) => {
    db().on("query", onQuery);
    try {
      return await handler(req, ctx);
    } finally {
      db().off("query", onQuery);
      const texts = fs.readdirSync(dir).filter((n) => n.endsWith(".eml") && !earlier.has(n)).map((n) => fs.readFileSync(path.join(dir, n), "utf8"));
      mailed = addresses.filter((a) => texts.some((t) => t.includes(a)));
    }
  }) as unknown as WrappedHandler;
  try {
    const r = await call(watched, o);
    return { status: r.status, json: r.json, sql, hashes: hash.mock.calls.map((c) => c[1]), mailed };
  } finally {
    hash.mockRestore();
  }
}

describe("no account enumeration (OWASP Authentication Cheat Sheet, common practice: same answer, same work)", () => {
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

  it("sign-up does the same work for a taken address as for a new one before answering: one lookup, one bcrypt of cost 11, no mail yet", async () => {
    const u = await makeUser();
    const fresh = `${uniq("fresh")}@example.test`;
    const taken = await workBeforeAnswer(signup, { body: { name: "T", email: u.email, password: "another-password-1" } }, [u.email]);
    const made = await workBeforeAnswer(signup, { body: { name: "F", email: fresh, password: "another-password-1" } }, [fresh]);
    expect(taken.hashes).toEqual([11]);
    expect(made.hashes).toEqual([11]);
    expect(taken.sql).toEqual(["select * from"]);
    // the new account's row is the one difference (a single insert, no index scan of its own)
    expect(made.sql).toEqual(["select * from", "insert into users"]);
    // the mail (to either) is handed to SMTP only after the answer
    expect(taken.mailed).toEqual([]);
    expect(made.mailed).toEqual([]);
    await settled();
    await mailTo(u.email, /already has a Kitwright account/);
    await mailTo(fresh, /Confirm your e-mail/);
  });

  it("forgot-password and a new confirmation link answer a real and an unknown address alike, with nothing looked up before the answer", async () => {
    const u = await makeUser({ verified: false });
    const ghost = `${uniq("ghost")}@example.test`;
    for (const [handler, subject] of [[resetRequest, /Reset your Kitwright password/], [verification, /Confirm your e-mail/]] as const) {
      const real = await workBeforeAnswer(handler, { body: { email: u.email } }, [u.email]);
      const none = await workBeforeAnswer(handler, { body: { email: ghost } }, [ghost]);
      expect([real.status, real.json]).toEqual([none.status, none.json]);
      expect(real.status).toBe(202);
      // before, the real address was looked up and its mail handed to SMTP first (about 170 ms against 12)
      expect(real.sql).toEqual([]);
      expect(none.sql).toEqual([]);
      expect(real.mailed).toEqual([]);
      await settled();
      await mailTo(u.email, subject);
    }
    await expect(mailTo(ghost, /./, 300)).rejects.toThrow(/no mail/);
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
