import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { getKit } from "@/lib/server/kits/kits";
import { listInstrumentChoices } from "@/lib/server/kits/catalogue-for-audit";
import { AppError } from "@/lib/server/errors";
import { can } from "@/lib/permissions";
import { KitEditor } from "@/components/kit/kit-editor";
import { loadStudioStrokes } from "@/lib/server/strokes";
import { KitActions } from "@/components/item-actions";
import { NextStepSlot } from "@/app/(app)/s/[studioId]/next-step-slot";

export const metadata: Metadata = { title: "Kit" };

export default async function KitPage({ params }: { params: Promise<{ studioId: string; kitId: string }> }) {
  const { studioId, kitId } = await params;
  const { studio } = await requireStudio(studioId);
  if (!/^[0-9a-f-]{36}$/i.test(kitId)) notFound();
  const kit = await getKit({ studioId: studio.id, kitId }).catch((e) => { if (e instanceof AppError && e.status === 404) notFound(); throw e; });
  const [instruments, strokes] = await Promise.all([listInstrumentChoices({ studioId: studio.id }), loadStudioStrokes(studio.id)]);
  const write = can(studio.role, "studio:write");
  return (
    <>
    <NextStepSlot studio={studio} />
    <div className="space-y-4">
      <p className="no-print text-sm"><Link href={`/s/${studio.id}/kits`}>← All kits</Link></p>
      <div className="flex flex-wrap items-start justify-between gap-4">
        <h2 className="text-xl" data-testid="kit-name">{kit.name}</h2>
        <KitActions studioId={studio.id} kitId={kit.id} name={kit.name} canWrite={write} />
      </div>
      <KitEditor key={`${kit.id}:${kit.name}`} studioId={studio.id} kit={kit.kit} instruments={instruments} canWrite={write} strokes={strokes} />
    </div>
    </>
  );
}
