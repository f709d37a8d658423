"use client";
// The sections of one library; the current one is marked (aria-current and a filled look, not colour alone).
import Link from "next/link";
import { usePathname } from "next/navigation";

export function LibraryTabs({ tabs }: { tabs: { href: string; label: string }[] }) {
  const path = usePathname();
  return (
    <nav aria-label="Library sections" className="-mx-4 flex gap-1 overflow-x-auto px-4 py-1 text-sm sm:mx-0 sm:px-0">
      {tabs.map((t) => {
        const current = path === t.href;
        return (
          <Link key={t.href} href={t.href} aria-current={current ? "page" : undefined} className={`shrink-0 whitespace-nowrap rounded-md border px-3 py-1.5 hover:no-underline ${current ? "border-brand bg-brand text-on-brand" : "border-line bg-card text-ink hover:bg-paper"}`}>
            {current && <span aria-hidden>● </span>}{t.label}
          </Link>
        );
      })}
    </nav>
  );
}
