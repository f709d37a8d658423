import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { getAudit, listAudits } from "@/lib/server/kits/audits";
import { AppError } from "@/lib/server/errors";
import { can } from "@/lib/permissions";
import { EXPORT_FORMATS } from "@/lib/audit/export-formats";
import { PadChart } from "@/components/audit/pad-chart";
import { FindingsTable } from "@/components/audit/findings-table";
import { PedalZonesBar } from "@/components/audit/pedal-bar";
import { OutcomeIcon } from "@/components/audit/outcome-icon";
import { CompareWith, PrintButton, RunAuditForm } from "@/components/audit/run-audit";
import { paths } from "@/components/data/paths";

export const metadata: Metadata = { title: "Audit" };

export default async function AuditPage({ params }: { params: Promise<{ studioId: string; auditId: string }> }) {
  const { studioId, auditId } = await params;
  const { studio } = await requireStudio(studioId);
  if (!/^[0-9a-f-]{36}$/i.test(auditId)) notFound();
  const a = await getAudit({ studioId: studio.id, auditId }).catch((e) => { if (e instanceof AppError && e.status === 404) notFound(); throw e; });
  const r = a.result;
  const others = (await listAudits({ studioId: studio.id, layoutId: a.layoutId })).filter((x) => x.id !== a.id);
  const s = r.summary;
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
      <p className="no-print text-sm"><Link href={`/s/${studio.id}/audits?layoutId=${a.layoutId}`}>← Audits of this layout</Link> · <Link href={`/s/${studio.id}/layouts/${a.layoutId}`}>Edit the layout</Link>{a.kitId && <> · <Link href={`/s/${studio.id}/kits/${a.kitId}`}>Edit the kit</Link></>}</p>
      <header className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <h2 className="text-xl" data-testid="audit-title">“{a.layoutName}” against “{a.kitName}”</h2>
          <p className="text-sm text-muted">Audited <span className="num">{a.createdAt.replace("T", " ").slice(0, 19)}</span> UTC{a.createdBy ? ` by ${a.createdBy}` : ""}</p>
        </div>
        <div className="no-print flex flex-wrap gap-2">
          {EXPORT_FORMATS.map((f) => <a key={f.id} className="btn-quiet" href={paths.auditExport(studio.id, a.id, f.id)} download data-testid={`export-${f.id}`}>{f.label}</a>)}
          <PrintButton />
        </div>
      </header>

      <section aria-labelledby="conflicts-h" className={`card space-y-2 ${r.conflicts.length ? "border-warn/50" : ""}`} data-testid="conflicts">
        <h2 id="conflicts-h">{r.conflicts.length ? `⚠ Conflicts (${r.conflicts.length})` : "✓ No conflicts"}</h2>
        {r.conflicts.length > 0 && (
          <ul className="space-y-1 text-sm">
            {r.conflicts.map((c, i) => <li key={i}><span className="tag mr-2 border-warn/40 bg-warn-soft text-warn">{c.kind}</span>{c.message}</li>)}
          </ul>
        )}
      </section>

      <section className="grid gap-4 md:grid-cols-[220px_1fr]">
        <div className="card">
          <p className="text-sm text-muted">Score</p>
          <p className="num text-4xl font-semibold" data-testid="audit-score">{r.score.value.toFixed(1)}</p>
          <ul className="mt-2 space-y-0.5 text-sm" data-testid="audit-summary">
            <li className="flex items-center gap-1"><OutcomeIcon outcome="direct" /> <span className="num">{s.direct}</span> direct</li>
            <li className="flex items-center gap-1"><OutcomeIcon outcome="stand-in" /> <span className="num">{s.standIn}</span> stand-in</li>
            <li className="flex items-center gap-1"><OutcomeIcon outcome="silent" /> <span className="num">{s.silent}</span> silent</li>
            {s.pedalZones > 0 && <li>pedal zones recorded: <span className="num">{s.pedalZonesRecorded}/{s.pedalZones}</span></li>}
          </ul>
        </div>
        <div className="card space-y-2 text-sm">
          <h3 className="font-semibold">How the score is computed</h3>
          <pre className="num overflow-x-auto whitespace-pre-wrap rounded bg-paper p-2 text-xs">{r.score.formula}</pre>
          <p className="num text-xs">= clamp(100 × {r.score.itemSum.toFixed(3)} / {r.score.items} − {r.score.conflictPenalty}, 0, 100) = {r.score.value.toFixed(1)}</p>
        </div>
      </section>

      <section className="card space-y-3">
        <div className="flex flex-wrap items-center justify-between gap-3">
          <h2>Pad chart</h2>
          <div className="no-print"><CompareWith studioId={studio.id} auditId={a.id} others={others.map((o) => ({ id: o.id, older: o.createdAt < a.createdAt || (o.createdAt === a.createdAt && o.id < a.id), label: `${o.createdAt.replace("T", " ").slice(0, 19)} · ${o.kitName} · score ${o.score.toFixed(1)}` }))} /></div>
        </div>
        <PadChart studioId={studio.id} auditId={a.id} result={r} />
      </section>

      {r.pedal && (
        <section className="card space-y-3" data-testid="audit-pedal">
          <h2>Hi-hat pedal (CC {r.pedal.controller}, channel {r.pedal.channel})</h2>
          <PedalZonesBar closedAt={r.pedal.closedAt} zones={r.pedal.zones.map((z) => ({ low: z.low, high: z.high, text: z.outcome === "stand-in" ? `${z.requested} → ${z.plays}` : z.outcome === "silent" ? `${z.requested}: silent` : `${z.requested}`, mark: z.outcome }))} />
          {r.pedal.uncovered.length > 0 && <p className="text-sm text-bad">✕ Controller values no zone covers: {r.pedal.uncovered.map((u) => `${u.low}-${u.high}`).join(", ")}</p>}
        </section>
      )}

      <section className="card space-y-3">
        <h2>Findings</h2>
        <FindingsTable result={r} />
      </section>

      {can(studio.role, "studio:write") && (
        <section className="no-print card max-w-md space-y-3">
          <h2>Audit again</h2>
          <p className="text-sm text-muted">After new samples arrive or the kit changes, run the audit again and compare.</p>
          <RunAuditForm studioId={studio.id} layouts={[{ id: a.layoutId, name: a.layoutName }]} kits={a.kitId ? [{ id: a.kitId, name: a.kitName }] : []} />
        </section>
      )}
    </div>
  );
}
