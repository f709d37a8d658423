"use client";
// The sections of one library; the current one is marked (aria-current and a filled look, not colour alone).
import Link from "next/link";
import { usePathname } from "next/navigation";

export function LibraryTabs({ tabs }: { tabs: { href: string; label: string }[] }) {
  const path = usePathname();
  return (
    <nav aria-label="Library sections" className="flex gap-1 text-sm">
      {tabs.map((t) => {
        const current = path === t.href;
        return (
          <Link key={t.href} href={t.href} aria-current={current ? "page" : undefined} className={`rounded-md border px-3 py-1.5 hover:no-underline ${current ? "border-brand bg-brand text-white" : "border-line bg-card text-ink hover:bg-paper"}`}>
            {current && <span aria-hidden>● </span>}{t.label}
          </Link>
        );
      })}
    </nav>
  );
}
