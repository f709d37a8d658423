import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listKits } from "@/lib/server/kits/kits";
import { can } from "@/lib/permissions";
import { SuggestLayout } from "@/components/layout-editor/suggest-layout";

export const metadata: Metadata = { title: "Suggest a layout" };

export default async function SuggestLayoutPage({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const kits = await listKits({ studioId: studio.id });
  return (
    <div className="space-y-4">
      <div>
        <p className="text-sm"><Link href={`/s/${studio.id}/layouts`}>← Layouts</Link></p>
        <h1 className="mt-1">Suggest a layout</h1>
        <p className="mt-1 max-w-3xl text-sm text-muted">
          Tell Kitwright your controller (a grid of pads, or the names of its trigger zones) and a kit: it places the kit&apos;s
          recorded strokes where drummers usually reach for them, says why for every pad, and lets you keep the result as a
          layout to edit.
        </p>
      </div>
      {kits.length === 0 ? (
        <p className="card text-sm">No kits yet — <Link href={`/s/${studio.id}/kits`}>make a kit</Link> first, then come back to lay it out.</p>
      ) : (
        <SuggestLayout studioId={studio.id} kits={kits.map((k) => ({ id: k.id, name: k.name, filled: k.filled }))} canSave={can(studio.role, "studio:write")} />
      )}
    </div>
  );
}
