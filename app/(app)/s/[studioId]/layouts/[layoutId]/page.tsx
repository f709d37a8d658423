import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { getLayout } from "@/lib/server/kits/layouts";
import { getKit, listKits } from "@/lib/server/kits/kits";
import { AppError } from "@/lib/server/errors";
import { can } from "@/lib/permissions";
import { LayoutEditor } from "@/components/layout-editor/layout-editor";
import { loadStudioStrokes } from "@/lib/server/strokes";
import { LayoutActions } from "@/components/item-actions";
import { NextStepSlot } from "@/app/(app)/s/[studioId]/next-step-slot";
import { SharePanel } from "@/components/layout-editor/share-panel";

export const metadata: Metadata = { title: "Layout" };

export default async function LayoutPage({ params }: { params: Promise<{ studioId: string; layoutId: string }> }) {
  const { studioId, layoutId } = await params;
  const { studio } = await requireStudio(studioId);
  if (!/^[0-9a-f-]{36}$/i.test(layoutId)) notFound();
  const rec = await getLayout({ studioId: studio.id, layoutId }).catch((e) => { if (e instanceof AppError && e.status === 404) notFound(); throw e; });
  const strokes = await loadStudioStrokes(studio.id);
  const kits = await Promise.all((await listKits({ studioId: studio.id })).map(async (k) => {
    const full = await getKit({ studioId: studio.id, kitId: k.id });
    return { id: k.id, name: k.name, slots: full.kit.slots.map((s) => ({ id: s.id, name: s.name, family: s.family })) };
  }));
  const write = can(studio.role, "studio:write");
  return (
    <>
    <NextStepSlot studio={studio} />
    <div className="space-y-4">
      <p className="no-print text-sm"><Link href={`/s/${studio.id}/layouts`}>← All layouts</Link> · <Link href={`/s/${studio.id}/audits?layoutId=${rec.id}`}>Audits of this layout</Link> · <Link href={`/s/${studio.id}/layouts/${rec.id}/kits`} data-testid="kit-matrix-link">How it plays on every kit</Link></p>
      <div className="flex flex-wrap items-start justify-between gap-4">
        <h2 className="text-xl" data-testid="layout-name">{rec.name}</h2>
        <LayoutActions studioId={studio.id} layoutId={rec.id} name={rec.name} canWrite={write} />
      </div>
      <LayoutEditor key={`${rec.id}:${rec.name}`} studioId={studio.id} layout={rec.layout} kits={kits} canWrite={write} strokes={strokes} />
      <SharePanel studioId={studio.id} layoutId={rec.id} canWrite={write} />
    </div>
    </>
  );
}
