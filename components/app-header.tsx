"use client";
// Header controls: switch studio (keeps you on the same kind of page where it can) and sign out.
import { signOut } from "next-auth/react";
import { useParams, usePathname, useRouter } from "next/navigation";

export function StudioSwitcher({ studios }: { studios: { id: string; name: string }[] }) {
  const router = useRouter();
  const params = useParams<{ studioId?: string }>();
  const pathname = usePathname();
  const current = params.studioId ?? "";
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only">Studio</span>
      <select
        aria-label="Switch studio"
        className="field w-56 py-1.5"
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
      </select>
    </label>
  );
}

export function SignOutButton() {
  return (
    <button type="button" className="btn-quiet py-1.5" onClick={() => signOut({ callbackUrl: "/sign-in" })}>
      Sign out
    </button>
  );
}
