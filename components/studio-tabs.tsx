"use client";
// The studio's section tabs; the current one is marked (aria-current) and drawn as the open tab.
import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect, useRef } from "react";

export function StudioTabs({ base, tabs }: { base: string; tabs: { href: string; label: string }[] }) {
  const pathname = usePathname();
  const nav = useRef<HTMLElement>(null);
  // on a narrow screen the bar scrolls sideways: bring the open section into view
  useEffect(() => {
    const bar = nav.current;
    const open = bar?.querySelector<HTMLElement>("[aria-current=page]");
    if (!bar || !open) return;
    if (open.offsetLeft + open.offsetWidth > bar.scrollLeft + bar.clientWidth || open.offsetLeft < bar.scrollLeft) bar.scrollLeft = open.offsetLeft - 16;
  }, [pathname]);
  return (
    <nav ref={nav} aria-label="Studio sections" className="no-print relative -mx-4 flex gap-1 overflow-x-auto border-b border-line px-4 sm:mx-0 sm:px-0">
      {tabs.map((t) => {
        const current = t.href === base ? pathname === base : pathname === t.href || pathname.startsWith(`${t.href}/`);
        return (
          <Link
            key={t.href}
            href={t.href}
            aria-current={current ? "page" : undefined}
            className={`-mb-px shrink-0 whitespace-nowrap rounded-t-md border px-3 py-2 text-sm text-ink hover:no-underline ${current ? "border-line border-b-card bg-card font-semibold" : "border-transparent hover:border-line hover:bg-card"}`}
          >
            {t.label}
          </Link>
        );
      })}
    </nav>
  );
}
