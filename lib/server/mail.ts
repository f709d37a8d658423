import "server-only";
// Outgoing mail through SMTP (the local fake in the demo, development and tests).
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "./env";

let transport: Transporter | undefined;
function transporter(): Transporter {
  if (!transport) {
    const e = env();
    transport = nodemailer.createTransport({
      host: e.SMTP_HOST,
      port: e.SMTP_PORT,
      secure: e.SMTP_SECURE === "1",
      ignoreTLS: e.SMTP_SECURE !== "1" && !!e.KW_MAIL_FAKE_DIR,
      auth: e.SMTP_USER ? { user: e.SMTP_USER, pass: e.SMTP_PASSWORD ?? "" } : undefined,
    });
  }
  return transport;
}

export async function sendMail(m: { to: string; subject: string; text: string; headers?: Record<string, string> }): Promise<void> {
  await transporter().sendMail({ from: env().MAIL_FROM, to: m.to, subject: m.subject, text: m.text, headers: m.headers });
}

export function appUrl(path: string): string {
  return new URL(path, env().KW_APP_URL).toString();
}
