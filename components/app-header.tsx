"use client";
// The header of the signed-in area. Wide screens show everything in one row: the studio switcher (it keeps
// you on the same kind of page where it can), caught mail, who is signed in, the theme switch and sign out.
// Below the md breakpoint the same controls move into a menu panel opened by one button.
import Link from "next/link";
import { useState } from "react";
import { signOut } from "next-auth/react";
import { useParams, usePathname, useRouter } from "next/navigation";
import { Select } from "./ui/select";
import { Sheet } from "./ui/dialog";
import { ThemeSwitch } from "./ui/theme";

type Studio = { id: string; name: string };

export function StudioSwitcher({ studios, className = "w-56" }: { studios: Studio[]; className?: string }) {
  const router = useRouter();
  const params = useParams<{ studioId?: string }>();
  const pathname = usePathname();
  const current = params.studioId ?? "";
  return (
    <Select
      aria-label="Switch studio"
      className={`py-1.5 ${className}`}
      value={current}
      onChange={(e) => {
        const id = e.target.value;
        if (!id) return router.push("/studios");
        const rest = current ? pathname.split("/").slice(3).join("/") : "";
        router.push(`/s/${id}${rest ? `/${rest}` : ""}`);
      }}
    >
      <option value="">All studios…</option>
      {studios.map((s) => (
        <option key={s.id} value={s.id}>{s.name}</option>
      ))}
    </Select>
  );
}

export function SignOutButton({ className = "" }: { className?: string }) {
  return (
    <button type="button" className={`btn-quiet py-1.5 ${className}`} onClick={() => signOut({ callbackUrl: "/sign-in" })}>
      Sign out
    </button>
  );
}

export function HeaderControls({ user, studios, mailFake }: { user: { name: string } | null; studios: Studio[]; mailFake: boolean }) {
  const [open, setOpen] = useState(false);
  const pathname = usePathname();
  const mail = mailFake && <Link href="/mail" title="Mail caught by the local SMTP fake">Caught mail</Link>;
  return (
    <>
      <div className="hidden min-w-0 flex-1 items-center gap-3 md:flex">
        {user && studios.length > 0 && <StudioSwitcher studios={studios} />}
        <div className="ml-auto flex items-center gap-3 text-sm">
          {mail}
          {user && <Link href="/account" className="max-w-48 truncate text-muted" data-testid="signed-in-as" title="Your account and API tokens">{user.name}</Link>}
          <ThemeSwitch />
          {user ? <SignOutButton /> : <Link href="/sign-in" className="btn-quiet">Sign in</Link>}
        </div>
      </div>
      <div className="ml-auto md:hidden">
        <Sheet
          title="Menu"
          open={open}
          onOpenChange={setOpen}
          trigger={
            <button type="button" className="btn-quiet px-2.5 py-1.5" aria-label="Open menu" data-testid="menu-button">
              <svg viewBox="0 0 20 20" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" aria-hidden><path d="M3 5h14M3 10h14M3 15h14" /></svg>
            </button>
          }
        >
          {/* a link or a studio chosen in the panel closes it (the key changes with the page) */}
          <div key={pathname} className="flex flex-col gap-4 text-sm" onClick={(e) => (e.target as HTMLElement).closest("a") && setOpen(false)}>
            {user && <p className="text-muted">Signed in as <Link href="/account" className="font-medium">{user.name}</Link></p>}
            {user && studios.length > 0 && (
              <div>
                <span className="label">Studio</span>
                <StudioSwitcher studios={studios} className="w-full" />
              </div>
            )}
            {mail}
            <div>
              <span className="label">Theme</span>
              <ThemeSwitch />
            </div>
            {user ? <SignOutButton className="self-start" /> : <Link href="/sign-in" className="btn-quiet self-start">Sign in</Link>}
          </div>
        </Sheet>
      </div>
    </>
  );
}
