import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { libraryHealth } from "@/lib/server/catalogue/reports";
import { MicOffsets } from "@/components/library/mic-offsets";

export const metadata: Metadata = { title: "Library health" };

const SEVERITY = {
  error: { title: "Problems", icon: "✕", cls: "border-bad/30 bg-bad-soft text-bad", words: "These will be heard or break playback: fix or replace the files." },
  warning: { title: "Warnings", icon: "▲", cls: "border-warn/40 bg-warn-soft text-warn", words: "Worth a look before the library is used." },
  info: { title: "Notes", icon: "ℹ", cls: "border-line bg-paper text-ink", words: "Facts about the library that may matter." },
} as const;

export default async function HealthPage({ params }: { params: Promise<{ studioId: string; libraryId: string }> }) {
  const { studioId, libraryId } = await params;
  const { studio } = await requireStudio(studioId);
  const h = await libraryHealth({ studioId: studio.id, libraryId });
  const base = `/s/${studio.id}/libraries/${libraryId}`;
  if (!h.computedAt) return <p className="card text-sm text-muted" data-testid="health">The health report appears once samples are measured and sorted.</p>;
  const groups = (["error", "warning", "info"] as const).map((sev) => ({ sev, items: h.findings.filter((f) => f.severity === sev) }));
  return (
    <div className="space-y-4" data-testid="health">
      <p className="text-sm text-muted">Checked <span className="num">{h.sampleCount}</span> catalogued samples at {h.computedAt.replace("T", " ").slice(0, 19)} UTC: <span className="num">{h.findings.length}</span> findings.</p>
      {h.findings.length === 0 && <p className="card text-sm">✓ Nothing to report: formats agree, no clipping, no late starts or cut tails, layers in order.</p>}
      {groups.filter((g) => g.items.length).map(({ sev, items }) => (
        <section key={sev} className="space-y-2" aria-labelledby={`sev-${sev}`}>
          <h3 id={`sev-${sev}`} className="font-semibold"><span aria-hidden>{SEVERITY[sev].icon}</span> {SEVERITY[sev].title} <span className="num text-muted">({items.length})</span></h3>
          <p className="text-xs text-muted">{SEVERITY[sev].words}</p>
          <ul className="space-y-2">
            {items.map((f, i) => (
              <li key={i} className={`rounded-md border p-3 text-sm ${SEVERITY[sev].cls}`} data-testid="finding" data-code={f.code}>
                <p><span className="tag mr-2 border-current/30">{f.code}</span>{f.message}</p>
                {f.samples.length > 0 && (
                  <ul className="mt-2 flex flex-wrap gap-x-3 gap-y-1 text-xs text-ink">
                    {f.samples.slice(0, 12).map((s) => <li key={s.id}><Link href={`${base}?sample=${s.id}&q=${encodeURIComponent(s.path.split("/").pop() ?? "")}`}>{s.path}</Link></li>)}
                    {f.sampleIds.length > 12 && <li className="text-muted">and {f.sampleIds.length - 12} more</li>}
                  </ul>
                )}
              </li>
            ))}
          </ul>
        </section>
      ))}
      {h.micSeries.length > 0 && <MicOffsets series={h.micSeries} />}
    </div>
  );
}
