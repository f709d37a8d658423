"use client";
// The velocity response of a library: per instrument + stroke (+ mic), each layer's measured level against the
// velocity curve, the trim that puts it there, before/after as a ladder plot, flags, listening before and after
// (the trims applied as Web Audio gain), and the trims as CSV or JSON.
import { useMemo, useRef, useState } from "react";
import { CartesianGrid, ComposedChart, Legend, Line, ResponsiveContainer, Scatter, Tooltip, XAxis, YAxis } from "recharts";
import { curveLine } from "@/lib/catalogue/velocity-response";
import type { VelocityResponseView } from "@/lib/api-types/libraries";
import { useVelocityResponse } from "@/components/data/libraries";
import { loadSampleAudio } from "@/components/data/samples";
import { paths } from "@/components/data/paths";
import { Select } from "@/components/ui/select";

const CAUTION_KEY = "kw.hearing-caution.v1";
const dB = (v: number) => `${v > 0 ? "+" : ""}${v.toFixed(1)} dB`;

type Group = VelocityResponseView["groups"][number];

function Ladder({ g, rangeDb, curve }: { g: Group; rangeDb: number; curve: VelocityResponseView["curve"] }) {
  const top = g.response.layers[g.response.layers.length - 1]!;
  const line = useMemo(() => curveLine(curve, rangeDb, top.velocityHigh).filter((p) => p.velocity % 2 === 1 || p.velocity === 127), [curve, rangeDb, top.velocityHigh]);
  const before = g.response.layers.map((l) => ({ v: l.velocityHigh, db: l.measuredDb }));
  const after = g.response.layers.map((l) => ({ v: l.velocityHigh, db: l.targetDb }));
  // the view spans the layers (in 6 dB steps), not the curve down to velocity 1
  const low = Math.floor((Math.min(...before.map((p) => p.db), ...after.map((p) => p.db)) - 3) / 6) * 6;
  const ticks = Array.from({ length: Math.round(-low / 6) + 1 }, (_, i) => low + i * 6);
  return (
    <div className="h-72" role="img" aria-label={`Levels of ${g.instrument} ${g.articulation} against the curve: ${g.response.layers.map((l, i) => `layer ${i + 1} (velocity ${l.velocityLow}-${l.velocityHigh}) measured ${dB(l.measuredDb)}, curve ${dB(l.targetDb)}, trim ${dB(l.trimDb)}`).join("; ")}`}>
      <ResponsiveContainer width="100%" height="100%">
        <ComposedChart margin={{ top: 10, right: 20, bottom: 20, left: 10 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="var(--color-line, #dcd8cf)" />
          <XAxis type="number" dataKey="v" domain={[1, 127]} ticks={[1, 16, 32, 48, 64, 80, 96, 112, 127]} label={{ value: "MIDI velocity (top of each layer)", position: "insideBottom", offset: -10 }} />
          <YAxis type="number" dataKey="db" domain={[low, 3]} ticks={ticks} allowDataOverflow width={60} label={{ value: "level (dB, top layer = 0)", angle: -90, position: "insideLeft", dy: 70 }} />
          <Tooltip formatter={(v) => (typeof v === "number" ? v.toFixed(1) : String(v))} />
          <Legend verticalAlign="top" />
          <Line data={line.filter((p) => p.db >= low).map((p) => ({ v: p.velocity, db: p.db }))} dataKey="db" name="velocity curve" stroke="#3b4a9c" strokeWidth={2} dot={false} isAnimationActive={false} />
          <Scatter data={before} dataKey="db" name="before: measured" fill="#a2271d" shape="triangle" isAnimationActive={false} />
          <Scatter data={after} dataKey="db" name="after: trimmed onto the curve" fill="#1f5f5b" shape="circle" isAnimationActive={false} />
        </ComposedChart>
      </ResponsiveContainer>
    </div>
  );
}

/** Plays the first take of every layer, softest first, 0.7 s apart; `after` applies each layer's trim. */
function Listen({ studioId, libraryId, g }: { studioId: string; libraryId: string; g: Group }) {
  const [levelDb, setLevelDb] = useState(-24);
  const [asking, setAsking] = useState(false);
  const [playing, setPlaying] = useState<"before" | "after" | null>(null);
  const [error, setError] = useState<string | null>(null);
  const ctxRef = useRef<AudioContext | null>(null);
  const play = async (mode: "before" | "after") => {
    if (localStorage.getItem(CAUTION_KEY) !== "yes") return setAsking(true);
    setError(null);
    try {
      const ctx = ctxRef.current ?? (ctxRef.current = new AudioContext());
      await ctx.resume();
      const master = ctx.createGain();
      master.gain.value = 10 ** (levelDb / 20);
      const limiter = ctx.createDynamicsCompressor();
      limiter.threshold.value = -3;
      limiter.ratio.value = 20;
      limiter.attack.value = 0.001;
      master.connect(limiter).connect(ctx.destination);
      const takes = g.takes.filter((t) => t.sampleId);
      const buffers = await Promise.all(takes.map(async (t) => ctx.decodeAudioData(await loadSampleAudio(studioId, libraryId, t.sampleId!))));
      setPlaying(mode);
      const start = ctx.currentTime + 0.05;
      buffers.forEach((buf, i) => {
        const layer = g.response.layers.find((l) => l.index === takes[i]!.index)!;
        const src = ctx.createBufferSource();
        src.buffer = buf;
        const gain = ctx.createGain();
        gain.gain.value = mode === "after" ? 10 ** (layer.trimDb / 20) : 1;
        src.connect(gain).connect(master);
        src.start(start + i * 0.7);
        if (i === buffers.length - 1) src.onended = () => setPlaying(null);
      });
    } catch (e) {
      setPlaying(null);
      setError(`Could not play: ${(e as Error).message}`);
    }
  };
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-center gap-2">
        <button type="button" className="btn-quiet" aria-pressed={playing === "before"} onClick={() => void play("before")} disabled={playing !== null}>{playing === "before" ? "Playing before…" : "▶ Listen before"}</button>
        <button type="button" className="btn-quiet" aria-pressed={playing === "after"} onClick={() => void play("after")} disabled={playing !== null}>{playing === "after" ? "Playing after…" : "▶ Listen after the trims"}</button>
        <label className="flex items-center gap-2 text-sm" htmlFor="vr-level">Level
          <input id="vr-level" type="range" min={-60} max={0} step={1} value={levelDb} onChange={(e) => setLevelDb(Number(e.target.value))} />
          <span className="num w-14">{levelDb} dB</span>
        </label>
      </div>
      {asking && (
        <div role="alertdialog" aria-label="Hearing safety" className="rounded-md border border-warn/40 bg-warn-soft p-3 text-sm">
          <p><strong>Mind your ears.</strong> Every layer of the group plays in turn, softest first; the loudest can be much louder than the first. Listening starts quiet (−24 dB): turn your speakers or headphones down before you raise it.</p>
          <div className="mt-2 flex gap-2">
            <button type="button" className="btn-primary" onClick={() => { localStorage.setItem(CAUTION_KEY, "yes"); setAsking(false); }}>I understand</button>
            <button type="button" className="btn-quiet" onClick={() => setAsking(false)}>Not now</button>
          </div>
        </div>
      )}
      {error && <p role="alert" className="text-sm text-bad">{error}</p>}
    </div>
  );
}

export function VelocityResponse({ studioId, libraryId, initial }: { studioId: string; libraryId: string; initial: VelocityResponseView }) {
  const [curve, setCurve] = useState<"dls" | "dannenberg">(initial.curve.kind);
  const [rangeDb, setRangeDb] = useState<number | null>(initial.curve.kind === "dannenberg" ? (initial.curve.rangeDb ?? null) : null);
  const q = useVelocityResponse(studioId, libraryId, curve, rangeDb, initial);
  const view = q.data ?? initial;
  const [key, setKey] = useState(initial.groups[0]?.key ?? "");
  const g = view.groups.find((x) => x.key === key) ?? view.groups[0];
  const flagged = view.groups.filter((x) => x.response.outOfOrder.length || x.response.tooClose.length);
  const exportUrl = (format: "csv" | "json") => `${paths.velocityResponse(studioId, libraryId)}?${new URLSearchParams({ curve, format, ...(curve === "dannenberg" && rangeDb !== null ? { rangeDb: String(rangeDb) } : {}) })}`;
  if (!initial.groups.length) {
    return <p className="card text-sm text-muted">No instrument of this library has two or more velocity layers yet: the velocity response needs at least two to compare.</p>;
  }
  return (
    <div className="space-y-4">
      <section className="card space-y-3">
        <div className="flex flex-wrap items-end gap-4">
          <div>
            <label className="label" htmlFor="vr-curve">Velocity curve</label>
            <Select id="vr-curve" className="field" value={curve} onChange={(e) => setCurve(e.target.value as "dls" | "dannenberg")}>
              <option value="dls">Square law (DLS Level 1)</option>
              <option value="dannenberg">Dannenberg, with a dynamic range</option>
            </Select>
          </div>
          {curve === "dannenberg" && (
            <div>
              <label className="label" htmlFor="vr-range">Dynamic range (dB)</label>
              <input id="vr-range" type="number" min={6} max={120} className="field num w-28" value={rangeDb ?? ""} placeholder="measured" onChange={(e) => setRangeDb(e.target.value === "" ? null : Math.min(120, Math.max(6, Number(e.target.value))))} />
            </div>
          )}
          <div className="min-w-0 flex-1">
            <label className="label" htmlFor="vr-group">Instrument / stroke / mic</label>
            <Select id="vr-group" className="field w-full" value={g?.key} onChange={(e) => setKey(e.target.value)}>
              {view.groups.map((x) => <option key={x.key} value={x.key}>{x.instrument} — {x.articulation}{x.mic ? ` (${x.mic})` : ""}: {x.response.layers.length} layers, off by {x.response.rmsBeforeDb.toFixed(1)} dB</option>)}
            </Select>
          </div>
          <div className="flex gap-2 text-sm"><a className="btn-quiet" href={exportUrl("csv")} download>Trims as CSV</a><a className="btn-quiet" href={exportUrl("json")} download>as JSON</a></div>
        </div>
        <p className="text-xs text-muted">Each layer&apos;s sample plays at its own level at the top of its velocity range; the curve says how loud that velocity should be compared with the top layer. The trim is the gain that puts the layer on the curve.</p>
      </section>
      {g && (
        <section className="card space-y-3" data-testid="velocity-response">
          <h3 className="font-semibold">{g.instrument} — {g.articulation}{g.mic ? ` (${g.mic})` : ""}</h3>
          <Ladder g={g} rangeDb={view.groups.find((x) => x.key === g.key)!.response.rangeDb} curve={view.curve} />
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="trims-table">
              <thead className="text-left text-muted"><tr><th className="py-1 pr-3 font-medium">Layer</th><th className="pr-3 font-medium">Velocities</th><th className="pr-3 font-medium">Measured</th><th className="pr-3 font-medium">On the curve</th><th className="pr-3 font-medium">Trim</th><th className="font-medium">Note</th></tr></thead>
              <tbody>
                {g.response.layers.map((l, i) => (
                  <tr key={l.index} className="border-t border-line">
                    <td className="py-1 pr-3">{i + 1}</td>
                    <td className="num pr-3">{l.velocityLow}–{l.velocityHigh}</td>
                    <td className="num pr-3">{dB(l.measuredDb)}</td>
                    <td className="num pr-3">{dB(l.targetDb)}</td>
                    <td className="num pr-3 font-semibold">{dB(l.trimDb)}</td>
                    <td className="text-xs">
                      {g.response.outOfOrder.some((p) => p.upper === l.index) && <span className="text-bad">quieter than the layer below · </span>}
                      {g.response.tooClose.some((p) => p.upper === l.index) && <span className="text-warn">within 1 dB of the layer below: hard to tell apart · </span>}
                      {g.response.bigBoosts.includes(l.index) && <span className="text-warn">a boost over 6 dB raises its noise too</span>}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <Listen studioId={studioId} libraryId={libraryId} g={g} />
        </section>
      )}
      {flagged.length > 0 && (
        <section className="card">
          <h3 className="font-semibold">Layers to look at</h3>
          <ul className="mt-2 space-y-1 text-sm">
            {flagged.map((x) => (
              <li key={x.key}><button type="button" className="text-brand underline" onClick={() => setKey(x.key)}>{x.instrument} — {x.articulation}{x.mic ? ` (${x.mic})` : ""}</button>: {x.response.outOfOrder.length ? `${x.response.outOfOrder.length} layer(s) quieter than the one below` : ""}{x.response.outOfOrder.length && x.response.tooClose.length ? ", " : ""}{x.response.tooClose.length ? `${x.response.tooClose.length} pair(s) within 1 dB` : ""}</li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
