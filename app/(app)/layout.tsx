// Signed-in area: header with the studio switcher and the account menu (one row on wide screens, a menu
// panel on small ones).
import Link from "next/link";
import { Wordmark } from "@/components/logo";
import { HeaderControls } from "@/components/app-header";
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
          <Link href={user ? "/studios" : "/"} className="shrink-0 no-underline hover:no-underline"><Wordmark /></Link>
          <HeaderControls user={user ? { name: user.name } : null} studios={studios.map((s) => ({ id: s.id, name: s.name }))} mailFake={mailFake} />
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-6 sm:py-8">{children}</main>
    </div>
  );
}
