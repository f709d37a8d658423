// A studio's area: its name, my role, and the studio's sections.
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { can } from "@/lib/permissions";

export default async function StudioLayout({ children, params }: { children: React.ReactNode; params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const tabs = [
    { href: `/s/${studio.id}`, label: "Overview", show: true },
    { href: `/s/${studio.id}/libraries`, label: "Libraries", show: true },
    { href: `/s/${studio.id}/kits`, label: "Kits", show: true },
    { href: `/s/${studio.id}/layouts`, label: "Layouts", show: true },
    { href: `/s/${studio.id}/audits`, label: "Audits", show: true },
    { href: `/s/${studio.id}/members`, label: "Members", show: true },
    { href: `/s/${studio.id}/activity`, label: "Activity", show: can(studio.role, "activity:read") },
  ];
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline gap-3">
        <h1 data-testid="studio-name">{studio.name}</h1>
        <span className="tag border-brand/30 bg-brand-soft text-brand" data-testid="my-role">you: {studio.role}</span>
      </div>
      <nav aria-label="Studio sections" className="no-print flex gap-1 border-b border-line">
        {tabs.filter((t) => t.show).map((t) => (
          <Link key={t.href} href={t.href} className="-mb-px rounded-t-md border border-transparent px-3 py-2 text-sm text-ink hover:border-line hover:bg-card hover:no-underline">
            {t.label}
          </Link>
        ))}
      </nav>
      {children}
    </div>
  );
}
