// A studio's area: its name, my role, and the studio's sections.
import { StudioTabs } from "@/components/studio-tabs";
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
    { href: `/s/${studio.id}/strokes`, label: "Strokes", show: true },
    { href: `/s/${studio.id}/members`, label: "Members", show: true },
    { href: `/s/${studio.id}/activity`, label: "Activity", show: can(studio.role, "activity:read") },
  ];
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-baseline gap-3">
        <h1 data-testid="studio-name">{studio.name}</h1>
        <span className="tag border-brand/30 bg-brand-soft text-brand" data-testid="my-role">you: {studio.role}</span>
      </div>
      <StudioTabs base={`/s/${studio.id}`} tabs={tabs.filter((t) => t.show).map(({ href, label }) => ({ href, label }))} />
      {children}
    </div>
  );
}
