import "server-only";
// Accounts: sign-up, e-mail verification, password reset, and credential checks with rate limits.
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { db } from "../db";
import { AppError } from "../errors";
import { hashToken, newId, newToken } from "../ids";
import { appUrl, sendMail } from "../mail";
import { endAllSessions } from "./sessions";
import { later } from "../later";
import type { SignUpInput } from "@/lib/validation/auth";

const BCRYPT_COST = 11;
const VERIFY_TTL_MS = 48 * 3600_000;
const RESET_TTL_MS = 3600_000;
/** Sign-in limits (see checkCredentials). */
export const RATE = { windowMs: 15 * 60_000, perPair: 5, perAddress: 20, firstDelayMs: 60_000, maxDelayMs: 15 * 60_000 } as const;

export interface UserRow {
  id: string;
  email: string;
  name: string;
  password_hash: string;
  email_verified_at: Date | null;
}

export async function findUserByEmail(email: string): Promise<UserRow | undefined> {
  return db()("users").where({ email: email.toLowerCase() }).first();
}

export async function findUserById(id: string): Promise<Omit<UserRow, "password_hash"> | undefined> {
  return db()("users").where({ id }).first("id", "email", "name", "email_verified_at");
}

export const hashPassword = (pw: string) => bcrypt.hash(pw, BCRYPT_COST);

async function issueToken(userId: string, kind: "verify-email" | "reset-password", ttlMs: number): Promise<string> {
  const token = newToken();
  await db()("auth_tokens").insert({
    id: newId(),
    user_id: userId,
    kind,
    token_hash: hashToken(token),
    expires_at: new Date(Date.now() + ttlMs),
  });
  return token;
}

export async function sendVerificationMail(user: { id: string; email: string; name: string }, headers?: Record<string, string>): Promise<void> {
  const token = await issueToken(user.id, "verify-email", VERIFY_TTL_MS);
  await sendMail({
    to: user.email,
    subject: "Confirm your e-mail address for Kitwright",
    text: `Hello ${user.name},\n\nconfirm your address to start using Kitwright:\n\n${appUrl(`/verify?token=${token}`)}\n\nThe link works once and expires in 48 hours. If you did not sign up, ignore this message.\n`,
    headers,
  });
}

/** To the owner of an address someone tried to sign up with again: no link that does anything by itself. */
async function sendAlreadyRegisteredMail(user: { email: string; name: string }): Promise<void> {
  await sendMail({
    to: user.email,
    subject: "This address already has a Kitwright account",
    text: `Hello ${user.name},\n\nsomeone (perhaps you) tried to create a Kitwright account with this address, which already has one. Sign in at:\n\n${appUrl("/sign-in")}\n\nIf you forgot your password, ask for a reset link at:\n\n${appUrl("/forgot")}\n\nIf it was not you, ignore this message: nothing was changed.\n`,
  });
}

/**
 * Creates an unverified account and mails the verification link (`mailHeaders` go on that message). When the
 * address already has an account nothing changes and its owner is told by mail instead. Either way the same
 * work is done before the answer (a lookup and a bcrypt of the password) and the mail goes after it, so the
 * caller cannot tell the two apart: `id` is for the server's own use (joining an invitation), never answered.
 */
export async function signUp(input: SignUpInput, opts: { sendVerification?: boolean; mailHeaders?: Record<string, string> } = {}): Promise<{ id: string | null }> {
  const existing = await findUserByEmail(input.email);
  const password_hash = await hashPassword(input.password);
  let id: string | null = null;
  if (!existing) {
    id = newId();
    try {
      await db()("users").insert({ id, email: input.email, name: input.name, password_hash });
    } catch (e) {
      if ((e as { errno?: number }).errno !== 1062) throw e;
      id = null; // signed up a moment ago by another request
    }
  }
  if (id) {
    const user = { id, email: input.email, name: input.name };
    if (opts.sendVerification !== false) later("verification mail", () => sendVerificationMail(user, opts.mailHeaders));
  } else {
    later("already-registered mail", async () => {
      const u = await findUserByEmail(input.email);
      if (u) await sendAlreadyRegisteredMail(u);
    });
  }
  return { id };
}

/** Consumes a single-use token of a kind; returns its user id or throws a clear 422. */
async function consumeToken(token: string, kind: "verify-email" | "reset-password", outer?: Knex.Transaction): Promise<string> {
  const run = <T>(f: (trx: Knex.Transaction) => Promise<T>) => (outer ? f(outer) : db().transaction(f));
  return run(async (trx) => {
    const row = await trx("auth_tokens").where({ token_hash: hashToken(token), kind }).forUpdate().first();
    const what = kind === "verify-email" ? "confirmation link" : "reset link";
    if (!row) throw new AppError("invalid-input", `This ${what} is not valid.`);
    if (row.used_at) throw new AppError("invalid-input", `This ${what} has already been used.`);
    if (new Date(row.expires_at).getTime() < Date.now()) throw new AppError("invalid-input", `This ${what} has expired; ask for a new one.`);
    await trx("auth_tokens").where({ id: row.id }).update({ used_at: new Date() });
    return row.user_id as string;
  });
}

export async function verifyEmail(token: string): Promise<{ userId: string }> {
  const userId = await consumeToken(token, "verify-email");
  await db()("users").where({ id: userId }).whereNull("email_verified_at").update({ email_verified_at: new Date(), updated_at: new Date() });
  return { userId };
}

/**
 * A new confirmation link for an unconfirmed account. Nothing is looked up before the answer: the work is done
 * after it (lib/server/later.ts), so neither the answer nor its time tells whether the address has an account.
 */
export function resendVerification(email: string): void {
  later("verification mail", async () => {
    const u = await findUserByEmail(email);
    if (u && !u.email_verified_at) await sendVerificationMail(u);
  });
}

/** A reset link for the address's account, if there is one; like resendVerification, all of it after the answer. */
export function requestPasswordReset(email: string): void {
  later("password reset mail", () => sendPasswordReset(email));
}

async function sendPasswordReset(email: string): Promise<void> {
  const u = await findUserByEmail(email);
  if (!u) return;
  const token = await issueToken(u.id, "reset-password", RESET_TTL_MS);
  await sendMail({
    to: u.email,
    subject: "Reset your Kitwright password",
    text: `Hello ${u.name},\n\nsomeone asked to reset the password of this Kitwright account. To choose a new password, open:\n\n${appUrl(`/reset?token=${token}`)}\n\nThe link works once and expires in one hour. If it was not you, ignore this message: your password stays as it is.\n`,
  });
}

/**
 * Sets a new password with a reset link. In one transaction: the link is used, every other unused reset link
 * of the account stops working, the password changes, and every session of the account ends (whoever had
 * the old password is signed out everywhere).
 */
export async function resetPassword(token: string, password: string): Promise<void> {
  const password_hash = await hashPassword(password);
  const userId = await db().transaction(async (trx) => {
    const id = await consumeToken(token, "reset-password", trx);
    await trx("auth_tokens").where({ user_id: id, kind: "reset-password" }).whereNull("used_at").update({ used_at: new Date() });
    // A reset link proves control of the address, so it also confirms it.
    await trx("users").where({ id }).update({ password_hash, updated_at: new Date(), email_verified_at: trx.raw("COALESCE(email_verified_at, CURRENT_TIMESTAMP(3))") });
    await endAllSessions(trx, id);
    return id;
  });
  await db()("sign_in_attempts").where({ email: (await findUserById(userId))!.email }).delete();
}

const minutes = (ms: number) => Math.max(1, Math.ceil(ms / 60_000));
const inMinutes = (ms: number) => (minutes(ms) === 1 ? "1 minute" : `${minutes(ms)} minutes`);

/** The wait after `n` failures of one account from one address: none below the limit, then doubling. */
export function pairDelayMs(n: number): number {
  if (n < RATE.perPair) return 0;
  return Math.min(RATE.maxDelayMs, RATE.firstDelayMs * 2 ** (n - RATE.perPair));
}

/**
 * Checks an e-mail + password from a client address (lib/server/client-address.ts). Failures are counted over a
 * 15-minute window, per account and address together and per address:
 * - after 5 failures for one account from one address, that address waits before its next try for that account:
 *   1 minute, then 2, 4, 8, at most 15 (each failure after a wait doubles it). The account's owner, at any other
 *   address, is not held up: guessing slows down, nobody is locked out by someone else's failures.
 * - after 20 failures from one address across accounts, that address waits until its oldest failure leaves
 *   the window.
 * While an address waits, every try is refused with the time left, even with the right password (or the
 * answer would tell a guess was right). A successful sign-in clears that address's failures for the account;
 * a password reset clears all of the account's.
 */
export async function checkCredentials(emailRaw: string, password: string, ip: string): Promise<{ id: string; email: string; name: string }> {
  const email = emailRaw.trim().toLowerCase();
  const now = Date.now();
  const since = new Date(now - RATE.windowMs);
  const [pair] = await db()("sign_in_attempts").where({ email, ip, succeeded: false }).andWhere("created_at", ">", since).count({ n: "*" }).max({ last: "created_at" });
  const wait = pairDelayMs(Number(pair.n));
  const waited = pair.last ? now - new Date(pair.last as string).getTime() : Infinity;
  if (wait > 0 && waited < wait) {
    throw new AppError("rate-limited", `Too many failed sign-ins for this account from your network. Try again in ${inMinutes(wait - waited)}, or reset your password.`);
  }
  const [addr] = await db()("sign_in_attempts").where({ ip, succeeded: false }).andWhere("created_at", ">", since).count({ n: "*" }).min({ oldest: "created_at" });
  if (Number(addr.n) >= RATE.perAddress) {
    throw new AppError("rate-limited", `Too many failed sign-ins from your network. Try again in ${inMinutes(new Date(addr.oldest as string).getTime() + RATE.windowMs - now)}.`);
  }
  const user = await findUserByEmail(email);
  // Compare against a dummy hash when the account does not exist, so timing does not reveal it.
  const ok = await bcrypt.compare(password, user?.password_hash ?? "$2b$11$CwTycUXWue0Thq9StjUM0uJ8c3s0FQ0l9e2yDq0l0Y3jTzqGmFvGe");
  await db()("sign_in_attempts").insert({ email, ip, succeeded: ok && !!user });
  if (!user || !ok) throw new AppError("unauthenticated", "That e-mail and password do not match an account.");
  if (!user.email_verified_at) throw new AppError("forbidden", "Confirm your e-mail address first: use the link we sent you (or ask for a new one below).");
  await db()("sign_in_attempts").where({ email, ip, succeeded: false }).delete();
  return { id: user.id, email: user.email, name: user.name };
}
