import "server-only";
// Reads the messages the local SMTP fake kept (scripts/smtp-fake.ts), for the caught-mail page (/mail) and the
// tests. The page exists only while the fake is configured, and in a production build only with the explicit
// opt-in of our local profiles (mailPageEnabled). It shows a person only their own mail (mailVisibleTo):
// - signed in: the messages to the account's address (the account named by KW_MAIL_PAGE_ALL_TO, the demo's
//   owner, sees every message);
// - signed out: only the verification mail of accounts created in this browser. Sign-up gives the browser a
//   random key in an httpOnly cookie (MAIL_KEY_COOKIE) and marks that one message with the key's SHA-256
//   (MAIL_KEY_HEADER). Nothing else is ever marked: a reset link, an invitation or any mail asked for by
//   someone else is never shown to a signed-out visitor.
import crypto from "node:crypto";
import fs from "node:fs/promises";
import path from "node:path";
import { env, type Env } from "./env";

export interface CaughtMail {
  id: string;
  to: string;
  subject: string;
  date: string;
  text: string;
  /** The SMTP envelope's recipients (lower case). */
  recipients: string[];
  /** The browser-key mark of a sign-up's verification mail, else null. */
  browserTag: string | null;
}

export const MAIL_KEY_COOKIE = "kw-mail-key";
export const MAIL_KEY_HEADER = "X-Kitwright-Browser";
/** How long a browser keeps its key (as long as a verification link lasts). */
export const MAIL_KEY_MAX_AGE_S = 48 * 3600;

function decodeQuotedPrintable(s: string): string {
  const bytes: number[] = [];
  const soft = s.replace(/=\r?\n/g, "");
  for (let i = 0; i < soft.length; i++) {
    if (soft[i] === "=" && /^[0-9A-F]{2}$/i.test(soft.slice(i + 1, i + 3))) {
      bytes.push(parseInt(soft.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(...Buffer.from(soft[i], "utf8"));
  }
  return Buffer.from(bytes).toString("utf8");
}

function decodeHeader(v: string): string {
  return v.replace(/=\?utf-8\?([bq])\?([^?]*)\?=/gi, (_m, enc: string, data: string) =>
    enc.toLowerCase() === "b" ? Buffer.from(data, "base64").toString("utf8") : decodeQuotedPrintable(data.replace(/_/g, " ")),
  ).replace(/\?=\s+=\?/g, "");
}

export function parseMessage(id: string, raw: string): CaughtMail {
  const split = raw.search(/\r?\n\r?\n/);
  const head = raw.slice(0, split).replace(/\r?\n[ \t]+/g, " ");
  const body = raw.slice(split).replace(/^\r?\n\r?\n/, "");
  const headers = new Map<string, string>();
  for (const line of head.split(/\r?\n/)) {
    const i = line.indexOf(":");
    const name = line.slice(0, i).toLowerCase();
    // the first of a repeated header counts (the fake writes the envelope first, before the message's own)
    if (i > 0 && !headers.has(name)) headers.set(name, line.slice(i + 1).trim());
  }
  const cte = (headers.get("content-transfer-encoding") ?? "7bit").toLowerCase();
  const text = cte === "quoted-printable" ? decodeQuotedPrintable(body) : cte === "base64" ? Buffer.from(body, "base64").toString("utf8") : body;
  return {
    id,
    to: decodeHeader(headers.get("to") ?? headers.get("x-kitwright-envelope-to") ?? ""),
    subject: decodeHeader(headers.get("subject") ?? "(no subject)"),
    date: headers.get("date") ? new Date(headers.get("date")!).toISOString() : "",
    text,
    recipients: (headers.get("x-kitwright-envelope-to") ?? "").split(",").map((s) => s.trim().toLowerCase()).filter(Boolean),
    browserTag: headers.get(MAIL_KEY_HEADER.toLowerCase()) ?? null,
  };
}

/**
 * Whether the caught-mail page exists: only while the SMTP fake is configured, and in a production build only
 * when our local profiles opt in (KW_MAIL_PAGE=1, scripts/env.sh).
 */
export function mailPageEnabled(e: Pick<Env, "KW_MAIL_FAKE_DIR" | "NODE_ENV" | "KW_MAIL_PAGE"> = env()): boolean {
  return !!e.KW_MAIL_FAKE_DIR && (e.NODE_ENV !== "production" || e.KW_MAIL_PAGE === "1");
}

/** A new browser key (256 random bits), and the mark it puts on mail. */
export const newMailKey = (): string => crypto.randomBytes(32).toString("base64url");
export const mailKeyTag = (key: string): string => crypto.createHash("sha256").update(`kitwright-mail-key:${key}`).digest("hex");
export const isMailKey = (v: string | undefined | null): v is string => !!v && /^[A-Za-z0-9_-]{43}$/.test(v);

export interface MailViewer {
  /** The signed-in account, if any. */
  user: { email: string } | null;
  /** The browser's key (MAIL_KEY_COOKIE), if it has one. */
  browserKey: string | null;
}

/** Whether a caught message may be shown to this viewer (see the top of this file). */
export function mailVisibleTo(m: CaughtMail, v: MailViewer, allTo: string | undefined = env().KW_MAIL_PAGE_ALL_TO): boolean {
  if (v.user) {
    const me = v.user.email.toLowerCase();
    return (!!allTo && me === allTo.toLowerCase()) || m.recipients.includes(me);
  }
  return isMailKey(v.browserKey) && m.browserTag === mailKeyTag(v.browserKey);
}

/** Every caught message, newest first (tests; the page goes through caughtMailFor). */
export async function listCaughtMail(limit = 100): Promise<CaughtMail[]> {
  const dir = env().KW_MAIL_FAKE_DIR;
  if (!dir) return [];
  const names = (await fs.readdir(dir).catch(() => [] as string[])).filter((n) => n.endsWith(".eml")).sort().reverse().slice(0, limit);
  return Promise.all(names.map(async (n) => parseMessage(n.replace(/\.eml$/, ""), await fs.readFile(path.join(dir, n), "utf8"))));
}

/** The viewer's own caught messages, newest first, looking through the newest 2,000. */
export async function caughtMailFor(viewer: MailViewer, limit = 100): Promise<CaughtMail[]> {
  if (!viewer.user && !isMailKey(viewer.browserKey)) return [];
  return (await listCaughtMail(2000)).filter((m) => mailVisibleTo(m, viewer)).slice(0, limit);
}
