import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listLayouts } from "@/lib/server/kits/layouts";
import { can } from "@/lib/permissions";
import { CreateLayoutForm } from "@/components/layout-editor/create-layout";
import { ImportLayoutFile } from "@/components/item-actions";
import { NextStepSlot } from "@/app/(app)/s/[studioId]/next-step-slot";

export const metadata: Metadata = { title: "Layouts" };

export default async function LayoutsPage({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const layouts = await listLayouts({ studioId: studio.id });
  const write = can(studio.role, "studio:write");
  return (
    <>
    <NextStepSlot studio={studio} />
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_340px]">
      <section className="card table-scroll p-0">
        <table className="w-full text-sm" data-testid="layouts-table">
          <caption className="px-5 pt-4 text-left font-semibold">Layouts (controllers)</caption>
          <thead className="text-left text-muted"><tr><th className="px-5 py-2 font-medium">Name</th><th className="px-2 py-2 font-medium">Surface</th><th className="px-2 py-2 font-medium">Pads</th><th className="px-2 py-2 font-medium">Pedal</th><th className="px-5 py-2 font-medium">Audits</th></tr></thead>
          <tbody>
            {layouts.map((l) => (
              <tr key={l.id} className="border-t border-line">
                <td className="px-5 py-2"><Link href={`/s/${studio.id}/layouts/${l.id}`}>{l.name}</Link></td>
                <td className="px-2 py-2">{l.kind === "grid" ? <span className="num">{l.rows} × {l.cols} grid</span> : "trigger zones"}</td>
                <td className="num px-2 py-2">{l.pads}</td>
                <td className="px-2 py-2">{l.pedal ? "hi-hat pedal" : "—"}</td>
                <td className="px-5 py-2"><Link href={`/s/${studio.id}/audits?layoutId=${l.id}`}>audits</Link></td>
              </tr>
            ))}
            {layouts.length === 0 && <tr><td colSpan={5} className="px-5 py-4 text-muted">No layouts yet. A layout is your pad controller: which pad sends which note, and what it should play.{write ? " Add one with “New layout”." : ""}</td></tr>}
          </tbody>
        </table>
      </section>
      {write && (
        <aside className="space-y-6">
          <section className="card space-y-2">
            <h2>Suggest one for a kit</h2>
            <p className="text-sm text-muted">Give your controller&apos;s pads or trigger zones and a kit: Kitwright lays the kit out and says why.</p>
            <Link className="btn-quiet" href={`/s/${studio.id}/layouts/suggest`} data-testid="suggest-link">Suggest a layout</Link>
          </section>
          <section className="card space-y-3" id="new-layout"><h2>New layout</h2><CreateLayoutForm studioId={studio.id} /></section>
          <section className="card"><ImportLayoutFile studioId={studio.id} label="Import a layout file (kitwright.layout/v1)" /></section>
        </aside>
      )}
    </div>
    </>
  );
}
