import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { getAudit, listAudits } from "@/lib/server/kits/audits";
import { getLayout } from "@/lib/server/kits/layouts";
import { listKits } from "@/lib/server/kits/kits";
import { AppError } from "@/lib/server/errors";
import { can } from "@/lib/permissions";
import { EXPORT_FORMATS } from "@/lib/audit/export-formats";
import type { LayoutSurface } from "@/lib/audit/types";
import { PadChart } from "@/components/audit/pad-chart";
import { FindingsTable } from "@/components/audit/findings-table";
import { PedalZonesBar } from "@/components/audit/pedal-bar";
import { AuditAttention, ScoreCard } from "@/components/audit/score-card";
import { CompareWith, PrintButton, RunAuditForm } from "@/components/audit/run-audit";
import { ComparePrevious, lastKitByLayout, previousAudit, ranBefore } from "@/components/audit/audit-links";
import { strokeName } from "@/components/audit/words";
import { paths } from "@/components/data/paths";

export const metadata: Metadata = { title: "Audit" };

export default async function AuditPage({ params }: { params: Promise<{ studioId: string; auditId: string }> }) {
  const { studioId, auditId } = await params;
  const { studio } = await requireStudio(studioId);
  if (!/^[0-9a-f-]{36}$/i.test(auditId)) notFound();
  const a = await getAudit({ studioId: studio.id, auditId }).catch((e) => { if (e instanceof AppError && e.status === 404) notFound(); throw e; });
  const r = a.result;
  const write = can(studio.role, "studio:write");
  const [sameLayout, layout, kits] = await Promise.all([
    listAudits({ studioId: studio.id, layoutId: a.layoutId }),
    getLayout({ studioId: studio.id, layoutId: a.layoutId }).catch(() => null),
    write ? listKits({ studioId: studio.id }) : Promise.resolve([]),
  ]);
  // the layout's own grid, when every audited pad still fits in it (the layout may have changed since)
  const surface: LayoutSurface | null = layout && (layout.layout.surface.kind !== "grid" || r.pads.every((p) => p.row && p.col && p.row <= (layout.layout.surface as { rows: number }).rows && p.col <= (layout.layout.surface as { cols: number }).cols)) ? layout.layout.surface : null;
  const previous = previousAudit(a, sameLayout);
  const others = sameLayout.filter((x) => x.id !== a.id && x.id !== previous?.id);
  const when = (s: string) => s.replace("T", " ").slice(0, 16);
  const kitHref = a.kitId ? `/s/${studio.id}/kits/${a.kitId}` : null;
  return (
    <div className="space-y-6">
      {/* print stylesheet for the pad chart to keep beside the kit */}
      <style>{`@media print {
        @page { margin: 12mm; }
        header.app-header, nav, footer { display: none !important; }
        .card { box-shadow: none !important; border-color: #999 !important; break-inside: avoid; }
        [data-testid="pad-chart"] button { border-color: #444 !important; min-height: 0; }
        [data-testid="pad-chart"] { gap: 4px; }
        a { text-decoration: none; color: inherit; }
      }`}</style>
      <p className="no-print text-sm"><Link href={`/s/${studio.id}/audits?layoutId=${a.layoutId}`}>← Audits of this layout</Link> · <Link href={`/s/${studio.id}/layouts/${a.layoutId}`}>{write ? "Edit" : "See"} the layout</Link>{kitHref && <> · <Link href={kitHref}>{write ? "Edit" : "See"} the kit</Link></>}</p>
      <header className="flex flex-wrap items-start justify-between gap-4">
        <div className="min-w-0">
          <h2 className="text-xl [overflow-wrap:anywhere]" data-testid="audit-title">“{a.layoutName}” against “{a.kitName}”</h2>
          <p className="text-sm text-muted">Audited <span className="num">{when(a.createdAt)}</span> UTC{a.createdBy ? ` by ${a.createdBy}` : ""}</p>
        </div>
        <div className="no-print flex flex-wrap gap-2">
          {EXPORT_FORMATS.map((f) => <a key={f.id} className="btn-quiet" href={paths.auditExport(studio.id, a.id, f.id)} download data-testid={`export-${f.id}`}>{f.label}</a>)}
          <PrintButton />
        </div>
      </header>

      <div className="no-print flex flex-wrap items-center gap-3" data-testid="compare-bar">
        <ComparePrevious studioId={studio.id} auditId={a.id} previousId={previous?.id ?? null} />
        <CompareWith studioId={studio.id} auditId={a.id} others={others.map((o) => ({ id: o.id, older: ranBefore(o, a), label: `${when(o.createdAt)} · ${o.kitName} · ${o.score}/100` }))} />
      </div>

      <div className="grid gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <ScoreCard result={r} />
        <AuditAttention result={r} kitHref={kitHref} />
      </div>

      <section className="card space-y-3" aria-labelledby="chart-h">
        <h2 id="chart-h">Pad chart</h2>
        <PadChart studioId={studio.id} auditId={a.id} result={r} surface={surface} />
      </section>

      {r.pedal && (
        <section className="card space-y-3" data-testid="audit-pedal">
          <h2>Hi-hat pedal <span className="text-sm font-normal text-muted" title={`MIDI 1.0 control change ${r.pedal.controller} on channel ${r.pedal.channel}`}>controller {r.pedal.controller}, channel {r.pedal.channel}</span></h2>
          <PedalZonesBar closedAt={r.pedal.closedAt} zones={r.pedal.zones.map((z) => ({ low: z.low, high: z.high, text: z.outcome === "stand-in" ? `${strokeName(z.family, z.requested)}: plays ${strokeName(z.family, z.plays)}` : z.outcome === "silent" ? `${strokeName(z.family ?? "hi-hat", z.requested)}: silent` : strokeName(z.family, z.requested), mark: z.outcome }))} />
        </section>
      )}

      <section className="card space-y-3" aria-labelledby="findings-h">
        <h2 id="findings-h">Every pad</h2>
        <FindingsTable result={r} />
      </section>

      {write && (
        <section className="no-print card max-w-md space-y-3">
          <h2>Audit again</h2>
          <p className="text-sm text-muted">After new samples arrive or the kit changes, run the audit again and compare.</p>
          <RunAuditForm studioId={studio.id} layouts={[{ id: a.layoutId, name: a.layoutName }]} kits={kits.length ? kits : a.kitId ? [{ id: a.kitId, name: a.kitName }] : []} kitId={a.kitId ?? undefined} lastKits={lastKitByLayout(sameLayout)} />
        </section>
      )}
    </div>
  );
}
