// Reading the SMTP fake's mail in integration tests.
import { listCaughtMail } from "@/lib/server/mail-catcher";

export async function mailTo(to: string, subject: RegExp, timeoutMs = 5000) {
  const end = Date.now() + timeoutMs;
  for (;;) {
    const m = (await listCaughtMail(500)).find((x) => x.to.toLowerCase().includes(to.toLowerCase()) && subject.test(x.subject));
    if (m) return m;
    if (Date.now() > end) throw new Error(`no mail to ${to} matching ${subject}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export function tokenFrom(text: string, pathPattern: RegExp): string {
  const link = text.match(/https?:\/\/\S+/g)?.find((l) => pathPattern.test(l));
  if (!link) throw new Error(`no link matching ${pathPattern}`);
  const u = new URL(link);
  return u.searchParams.get("token") ?? u.pathname.split("/").pop()!;
}
