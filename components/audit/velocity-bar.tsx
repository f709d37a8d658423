// Velocities 1-127 as a bar on a marked scale: each velocity layer a band (two alternating shades) labelled with
// its round robins ("3 takes"), the gaps (velocities no layer covers, where nothing sounds) hatched and labelled "gap", the
// same told in text for screen readers, and a legend (VelocityLegend) shown once beside the bars it explains.
// The compact form (pad chart) keeps the bands and gaps, without labels or scale.
import type { LayerFinding, VelocityRange } from "@/lib/audit/types";

export const VELOCITY_TICKS = [1, 32, 64, 96, 127] as const;
const pos = (v: number) => ((v - 1) / 127) * 100;
const wid = (a: number, b: number) => ((b - a + 1) / 127) * 100;
export const GAP_HATCH = "repeating-linear-gradient(135deg, transparent 0 3px, color-mix(in srgb, var(--color-bad) 55%, transparent) 3px 5px)";
const range = (a: number, b: number) => (a === b ? `${a}` : `${a}–${b}`);

/** The bar's content in words (for screen readers and the tooltip). */
export function velocityText(layers: LayerFinding[], gaps: VelocityRange[]): string {
  if (!layers.length) return "No velocity layer: nothing sounds.";
  const l = layers.map((x) => `${range(x.velocityLow, x.velocityHigh)} (${x.roundRobins} round robin${x.roundRobins === 1 ? "" : "s"})`).join(", ");
  const g = gaps.length ? ` Nothing sounds at ${gaps.map((x) => range(x.low, x.high)).join(", ")}.` : " Every velocity 1–127 finds a layer.";
  return `${layers.length} velocity layer${layers.length === 1 ? "" : "s"}: ${l}.${g}`;
}

export function VelocityBar({ layers, gaps, compact = false }: { layers: LayerFinding[]; gaps: VelocityRange[]; compact?: boolean }) {
  const text = velocityText(layers, gaps);
  return (
    <div className="w-full" data-testid="velocity-bar">
      <span className="sr-only">{text}</span>
      <div aria-hidden title={text} className={`relative w-full overflow-hidden rounded-sm border border-line bg-paper ${compact ? "h-2.5" : "h-6"}`}>
        {layers.map((l, i) => {
          const w = wid(l.velocityLow, l.velocityHigh);
          return (
            <div key={i} className={`absolute inset-y-0 flex items-center justify-center border-r border-card text-xs font-medium text-ink ${i % 2 ? "bg-brand/45" : "bg-brand/20"}`}
              style={{ left: `${pos(l.velocityLow)}%`, width: `${w}%` }} data-layer={i + 1}>
              {!compact && (w >= 20 ? <span>{l.roundRobins} take{l.roundRobins === 1 ? "" : "s"}</span> : w >= 6 ? <span className="num">{l.roundRobins}</span> : null)}
            </div>
          );
        })}
        {gaps.map((g, i) => (
          <div key={`g${i}`} className="absolute inset-y-0 flex items-center justify-center border-x border-bad/60 text-xs font-semibold text-bad" data-gap={`${g.low}-${g.high}`}
            style={{ left: `${pos(g.low)}%`, width: `${wid(g.low, g.high)}%`, backgroundImage: GAP_HATCH }}>
            {!compact && wid(g.low, g.high) >= 8 && <span className="rounded-sm bg-card/90 px-0.5">gap</span>}
          </div>
        ))}
      </div>
      {!compact && <VelocityScale />}
    </div>
  );
}

/** Tick marks and numbers under a velocity bar: 1, 32, 64, 96, 127. */
export function VelocityScale() {
  return (
    <div aria-hidden className="relative mt-0.5 h-4 text-[11px] leading-none text-muted">
      {VELOCITY_TICKS.map((v) => (
        <span key={v} className="num absolute top-0 flex flex-col items-center" style={{ left: `${pos(v) + (v === 127 ? 100 / 127 : 0)}%`, transform: v === 1 ? "none" : v === 127 ? "translateX(-100%)" : "translateX(-50%)", alignItems: v === 1 ? "flex-start" : v === 127 ? "flex-end" : "center" }}>
          <span className="block h-1 w-px bg-muted" />
          <span className="mt-px">{v}</span>
        </span>
      ))}
    </div>
  );
}

/** What the bars show: layers, round robins, gaps, the velocity scale. */
export function VelocityLegend({ className = "" }: { className?: string }) {
  return (
    <div className={`flex flex-wrap items-center gap-x-4 gap-y-1 text-xs text-muted ${className}`} data-testid="velocity-legend">
      <span className="font-medium text-ink">Velocity bars, 1–127:</span>
      <span className="inline-flex items-center gap-1"><span aria-hidden className="inline-block h-3 w-6 rounded-sm border border-line bg-brand/20" /><span aria-hidden className="-ml-1 inline-block h-3 w-6 rounded-sm border border-line bg-brand/45" /> one band per velocity layer</span>
      <span className="inline-flex items-center gap-1"><span aria-hidden className="rounded-sm border border-line bg-brand/20 px-1 text-ink">3 takes</span> round robins in the layer</span>
      <span className="inline-flex items-center gap-1"><span aria-hidden className="inline-block h-3 w-6 rounded-sm border border-bad/60" style={{ backgroundImage: GAP_HATCH }} /> gap: no layer, nothing sounds</span>
    </div>
  );
}
