import type { Metadata } from "next";
import { loadStudioStrokes } from "@/lib/server/strokes";
import { Suspense } from "react";
import { requireStudio } from "@/lib/server/session";
import { getLibrary, libraryProgress } from "@/lib/server/catalogue/libraries";
import { listInstruments } from "@/lib/server/catalogue/instruments";
import { can } from "@/lib/permissions";
import { LibraryProgress } from "@/components/library/progress";
import { Uploader } from "@/components/library/uploader";
import { SamplesBrowser } from "@/components/library/samples-browser";
import { NextStepSlot } from "@/app/(app)/s/[studioId]/next-step-slot";

export const metadata: Metadata = { title: "Library" };

export default async function LibraryPage({ params }: { params: Promise<{ studioId: string; libraryId: string }> }) {
  const { studioId, libraryId } = await params;
  const { studio } = await requireStudio(studioId);
  const lib = await getLibrary({ studioId: studio.id, libraryId });
  const [instruments, progress, strokes] = await Promise.all([listInstruments({ studioId: studio.id, libraryId }), libraryProgress({ studioId: studio.id, libraryId }), loadStudioStrokes(studio.id)]);
  const write = can(studio.role, "studio:write");
  return (
    <>
    <NextStepSlot studio={studio} />
    <div className="space-y-4">
      <div className={write ? "grid grid-cols-1 items-start gap-4 lg:grid-cols-2" : ""}>
        <LibraryProgress studioId={studio.id} libraryId={lib.id} initial={progress} />
        {write && <Uploader studioId={studio.id} libraryId={lib.id} />}
      </div>
      <Suspense fallback={<div className="card text-sm text-muted">Loading samples…</div>}>
        <SamplesBrowser studioId={studio.id} libraryId={lib.id} canWrite={write} instruments={instruments.map((i) => ({ key: i.key, name: i.name, family: i.family }))} strokes={strokes} />
      </Suspense>
    </div>
    </>
  );
}
