// Sign-in limits through next-auth's credentials sign-in (the way the form signs in), with the web server's
// guard simulated: KW_PEER_HEADER names the header holding the socket's address (scripts/serve-guard.cjs writes
// it on every request), and one proxy address is trusted.
// Sources: OWASP Authentication Cheat Sheet, "Account lockout" (common practice): lockouts let an attacker lock
// users out; prefer throttling with growing delays. X-Forwarded-For is written by the client unless a proxy we
// trust wrote it (de-facto standard, cf. RFC 7239 section 8.3 on forged forwarding headers).
import { afterAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  process.env.KW_PEER_HEADER = "x-kitwright-peer";
  process.env.KW_TRUSTED_PROXIES = "10.77.0.1";
});

import { db, closeDb } from "@/lib/server/db";
import { checkCredentials, RATE } from "@/lib/server/auth/accounts";
import { makeUser, signInThroughNextAuth, uniq } from "../helpers";

afterAll(() => closeDb());

let octet = 0;
/** A fresh documentation-range address (RFC 5737) for each test, so tests do not share counters. */
const freshIp = () => `198.51.${100 + Math.floor(Math.random() * 100)}.${(octet++ % 250) + 1}`;
const from = (peer: string, xff?: string) => ({ "x-kitwright-peer": peer, ...(xff ? { "x-forwarded-for": xff } : {}) });

async function failures(n: number, headers: Record<string, string>, email = () => `${uniq("nobody")}@example.test`) {
  for (let i = 0; i < n; i++) {
    const r = await signInThroughNextAuth(email(), "wrong-password-1", headers);
    expect(r.error).toMatch(/do not match/);
  }
}

describe("which address is counted", () => {
  it("a direct client that rotates X-Forwarded-For is still one address", async () => {
    const peer = freshIp();
    for (let i = 0; i < RATE.perAddress; i++) {
      const r = await signInThroughNextAuth(`${uniq("nobody")}@example.test`, "wrong-password-1", from(peer, `203.0.113.${i + 1}`));
      expect(r.error).toMatch(/do not match/);
    }
    const u = await makeUser();
    const r = await signInThroughNextAuth(u.email, u.password, from(peer, "203.0.113.250"));
    expect(r.error).toMatch(/Too many failed sign-ins from your network/);
  });

  it("a fixed X-Forwarded-For value sent by one client does not lock out other clients", async () => {
    const attacker = freshIp();
    const start = new Date(Date.now() - 1000);
    await failures(RATE.perAddress, from(attacker, "192.0.2.1"));
    const u = await makeUser();
    // another direct client, with or without the same header value
    expect((await signInThroughNextAuth(u.email, u.password, from(freshIp(), "192.0.2.1"))).cookie).toBeTruthy();
    expect((await signInThroughNextAuth(u.email, u.password, from(freshIp()))).cookie).toBeTruthy();
    // the failures were counted against the attacker's own address, never the one it wrote
    const rows = await db()("sign_in_attempts").where("created_at", ">", start).whereIn("ip", ["192.0.2.1", attacker]).groupBy("ip").select("ip").count({ n: "*" });
    expect((rows as unknown as { ip: string; n: number }[]).map((r) => [r.ip, Number(r.n)])).toEqual([[attacker, RATE.perAddress]]);
  });

  it("behind the trusted proxy, the address it forwarded for is the client", async () => {
    const client = freshIp();
    await failures(RATE.perAddress, from("10.77.0.1", `203.0.113.9, ${client}`));
    const u = await makeUser();
    expect((await signInThroughNextAuth(u.email, u.password, from("10.77.0.1", client))).error).toMatch(/from your network/);
    expect((await signInThroughNextAuth(u.email, u.password, from("10.77.0.1", freshIp()))).cookie).toBeTruthy();
  });
});

describe("nobody locks anybody out", () => {
  it(`${RATE.perPair} wrong passwords from one address hold up that address for that account only; the owner signs in`, async () => {
    const u = await makeUser();
    const attacker = freshIp();
    await failures(RATE.perPair, from(attacker), () => u.email);
    expect((await signInThroughNextAuth(u.email, u.password, from(attacker))).error).toMatch(/Too many failed sign-ins for this account from your network\. Try again in 1 minute/);
    // the owner, at home
    expect((await signInThroughNextAuth(u.email, u.password, from(freshIp()))).cookie).toBeTruthy();
  });

  it("many attackers at many addresses still do not lock the owner out", async () => {
    const u = await makeUser();
    for (let a = 0; a < 5; a++) await failures(RATE.perPair, from(freshIp()), () => u.email);
    expect((await signInThroughNextAuth(u.email, u.password, from(freshIp()))).cookie).toBeTruthy();
  });

  it("the wait doubles with each failure after it: 1, 2, 4 minutes, at most 15", async () => {
    const u = await makeUser();
    const ip = freshIp();
    const fail = (agoMs: number) => db()("sign_in_attempts").insert({ email: u.email, ip, succeeded: false, created_at: new Date(Date.now() - agoMs) });
    for (let i = 0; i < 5; i++) await fail(10 * 60_000);
    // 5 failures, the last 10 minutes ago: the 1-minute wait is over, the password is checked
    await expect(checkCredentials(u.email, "wrong-password-1", ip)).rejects.toThrow(/do not match/);
    // 6 failures, the last just now: 2 minutes
    await expect(checkCredentials(u.email, u.password, ip)).rejects.toThrow(/Try again in 2 minutes/);
    await db()("sign_in_attempts").where({ email: u.email, ip }).delete();
    for (let i = 0; i < 7; i++) await fail(3 * 60_000);
    // 7 failures, the last 3 minutes ago: 4 minutes to wait, 1 left
    await expect(checkCredentials(u.email, u.password, ip)).rejects.toThrow(/Try again in 1 minute/);
    await db()("sign_in_attempts").where({ email: u.email, ip }).delete();
    for (let i = 0; i < 14; i++) await fail(60_000);
    await expect(checkCredentials(u.email, u.password, ip)).rejects.toThrow(/Try again in 14 minutes/);
    // a success clears that address's failures for the account
    await db()("sign_in_attempts").where({ email: u.email, ip }).delete();
    for (let i = 0; i < 4; i++) await fail(1000);
    await expect(checkCredentials(u.email, u.password, ip)).resolves.toMatchObject({ id: u.id });
    expect(Number((await db()("sign_in_attempts").where({ email: u.email, ip, succeeded: false }).count({ n: "*" }).first())!.n)).toBe(0);
  });
});
