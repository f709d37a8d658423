// One library: its name, description, and sections (samples, instruments, plots, health, settings).
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { getLibrary } from "@/lib/server/catalogue/libraries";
import { can } from "@/lib/permissions";
import { AppError } from "@/lib/server/errors";
import { LibrarySettings } from "@/components/library/library-forms";
import { LibraryTabs } from "@/components/library/library-tabs";
import { ReadOnlyValue, ViewOnlyNote } from "@/components/view-only";
import { VELOCITY_CURVE_WORDS } from "@/components/library/curve-words";
import { Dialog } from "@/components/ui/dialog";

export default async function LibraryLayout({ children, params }: { children: React.ReactNode; params: Promise<{ studioId: string; libraryId: string }> }) {
  const { studioId, libraryId } = await params;
  const { studio } = await requireStudio(studioId);
  if (!/^[0-9a-f-]{36}$/i.test(libraryId)) notFound();
  const lib = await getLibrary({ studioId: studio.id, libraryId }).catch((e) => {
    if (e instanceof AppError && e.code === "not-found") notFound();
    throw e;
  });
  const base = `/s/${studio.id}/libraries/${lib.id}`;
  const tabs = [
    { href: base, label: "Samples" },
    { href: `${base}/instruments`, label: "Instruments" },
    { href: `${base}/plots`, label: "Plots" },
    { href: `${base}/velocity`, label: "Velocity response" },
    { href: `${base}/health`, label: "Health" },
  ];
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <p className="text-sm"><Link href={`/s/${studio.id}/libraries`}>Libraries</Link> /</p>
          <h2 className="text-xl" data-testid="library-name">{lib.name}</h2>
          {lib.description && <p className="max-w-3xl text-sm text-muted">{lib.description}</p>}
        </div>
        {can(studio.role, "studio:write") && (
          <Dialog title="Library settings" trigger={<button type="button" className="btn-quiet">Library settings</button>}>
            <div className="text-sm">
              <LibrarySettings studioId={studio.id} libraryId={lib.id} name={lib.name} description={lib.description} velocityCurve={lib.velocityCurve} canDelete={can(studio.role, "studio:manage")} />
            </div>
          </Dialog>
        )}
        {!can(studio.role, "studio:write") && (
          <div className="card w-full max-w-md space-y-2 p-3 text-sm sm:w-auto" data-testid="library-settings-view">
            <dl><ReadOnlyValue label="Velocity curve">{VELOCITY_CURVE_WORDS[lib.velocityCurve]}</ReadOnlyValue></dl>
            <ViewOnlyNote what="the library's settings" />
          </div>
        )}
      </div>
      <LibraryTabs tabs={tabs} />
      {children}
    </div>
  );
}
