"use client";
// The studio's section tabs; the current one is marked (aria-current) and drawn as the open tab.
import Link from "next/link";
import { usePathname } from "next/navigation";

export function StudioTabs({ base, tabs }: { base: string; tabs: { href: string; label: string }[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Studio sections" className="no-print flex flex-wrap gap-1 border-b border-line">
      {tabs.map((t) => {
        const current = t.href === base ? pathname === base : pathname === t.href || pathname.startsWith(`${t.href}/`);
        return (
          <Link
            key={t.href}
            href={t.href}
            aria-current={current ? "page" : undefined}
            className={`-mb-px rounded-t-md border px-3 py-2 text-sm text-ink hover:no-underline ${current ? "border-line border-b-card bg-card font-semibold" : "border-transparent hover:border-line hover:bg-card"}`}
          >
            {t.label}
          </Link>
        );
      })}
    </nav>
  );
}
