// Velocities 1-127 as a bar: each layer a band (alternating shades, its round-robin count inside), the
// velocity gaps hatched and marked "gap" so they read without colour.
import type { LayerFinding, VelocityRange } from "@/lib/audit/types";

export function VelocityBar({ layers, gaps, compact = false }: { layers: LayerFinding[]; gaps: VelocityRange[]; compact?: boolean }) {
  const pos = (v: number) => ((v - 1) / 127) * 100;
  const wid = (a: number, b: number) => ((b - a + 1) / 127) * 100;
  const label = `${layers.length} layer${layers.length === 1 ? "" : "s"}: ${layers.map((l) => `${l.velocityLow}-${l.velocityHigh}×${l.roundRobins}`).join(", ") || "none"}; gaps: ${gaps.map((g) => `${g.low}-${g.high}`).join(", ") || "none"}`;
  return (
    <div className={`relative w-full overflow-hidden rounded-sm border border-line bg-paper ${compact ? "h-3" : "h-5"}`} role="img" aria-label={`Velocity layers ${label}`} title={label} data-testid="velocity-bar">
      {layers.map((l, i) => (
        <div key={i} className={`absolute inset-y-0 border-r border-card ${i % 2 ? "bg-brand/45" : "bg-brand/25"} flex items-center justify-center text-[9px] text-ink`}
          style={{ left: `${pos(l.velocityLow)}%`, width: `${wid(l.velocityLow, l.velocityHigh)}%` }}>
          {!compact && `×${l.roundRobins}`}
        </div>
      ))}
      {gaps.map((g, i) => (
        <div key={`g${i}`} className="absolute inset-y-0 flex items-center justify-center text-[9px] font-semibold text-bad"
          style={{ left: `${pos(g.low)}%`, width: `${wid(g.low, g.high)}%`, backgroundImage: "repeating-linear-gradient(45deg, transparent 0 3px, rgba(162,39,29,.35) 3px 5px)" }}>
          {!compact && "gap"}
        </div>
      ))}
    </div>
  );
}
