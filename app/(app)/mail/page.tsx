// Mail caught by the local SMTP fake (demo, development, tests), so verification and invitation links can
// be clicked. Each person sees only their own mail (lib/server/mail-catcher.ts). With a real SMTP server
// configured, or in a production build without the local profiles' opt-in, this page does not exist.
import type { Metadata } from "next";
import Link from "next/link";
import { cookies } from "next/headers";
import { notFound } from "next/navigation";
import { caughtMailFor, MAIL_KEY_COOKIE, mailPageEnabled } from "@/lib/server/mail-catcher";
import { currentUser } from "@/lib/server/session";

export const metadata: Metadata = { title: "Caught mail" };
export const dynamic = "force-dynamic";

function Linkified({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s]+)/g);
  return <>{parts.map((p, i) => (/^https?:\/\//.test(p) ? <a key={i} href={p} className="break-all">{p}</a> : <span key={i}>{p}</span>))}</>;
}

export default async function MailPage() {
  if (!mailPageEnabled()) notFound();
  const user = await currentUser();
  const browserKey = (await cookies()).get(MAIL_KEY_COOKIE)?.value ?? null;
  const mail = await caughtMailFor({ user, browserKey });
  return (
    <div className="space-y-4">
      <h1>Caught mail</h1>
      <p className="text-sm text-muted">
        Kitwright is sending through its local SMTP fake: nothing leaves this machine.{" "}
        {user
          ? <>Here is the mail sent to <strong>{user.email}</strong>, newest first.</>
          : <>Signed out, you see only the confirmation mail of an account created in this browser. <Link href="/sign-in?next=/mail">Sign in</Link> to see the mail sent to your address.</>}
      </p>
      {mail.length === 0 && <p className="card text-sm" data-testid="mail-none">No mail for you here.</p>}
      <ul className="space-y-3" data-testid="mail-list">
        {mail.map((m) => (
          <li key={m.id} className="card space-y-2">
            <div className="flex flex-wrap justify-between gap-2 text-sm">
              <strong data-testid="mail-subject">{m.subject}</strong>
              <span className="num text-muted">{m.date.replace("T", " ").slice(0, 19)}</span>
            </div>
            <p className="text-sm">To: <span data-testid="mail-to">{m.to}</span></p>
            <pre className="whitespace-pre-wrap rounded bg-paper p-3 font-sans text-sm"><Linkified text={m.text} /></pre>
          </li>
        ))}
      </ul>
    </div>
  );
}
