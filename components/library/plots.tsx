"use client";
// Plots of a library (recharts): the loudness ladder of one instrument + articulation (+ mic) group — each
// velocity layer a step over its velocity range at its mean strike loudness, each round robin a dot, gaps
// between layers visible — and the feature map: strike centroid against decay, every family with its own
// colour AND marker shape, samples flagged for review ringed, so mislabelled files stand apart.
import { useMemo, useState } from "react";
import { CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis } from "recharts";
import type { FeaturePoint, LadderGroup } from "@/lib/api-types/libraries";
import { Select } from "@/components/ui/select";

const SHAPES = ["circle", "square", "triangle", "diamond", "cross", "star", "wye"] as const;
const hz = (v: number) => (v >= 1000 ? `${(v / 1000).toFixed(v >= 10_000 ? 0 : 1)} kHz` : `${Math.round(v)} Hz`);
const sec = (v: number) => (v >= 1 ? `${v.toFixed(1)} s` : `${Math.round(v * 1000)} ms`);
// categorical colours from the theme (app/globals.css --color-chart-N, each with a dark value)
const COLOURS = Array.from({ length: 13 }, (_, i) => `var(--color-chart-${i + 1})`);
// axis, grid, tooltip and legend drawn with the theme's tokens so both themes read
const AXIS = { stroke: "var(--color-line-strong)", tick: { fill: "var(--color-muted)", fontSize: 12 } };
const AXIS_LABEL = { fill: "var(--color-muted)", fontSize: 12 };
const TOOLTIP = { contentStyle: { background: "var(--color-card)", border: "1px solid var(--color-line)", color: "var(--color-ink)", borderRadius: 6 }, itemStyle: { color: "var(--color-ink)" }, labelStyle: { color: "var(--color-muted)" } };
const legendText = (v: string) => <span className="text-ink">{v}</span>;

export function LoudnessLadder({ groups }: { groups: LadderGroup[] }) {
  const [key, setKey] = useState(groups.find((g) => g.layers.length > 1)?.key ?? groups[0]?.key ?? "");
  const g = groups.find((x) => x.key === key);
  const { steps, dots } = useMemo(() => {
    const steps: { v: number; lufs: number | null }[] = [];
    const dots: { v: number; lufs: number; name: string }[] = [];
    for (const l of g?.layers ?? []) {
      steps.push({ v: l.velocityLow, lufs: l.meanStrikeLufs }, { v: l.velocityHigh, lufs: l.meanStrikeLufs }, { v: l.velocityHigh + 0.5, lufs: null });
      const w = Math.max(1, l.velocityHigh - l.velocityLow);
      l.members.forEach((m, i) => m.strikeLufs !== null && dots.push({ v: l.velocityLow + ((i + 1) / (l.members.length + 1)) * w, lufs: m.strikeLufs, name: `layer ${l.index + 1}, RR ${m.roundRobin}` }));
    }
    return { steps, dots };
  }, [g]);
  if (!groups.length) return <p className="text-sm text-muted">No layer groups yet.</p>;
  return (
    <section className="card space-y-3" data-testid="ladder">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h3 className="font-semibold">Loudness ladder</h3>
        <div className="w-full sm:w-auto">
          <label htmlFor="ladder-group" className="label">Instrument / articulation / mic</label>
          <Select id="ladder-group" className="field w-full sm:w-80" value={key} onChange={(e) => setKey(e.target.value)}>
            {groups.map((x) => <option key={x.key} value={x.key}>{x.label} ({x.layers.length} layers)</option>)}
          </Select>
        </div>
      </div>
      {g && (
        <>
          <div className="h-72" role="img" aria-label={`Loudness ladder of ${g.label}: ${g.layers.map((l) => `layer ${l.index + 1} at ${l.meanStrikeLufs.toFixed(1)} LUFS, velocity ${l.velocityLow}-${l.velocityHigh}, ${l.members.length} round robins`).join("; ")}`}>
            <ResponsiveContainer width="100%" height="100%">
              <ComposedChart margin={{ top: 10, right: 16, bottom: 20, left: 24 }}>
                <CartesianGrid strokeDasharray="3 3" stroke="var(--color-line)" />
                <XAxis type="number" dataKey="v" domain={[1, 127]} ticks={[1, 16, 32, 48, 64, 80, 96, 112, 127]} {...AXIS} label={{ value: "MIDI velocity", position: "insideBottom", offset: -10, ...AXIS_LABEL }} />
                <YAxis type="number" dataKey="lufs" domain={[(m: number) => Math.floor(m - 3), (m: number) => Math.ceil(m + 3)]} width={48} {...AXIS} label={{ value: "strike loudness (LUFS)", angle: -90, position: "left", offset: 4, style: { textAnchor: "middle" }, ...AXIS_LABEL }} />
                <Tooltip {...TOOLTIP} formatter={(v) => (typeof v === "number" ? v.toFixed(1) : String(v))} />
                <Legend verticalAlign="top" formatter={legendText} />
                <Line data={steps} dataKey="lufs" name="layer (mean, over its velocity range)" stroke="var(--color-chart-1)" strokeWidth={3} dot={false} connectNulls={false} isAnimationActive={false} />
                <Scatter data={dots} dataKey="lufs" name="round robins" fill="var(--color-chart-3)" shape="diamond" isAnimationActive={false} />
              </ComposedChart>
            </ResponsiveContainer>
          </div>
          <p className="text-xs text-muted">Layers counted from {g.countFrom === "names" ? "the names" : g.countFrom === "gaps" ? "the loudness gaps" : "a single group"}. {g.criterion}</p>
        </>
      )}
    </section>
  );
}

/** Ticks of a log axis on the 1-2-5 series between the data's extremes (widened by 1.5x like the domain). */
function logTicks(values: number[]): { domain: [number, number]; ticks: number[] } {
  const pos = values.filter((v) => v > 0 && Number.isFinite(v));
  if (!pos.length) return { domain: [1, 10], ticks: [1, 10] };
  const lo = Math.min(...pos) / 1.5;
  const hi = Math.max(...pos) * 1.5;
  const ticks: number[] = [];
  for (let e = Math.floor(Math.log10(lo)); e <= Math.ceil(Math.log10(hi)); e++) {
    for (const m of [1, 2, 5]) {
      const t = m * 10 ** e;
      if (t >= lo && t <= hi) ticks.push(Number(t.toPrecision(3)));
    }
  }
  return { domain: [lo, hi], ticks };
}

export function FeatureMap({ points, colourBy }: { points: FeaturePoint[]; colourBy?: "family" | "articulation" }) {
  const [by, setBy] = useState<"family" | "articulation">(colourBy ?? "family");
  const series = useMemo(() => {
    const m = new Map<string, FeaturePoint[]>();
    for (const p of points) {
      const k = (by === "family" ? p.family : p.articulation) ?? "unlabelled";
      m.set(k, [...(m.get(k) ?? []), p]);
    }
    return [...m.entries()].sort((a, b) => a[0].localeCompare(b[0]));
  }, [points, by]);
  const flagged = points.filter((p) => p.conflict === "strong");
  const xAxis = useMemo(() => logTicks(points.map((p) => p.centroidHz)), [points]);
  const yAxis = useMemo(() => logTicks(points.map((p) => p.decaySec)), [points]);
  if (!points.length) return <p className="text-sm text-muted">No measured samples yet.</p>;
  return (
    <section className="card space-y-3" data-testid="feature-map">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h3 className="font-semibold">Feature map: brightness against decay</h3>
        <div className="w-full sm:w-auto">
          <label htmlFor="fm-by" className="label">Colour and shape by</label>
          <Select id="fm-by" className="field w-full sm:w-40" value={by} onChange={(e) => setBy(e.target.value as "family" | "articulation")}>
            <option value="family">family</option>
            <option value="articulation">articulation</option>
          </Select>
        </div>
      </div>
      <div className="h-96" role="img" aria-label={`Feature map of ${points.length} samples in ${series.length} groups; ${flagged.length} flagged for review`}>
        <ResponsiveContainer width="100%" height="100%">
          <ScatterChart margin={{ top: 10, right: 16, bottom: 20, left: 24 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="var(--color-line)" />
            <XAxis type="number" dataKey="centroidHz" name="centroid" scale="log" domain={xAxis.domain} ticks={xAxis.ticks} allowDataOverflow tickFormatter={hz} {...AXIS} label={{ value: "spectral centroid of the strike (log scale)", position: "insideBottom", offset: -10, ...AXIS_LABEL }} />
            <YAxis type="number" dataKey="decaySec" name="decay" scale="log" domain={yAxis.domain} ticks={yAxis.ticks} allowDataOverflow tickFormatter={sec} width={66} {...AXIS} label={{ value: "decay (log scale)", angle: -90, position: "left", offset: 4, style: { textAnchor: "middle" }, ...AXIS_LABEL }} />
            <ZAxis range={[36, 36]} />
            <Tooltip {...TOOLTIP} cursor={{ strokeDasharray: "3 3" }} formatter={(v) => (typeof v === "number" ? v.toFixed(2) : String(v))} />
            <Legend verticalAlign="top" formatter={legendText} />
            {series.map(([name, pts], i) => (
              <Scatter key={name} name={name} data={pts} fill={COLOURS[i % COLOURS.length]} shape={SHAPES[i % SHAPES.length]} isAnimationActive={false} />
            ))}
            {flagged.length > 0 && <Scatter name="⚑ flagged: name and sound disagree" data={flagged} fill="none" stroke="var(--color-bad)" strokeWidth={2} shape="circle" isAnimationActive={false} />}
          </ScatterChart>
        </ResponsiveContainer>
      </div>
      {flagged.length > 0 && (
        <ul className="list-disc pl-5 text-xs" data-testid="flagged-list">
          {flagged.slice(0, 20).map((p) => <li key={p.id}>{p.path}: named {p.family ?? "?"}, but sounds otherwise</li>)}
        </ul>
      )}
    </section>
  );
}
