"use client";
// Multi-mic takes on the health page: for each instrument + stroke and each microphone, its arrival offset against
// the close microphone take by take (the dashed line is the usual offset; a take off the line was shifted), and
// takes whose polarity is inverted marked apart.
import { useState } from "react";
import { CartesianGrid, ReferenceLine, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis } from "recharts";
import type { MicSeries } from "@/lib/catalogue/mic-consistency";
import { Select } from "@/components/ui/select";

export function MicOffsets({ series }: { series: MicSeries[] }) {
  const [i, setI] = useState(() => Math.max(0, series.findIndex((s) => s.takes.some((t) => Math.abs(t.offsetMs - s.medianOffsetMs) > 0.25 || t.polarity === -1))));
  const s = series[i];
  if (!s) return null;
  const points = s.takes.map((t, k) => ({ k: k + 1, offset: t.offsetMs, take: t.take, polarity: t.polarity }));
  const lo = Math.min(...points.map((p) => p.offset), s.medianOffsetMs) - 0.5;
  const hi = Math.max(...points.map((p) => p.offset), s.medianOffsetMs) + 0.5;
  return (
    <section className="card space-y-3" data-testid="mic-offsets">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h3 className="font-semibold">Microphone offsets, take by take</h3>
        <div className="min-w-0">
          <label htmlFor="mic-series" className="label">Instrument / stroke, microphone</label>
          <Select id="mic-series" className="field w-full sm:w-96" value={i} onChange={(e) => setI(Number(e.target.value))}>
            {series.map((x, j) => <option key={j} value={j}>{x.group}, {x.mic} ({x.takes.length} takes)</option>)}
          </Select>
        </div>
      </div>
      <div className="h-64" role="img" aria-label={`${s.mic} against the close microphone for ${s.group}: usually ${s.medianOffsetMs.toFixed(2)} ms later; ${points.map((p) => `${p.take} ${p.offset.toFixed(2)} ms${p.polarity === -1 ? " inverted" : ""}`).join(", ")}`}>
        <ResponsiveContainer width="100%" height="100%">
          <ScatterChart margin={{ top: 10, right: 20, bottom: 20, left: 10 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="#dcd8cf" />
            <XAxis type="number" dataKey="k" domain={[0, points.length + 1]} allowDecimals={false} tickFormatter={(k: number) => points[k - 1]?.take ?? ""} interval={0} label={{ value: "take", position: "insideBottom", offset: -10 }} />
            <YAxis type="number" dataKey="offset" domain={[Math.floor(lo * 10) / 10, Math.ceil(hi * 10) / 10]} width={60} label={{ value: "ms after the close mic", angle: -90, position: "insideLeft", dy: 60 }} />
            <Tooltip formatter={(v) => (typeof v === "number" ? v.toFixed(2) : String(v))} />
            <ReferenceLine y={s.medianOffsetMs} stroke="#3b4a9c" strokeDasharray="6 3" label={{ value: `usual ${s.medianOffsetMs.toFixed(2)} ms`, position: "insideTopRight" }} />
            <Scatter name="same polarity" data={points.filter((p) => p.polarity !== -1)} fill="#1f5f5b" shape="circle" isAnimationActive={false} />
            <Scatter name="inverted polarity" data={points.filter((p) => p.polarity === -1)} fill="#a2271d" shape="cross" isAnimationActive={false} />
          </ScatterChart>
        </ResponsiveContainer>
      </div>
      <p className="text-xs text-muted">Sound takes about 2.9 ms to travel one metre, so a mic further away hears the hit later; that delay should be the same for every take. ● same polarity as the close mic, ✕ inverted.</p>
    </section>
  );
}
