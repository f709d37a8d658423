import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listKits } from "@/lib/server/kits/kits";
import { can } from "@/lib/permissions";
import { CreateKitForm } from "@/components/kit/create-kit";
import { ImportKitFile } from "@/components/item-actions";

export const metadata: Metadata = { title: "Kits" };

export default async function KitsPage({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const kits = await listKits({ studioId: studio.id });
  const write = can(studio.role, "studio:write");
  return (
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
            {kits.length === 0 && <tr><td colSpan={3} className="px-5 py-4 text-muted">No kits yet.{write ? " Create one on the right." : ""}</td></tr>}
          </tbody>
        </table>
      </section>
      {write && (
        <aside className="space-y-6">
          <section className="card space-y-3"><h2>New kit</h2><CreateKitForm studioId={studio.id} /></section>
          <section className="card"><ImportKitFile studioId={studio.id} label="Import a kit file (kitwright.kit/v1)" /></section>
        </aside>
      )}
    </div>
  );
}
