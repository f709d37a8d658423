"use client";
// Live progress of a library: counts per state, polled (components/data/progress.ts) every 1.5 s while samples
// are queued or measuring, or while the library is being catalogued after a change.
import { useEffect, useRef } from "react";
import { useRouter } from "next/navigation";
import { useProgress } from "../data/progress";
import { useRefreshSamples } from "../data/samples";
import { STATE_LOOK } from "./state-counts";
import type { LibraryProgress as Progress } from "@/lib/api-types/libraries";

export function LibraryProgress({ studioId, libraryId, initial }: { studioId: string; libraryId: string; initial: Progress }) {
  const { data } = useProgress(studioId, libraryId, initial);
  const refreshSamples = useRefreshSamples(libraryId);
  const router = useRouter();
  const p = data ?? initial;
  const done = p.catalogued + p.rejected;
  const pct = p.total ? Math.round((done / p.total) * 100) : 0;
  // when the work settles (or the library is catalogued again), refresh the table and the server parts
  const last = useRef(`${p.pending}|${p.healthComputedAt}`);
  useEffect(() => {
    const now = `${p.pending}|${p.healthComputedAt}`;
    if (now !== last.current) {
      last.current = now;
      refreshSamples();
      if (p.pending === 0) router.refresh();
    }
  }, [p.pending, p.healthComputedAt, refreshSamples, router]);
  return (
    <section className="card space-y-3" aria-live="polite" data-testid="progress">
      <div className="flex items-baseline justify-between">
        <h3 className="font-semibold">Measuring and cataloguing</h3>
        <span className="text-sm" data-testid="progress-status">{p.total === 0 ? "no samples yet" : p.pending > 0 ? `working: ${p.pending} to go` : p.cataloguing ? "Cataloguing into instruments and layers…" : "all catalogued"}</span>
      </div>
      <div className="h-2 w-full overflow-hidden rounded bg-paper" role="progressbar" aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} aria-label="Samples catalogued">
        <div className="h-full bg-brand transition-all" style={{ width: `${pct}%` }} />
      </div>
      <dl className="grid grid-cols-[repeat(auto-fit,minmax(5.25rem,1fr))] gap-2 text-sm">
        {(["queued", "measuring", "measured", "catalogued", "rejected"] as const).map((k) => (
          <div key={k} className={`rounded border px-2 py-1 ${STATE_LOOK[k].cls}`} data-testid={`count-${k}`}>
            <dt className="text-xs"><span aria-hidden>{STATE_LOOK[k].icon}</span> {STATE_LOOK[k].word}</dt>
            <dd className="num text-lg">{p[k]}</dd>
          </div>
        ))}
      </dl>
      {p.healthComputedAt && <p className="text-xs text-muted">Catalogued into instruments and layers at {p.healthComputedAt.replace("T", " ").slice(0, 19)} UTC.</p>}
    </section>
  );
}
