import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listLibraries } from "@/lib/server/catalogue/libraries";
import { can, whoCan } from "@/lib/permissions";
import { CreateLibraryForm } from "@/components/library/library-forms";
import { StateCountsLine } from "@/components/library/state-counts";
import { NextStepSlot } from "@/app/(app)/s/[studioId]/next-step-slot";

export const metadata: Metadata = { title: "Libraries" };

export default async function LibrariesPage({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const libraries = await listLibraries({ studioId: studio.id });
  const write = can(studio.role, "studio:write");
  return (
    <>
    <NextStepSlot studio={studio} />
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_340px]">
      <section className="space-y-3" data-testid="libraries">
        {libraries.length === 0 && (
          <div className="card">
            <h2>No libraries yet</h2>
            <p className="mt-2 text-sm text-muted">A library is one sample pack or recording project. {write ? "Create one, then drop a folder or a zip pack of WAV one-shots on it." : `${whoCan("studio:write", { capital: true })} can create one.`}</p>
          </div>
        )}
        {libraries.map((l) => (
          <article key={l.id} className="card space-y-2">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h2><Link href={`/s/${studio.id}/libraries/${l.id}`}>{l.name}</Link></h2>
              <span className="text-xs text-muted">created {l.createdAt.slice(0, 10)}</span>
            </div>
            {l.description && <p className="text-sm text-muted">{l.description}</p>}
            <StateCountsLine counts={l.counts} />
            <p className="text-xs text-muted"><span className="num">{l.instruments}</span> instruments{l.healthComputedAt ? ` · sorted ${l.healthComputedAt.replace("T", " ").slice(0, 16)} UTC` : ""}</p>
          </article>
        ))}
      </section>
      {write && <aside className="card h-fit" id="new-library"><CreateLibraryForm studioId={studio.id} /></aside>}
    </div>
    </>
  );
}
