import "server-only";
// Reads the messages the local SMTP fake kept (scripts/smtp-fake.ts). Exists only when KW_MAIL_FAKE_DIR is set.
import fs from "node:fs/promises";
import path from "node:path";
import { env } from "./env";

export interface CaughtMail { id: string; to: string; subject: string; date: string; text: string }

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
    if (i > 0) headers.set(line.slice(0, i).toLowerCase(), line.slice(i + 1).trim());
  }
  const cte = (headers.get("content-transfer-encoding") ?? "7bit").toLowerCase();
  const text = cte === "quoted-printable" ? decodeQuotedPrintable(body) : cte === "base64" ? Buffer.from(body, "base64").toString("utf8") : body;
  return {
    id,
    to: decodeHeader(headers.get("to") ?? headers.get("x-kitwright-envelope-to") ?? ""),
    subject: decodeHeader(headers.get("subject") ?? "(no subject)"),
    date: headers.get("date") ? new Date(headers.get("date")!).toISOString() : "",
    text,
  };
}

export function mailFakeEnabled(): boolean {
  return !!env().KW_MAIL_FAKE_DIR;
}

export async function listCaughtMail(limit = 100): Promise<CaughtMail[]> {
  const dir = env().KW_MAIL_FAKE_DIR;
  if (!dir) return [];
  const names = (await fs.readdir(dir).catch(() => [] as string[])).filter((n) => n.endsWith(".eml")).sort().reverse().slice(0, limit);
  return Promise.all(names.map(async (n) => parseMessage(n.replace(/\.eml$/, ""), await fs.readFile(path.join(dir, n), "utf8"))));
}
