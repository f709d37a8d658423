// The hi-hat pedal's controller range 0-127 as a bar: one band per zone with its openness in words, a mark
// for recorded / stand-in / silent when known, and uncovered ranges hatched and labelled.
import type { Outcome } from "@/lib/audit/types";
import { OutcomeIcon } from "./outcome-icon";

export interface PedalBand { low: number; high: number; text: string; mark: Outcome | "none" }

export function PedalZonesBar({ zones, closedAt }: { zones: PedalBand[]; closedAt: "low" | "high" }) {
  const W = 128;
  const covered = new Array<boolean>(128).fill(false);
  for (const z of zones) for (let v = Math.max(0, z.low); v <= Math.min(127, z.high); v++) covered[v] = true;
  const gaps: Array<[number, number]> = [];
  for (let v = 0; v < 128; v++) if (!covered[v]) { const s = v; while (v < 127 && !covered[v + 1]) v++; gaps.push([s, v]); }
  return (
    <figure className="space-y-1" data-testid="pedal-bar">
      <div className="relative h-12 overflow-hidden rounded border border-line bg-paper">
        {gaps.map(([a, b]) => (
          <div key={`g${a}`} className="absolute inset-y-0 flex items-center justify-center text-[10px] text-bad" title={`uncovered ${a}-${b}`}
            style={{ left: `${(a / W) * 100}%`, width: `${((b - a + 1) / W) * 100}%`, backgroundImage: "repeating-linear-gradient(45deg, transparent 0 4px, rgba(162,39,29,.25) 4px 6px)" }}>gap</div>
        ))}
        {zones.map((z, i) => (
          <div key={i} className={`absolute inset-y-1 flex flex-col items-center justify-center overflow-hidden rounded-sm border text-[11px] leading-tight ${i % 2 ? "border-brand/40 bg-brand-soft" : "border-line bg-card"}`}
            style={{ left: `${(z.low / W) * 100}%`, width: `${((z.high - z.low + 1) / W) * 100}%` }} title={`${z.low}-${z.high}: ${z.text}`}>
            <span className="flex items-center gap-1">{z.mark !== "none" && <OutcomeIcon outcome={z.mark} size={11} />}{z.text}</span>
            <span className="num text-muted">{z.low}-{z.high}</span>
          </div>
        ))}
      </div>
      <figcaption className="flex justify-between text-xs text-muted">
        <span className="num">0 {closedAt === "low" ? "(closed)" : "(open)"}</span>
        <span>pedal controller value</span>
        <span className="num">127 {closedAt === "high" ? "(closed)" : "(open)"}</span>
      </figcaption>
    </figure>
  );
}
