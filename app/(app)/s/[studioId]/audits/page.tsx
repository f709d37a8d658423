import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listAudits } from "@/lib/server/kits/audits";
import { listLayouts } from "@/lib/server/kits/layouts";
import { listKits } from "@/lib/server/kits/kits";
import { can } from "@/lib/permissions";
import { RunAuditForm } from "@/components/audit/run-audit";
import { compareHref, lastKitByLayout, previousAudit } from "@/components/audit/audit-links";

export const metadata: Metadata = { title: "Audits" };

export default async function AuditsPage({ params, searchParams }: { params: Promise<{ studioId: string }>; searchParams: Promise<{ layoutId?: string; kitId?: string }> }) {
  const { studioId } = await params;
  const { layoutId: raw, kitId: rawKit } = await searchParams;
  const { studio } = await requireStudio(studioId);
  const [layouts, kits] = await Promise.all([listLayouts({ studioId: studio.id }), listKits({ studioId: studio.id })]);
  const layoutId = raw && layouts.some((l) => l.id === raw) ? raw : undefined;
  const all = await listAudits({ studioId: studio.id });
  const audits = layoutId ? all.filter((a) => a.layoutId === layoutId) : all;
  const write = can(studio.role, "studio:write");
  const layoutName = layoutId ? layouts.find((l) => l.id === layoutId)?.name : undefined;
  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_340px]">
      <section className="card min-w-0 p-0">
        <div className="table-scroll">
        <table className="w-full text-sm" data-testid="audits-table">
          <caption className="px-5 pt-4 text-left font-semibold">
            {layoutName ? <>Audits of “{layoutName}” <Link className="ml-2 text-xs font-normal" href={`/s/${studio.id}/audits`}>show all</Link></> : "Audits, newest first"}
          </caption>
          <thead className="text-left text-muted"><tr><th className="px-5 py-2 font-medium">When (UTC)</th><th className="px-2 py-2 font-medium">Layout</th><th className="px-2 py-2 font-medium">Kit</th><th className="px-2 py-2 font-medium">Score</th><th className="px-2 py-2 font-medium">Silent</th><th className="px-2 py-2 font-medium">Stand-in</th><th className="px-2 py-2 font-medium">Conflicts</th><th className="px-5 py-2 font-medium"><span className="sr-only">Compare</span></th></tr></thead>
          <tbody>
            {audits.map((a) => (
              <tr key={a.id} className="border-t border-line">
                <td className="num px-5 py-2"><Link href={`/s/${studio.id}/audits/${a.id}`}>{a.createdAt.replace("T", " ").slice(0, 19)}</Link></td>
                <td className="px-2 py-2"><Link href={`/s/${studio.id}/audits?layoutId=${a.layoutId}`}>{a.layoutName}</Link></td>
                <td className="px-2 py-2">{a.kitName}</td>
                <td className="num px-2 py-2 whitespace-nowrap">{a.score}/100</td>
                <td className="num px-2 py-2">{a.silentPads > 0 ? <span className="text-bad">✕ {a.silentPads}</span> : "0"}</td>
                <td className="num px-2 py-2">{a.standInPads}</td>
                <td className="num px-2 py-2">{a.conflicts > 0 ? <span className="text-warn">⚠ {a.conflicts}</span> : "0"}</td>
                <td className="px-5 py-2 whitespace-nowrap">{(() => { const prev = previousAudit(a, all.filter((x) => x.layoutId === a.layoutId)); return prev ? <Link href={compareHref(studio.id, prev.id, a.id)} data-testid="row-compare-previous">Compare with the previous audit</Link> : null; })()}</td>
              </tr>
            ))}
            {audits.length === 0 && <tr><td colSpan={8} className="px-5 py-4 text-muted">No audits yet.</td></tr>}
          </tbody>
        </table>
        </div>
      </section>
      {write && (
        <aside className="card min-w-0 space-y-3 overflow-hidden">
          <h2>Run an audit</h2>
          <p className="text-sm text-muted">Checks every pad and pedal zone of a layout against a kit and the studio’s catalogue as it is now.</p>
          <RunAuditForm studioId={studio.id} layouts={layouts} kits={kits} layoutId={layoutId} kitId={rawKit && kits.some((k) => k.id === rawKit) ? rawKit : undefined} lastKits={lastKitByLayout(all)} />
        </aside>
      )}
    </div>
  );
}
