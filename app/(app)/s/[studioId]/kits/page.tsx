import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listKits } from "@/lib/server/kits/kits";
import { listLibraries } from "@/lib/server/catalogue/libraries";
import { can } from "@/lib/permissions";
import { CreateKitForm } from "@/components/kit/create-kit";
import { ImportKitFile } from "@/components/item-actions";
import { NextStepSlot } from "@/app/(app)/s/[studioId]/next-step-slot";

export const metadata: Metadata = { title: "Kits" };

export default async function KitsPage({ params, searchParams }: { params: Promise<{ studioId: string }>; searchParams: Promise<{ library?: string }> }) {
  const { studioId } = await params;
  const { library } = await searchParams;
  const { studio } = await requireStudio(studioId);
  const [kits, libs] = await Promise.all([listKits({ studioId: studio.id }), listLibraries({ studioId: studio.id })]);
  const libraries = libs.map((l) => ({ id: l.id, name: l.name, instruments: l.instruments }));
  const write = can(studio.role, "studio:write");
  return (
    <>
    <NextStepSlot studio={studio} />
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_340px]">
      <section className="card table-scroll p-0">
        <table className="w-full text-sm" data-testid="kits-table">
          <caption className="px-5 pt-4 text-left font-semibold">Kits</caption>
          <thead className="text-left text-muted"><tr><th className="px-5 py-2 font-medium">Name</th><th className="px-2 py-2 font-medium">Slots filled</th><th className="px-5 py-2 font-medium">Changed (UTC)</th></tr></thead>
          <tbody>
            {kits.map((k) => (
              <tr key={k.id} className="border-t border-line">
                <td className="px-5 py-2"><Link href={`/s/${studio.id}/kits/${k.id}`}>{k.name}</Link></td>
                <td className="num px-2 py-2">{k.filled} / {k.slots}</td>
                <td className="num px-5 py-2">{k.updatedAt.replace("T", " ").slice(0, 16)}</td>
              </tr>
            ))}
            {kits.length === 0 && <tr><td colSpan={3} className="px-5 py-4 text-muted">No kits yet. A kit names its slots (Kick, Snare, Tom 1…) and puts one instrument in each.{write ? " Make one with “New kit”: Kitwright can fill it from a library." : ""}</td></tr>}
          </tbody>
        </table>
      </section>
      {write && (
        <aside className="space-y-6">
          <section className="card space-y-3" id="new-kit"><h2>New kit</h2><CreateKitForm studioId={studio.id} libraries={libraries} library={library} /></section>
          <section className="card"><ImportKitFile studioId={studio.id} label="Import a kit file (kitwright.kit/v1)" /></section>
        </aside>
      )}
    </div>
    </>
  );
}
