// Signed-in area: header with the studio switcher and the account menu.
import Link from "next/link";
import { Wordmark } from "@/components/logo";
import { StudioSwitcher, SignOutButton } from "@/components/app-header";
import { currentUser, myStudios } from "@/lib/server/session";
import { mailPageEnabled } from "@/lib/server/mail-catcher";

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await currentUser();
  const studios = user ? await myStudios(user.id) : [];
  const mailFake = mailPageEnabled();
  return (
    <div className="min-h-screen">
      <header className="no-print border-b border-line bg-card">
        <div className="mx-auto flex max-w-6xl items-center gap-4 px-4 py-3">
          <Link href={user ? "/studios" : "/"} className="no-underline hover:no-underline"><Wordmark /></Link>
          {user && studios.length > 0 && <StudioSwitcher studios={studios.map((s) => ({ id: s.id, name: s.name }))} />}
          <div className="ml-auto flex items-center gap-3 text-sm">
            {mailFake && <Link href="/mail" title="Mail caught by the local SMTP fake">Caught mail</Link>}
            {user ? (
              <>
                <Link href="/account" className="text-muted" data-testid="signed-in-as" title="Your account and API tokens">{user.name}</Link>
                <SignOutButton />
              </>
            ) : (
              <Link href="/sign-in" className="btn-quiet">Sign in</Link>
            )}
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-8">{children}</main>
    </div>
  );
}
