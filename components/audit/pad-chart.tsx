"use client";
// The audit's pad chart: the layout drawn by the shared pad grid (components/pad-chart, the same drawing as the
// layout editor), each pad with its outcome in words and an icon, what it plays and its velocity bar; and the
// audition: click a pad, press Enter or Space on it, or hit it on the controller, to hear what the kit plays at
// that velocity. A pad shows it is sounding (aria-pressed and a ring) until its sample ends.
import { useCallback, useEffect, useRef, useState } from "react";
import type { AuditResult, LayoutSurface, PadFinding } from "@/lib/audit/types";
import { OutcomeIcon, OUTCOME_TEXT } from "./outcome-icon";
import { VelocityBar } from "./velocity-bar";
import { AuditionEngine, START_LEVEL_DB, type SoundInstrument } from "./audition-engine";
import { playDetail, playsInWords, silentReason, strokeName, onEmptySlot } from "./words";
import { PadGrid, type CellProps } from "@/components/pad-chart/pad-grid";
import { surfaceOfFindings } from "@/components/pad-chart/geometry";
import { MiddleCSetting, noteName, useMiddleC } from "@/components/midi/notes";
import { useMidi, type MidiEvent } from "@/components/midi/use-midi";
import { MidiMonitor, MidiStatusLine } from "@/components/midi/midi-panel";
import { errorText } from "@/components/form-bits";
import { useAuditSoundsLoader } from "@/components/data/audits";
import { loadSampleAudio } from "@/components/data/samples";

const CAUTION_KEY = "kw.hearingCaution.v1";

function shortPlays(p: PadFinding): string {
  if (p.outcome === "silent") return onEmptySlot(p) ? "empty slot" : silentReason(p);
  if (p.outcome === "stand-in") return `→ ${strokeName(p.family, p.plays)}`;
  return strokeName(p.family, p.plays);
}

/** `dense`: a grid of 4 or more columns; below 640 px its pads show the outcome by icon only (the words stay in the label). */
function PadCell({ p, middleC, playing, onPlay, cell, dense = false }: { p: PadFinding; middleC: "C3" | "C4"; playing: boolean; onPlay: (p: PadFinding) => void; cell?: CellProps; dense?: boolean }) {
  const wide = dense ? "hidden sm:inline" : "inline";
  const frame = p.outcome === "direct" ? "border-line" : p.outcome === "stand-in" ? "border-warn/60 border-dashed" : "border-bad/70 border-2";
  return (
    <button type="button" onClick={() => onPlay(p)} data-testid="chart-pad" data-pad-id={p.padId} data-outcome={p.outcome} aria-pressed={playing} data-playing={playing || undefined}
      {...cell}
      title={`${playsInWords(p)}. ${playDetail(p)}`}
      className={`flex h-full min-h-20 w-full flex-col gap-1 rounded-md border bg-card text-left break-inside-avoid hover:bg-paper sm:p-2 sm:text-xs ${dense ? "p-1 text-[11px]" : "p-1.5 text-xs"} ${frame} ${playing ? "ring-2 ring-brand ring-offset-1 ring-offset-card" : ""}`}
      aria-describedby="pad-chart-audition-hint">
      <span className="flex flex-wrap items-start justify-between gap-x-1">
        <span className="min-w-0 font-medium leading-tight [overflow-wrap:anywhere] hyphens-auto">{p.label}</span>
        <span className="num shrink-0 text-muted">{p.note}<span className={wide}> {noteName(p.note, middleC)}</span></span>
      </span>
      <span className="flex items-center gap-1 font-semibold"><OutcomeIcon outcome={p.outcome} /> <span className={wide}>{OUTCOME_TEXT[p.outcome]}</span>{playing && <span className="ml-auto text-brand" aria-hidden>▶</span>}</span>
      <span className={`${dense ? "hidden sm:block" : "block"} leading-tight text-muted`}>{shortPlays(p)}</span>
      {p.outcome !== "silent" && <span className="mt-auto block"><VelocityBar layers={p.layers} gaps={p.velocityGaps} compact /></span>}
    </button>
  );
}

export function PadChart({ studioId, auditId, result, surface }: { studioId: string; auditId: string; result: AuditResult; surface?: LayoutSurface | null }) {
  const [middleC, setMiddleC] = useMiddleC();
  const engine = useRef<AuditionEngine | null>(null);
  const sounds = useRef<SoundInstrument[] | null>(null);
  const [level, setLevel] = useState(START_LEVEL_DB);
  const [limiter, setLimiter] = useState(true);
  const [velocity, setVelocity] = useState(100);
  const [line, setLine] = useState<{ ok: boolean; text: string } | null>(null);
  const [pending, setPending] = useState<{ p: PadFinding; v: number } | null>(null);
  // how many of each pad's hits are sounding (a pad hit again before its sample ends stays lit until the last ends)
  const [sounding, setSounding] = useState<ReadonlyMap<string, number>>(new Map());
  const mark = useCallback((id: string, on: boolean) => setSounding((s) => { const n = new Map(s); const k = (n.get(id) ?? 0) + (on ? 1 : -1); if (k > 0) n.set(id, k); else n.delete(id); return n; }), []);
  const playing = { has: (id: string) => sounding.has(id) };
  const [events, setEvents] = useState<MidiEvent[]>([]);
  const loadSounds = useAuditSoundsLoader(studioId, auditId);

  useEffect(() => () => engine.current?.close(), []);

  const doPlay = useCallback(async (p: PadFinding, v: number) => {
    mark(p.padId, true);
    if (!engine.current) { engine.current = new AuditionEngine((libraryId, sampleId) => loadSampleAudio(studioId, libraryId, sampleId)); engine.current.setLevel(level); engine.current.setLimiter(limiter); }
    try {
      if (!sounds.current) sounds.current = await loadSounds();
      const info = await engine.current.play(p, v, sounds.current);
      setLine({ ok: info.ok, text: `${p.label}: ${info.text}` });
      if (info.ended) await info.ended;
    } catch (e) {
      setLine({ ok: false, text: `Could not load the sounds: ${errorText(e, "no answer from the server").replace(/\.$/, "")}.` });
    }
    mark(p.padId, false);
  }, [studioId, level, limiter, loadSounds, mark]);

  const play = useCallback((p: PadFinding, v: number) => {
    if (typeof window !== "undefined" && !localStorage.getItem(CAUTION_KEY)) { setPending({ p, v }); return; }
    void doPlay(p, v);
  }, [doPlay]);

  const midi = useMidi((e) => {
    setEvents((ev) => [e, ...ev].slice(0, 20));
    if (e.kind !== "note-on") return;
    const p = result.pads.find((x) => x.note === e.note && x.channel === e.channel) ?? (result.pedal?.chick && result.pedal.chick.note === e.note ? result.pedal.chick : undefined);
    if (p) play(p, e.velocity!);
  });

  const shape = surfaceOfFindings(result.pads, surface);

  return (
    <div className="space-y-4">
      <p id="pad-chart-audition-hint" className="sr-only">Press a pad to audition it.</p>
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <MiddleCSetting value={middleC} onChange={setMiddleC} />
        <span className="flex flex-wrap items-center gap-3 text-xs text-muted" aria-label="Legend">
          <span className="inline-flex items-center gap-1"><OutcomeIcon outcome="direct" /> as recorded</span>
          <span className="inline-flex items-center gap-1"><OutcomeIcon outcome="stand-in" /> stand-in: the nearest recorded stroke plays</span>
          <span className="inline-flex items-center gap-1"><OutcomeIcon outcome="silent" /> silent: nothing plays</span>
        </span>
      </div>
      <PadGrid surface={shape} pads={result.pads} label="Pad chart" testId="pad-chart"
        renderPad={(p, cell) => <PadCell p={p} cell={cell} dense={shape.kind === "grid" && shape.cols >= 4} middleC={middleC} playing={playing.has(p.padId)} onPlay={(x) => play(x, velocity)} />} />
      {result.pedal?.chick && (
        <div className="max-w-[12rem]">
          <p className="mb-1 text-xs text-muted">Pedal chick note</p>
          <PadCell p={result.pedal.chick} middleC={middleC} playing={playing.has(result.pedal.chick.padId)} onPlay={(x) => play(x, velocity)} />
        </div>
      )}

      <section className="no-print card space-y-3" aria-label="Audition">
        <h3 className="font-semibold">Audition</h3>
        <p className="text-sm text-muted">Click a pad, or hit it on your controller, to hear what this kit plays at that velocity; round robins take turns. Playback starts quiet ({START_LEVEL_DB} dB). Monitoring levels are your responsibility.</p>
        {pending && (
          <div role="alertdialog" aria-labelledby="caution-title" className="space-y-2 rounded-md border border-warn/50 bg-warn-soft p-3 text-sm" data-testid="hearing-caution">
            <p id="caution-title" className="font-semibold">⚠ Protect your hearing</p>
            <p>Drum samples are sudden, loud transients. Turn your speakers or headphones down before the first hit, keep the limiter on, and raise the level slowly. Monitoring levels are your responsibility.</p>
            <div className="flex gap-2">
              <button type="button" className="btn-primary" onClick={() => { localStorage.setItem(CAUTION_KEY, new Date().toISOString()); const x = pending; setPending(null); void doPlay(x.p, x.v); }}>I understand, play</button>
              <button type="button" className="btn-quiet" onClick={() => setPending(null)}>Not now</button>
            </div>
          </div>
        )}
        <div className="flex flex-wrap items-end gap-6">
          <label className="text-sm">
            <span className="label">Level <span className="num">{level} dB</span></span>
            <input type="range" min={-60} max={0} step={1} value={level} onChange={(e) => { const v = Number(e.target.value); setLevel(v); engine.current?.setLevel(v); }} aria-label="Audition level in dB" />
          </label>
          <label className="text-sm">
            <span className="label">Click velocity <span className="num">{velocity}</span></span>
            <input type="range" min={1} max={127} value={velocity} onChange={(e) => setVelocity(Number(e.target.value))} aria-label="Velocity for clicks" />
          </label>
          <label className="inline-flex items-center gap-2 text-sm"><input type="checkbox" checked={limiter} onChange={(e) => { setLimiter(e.target.checked); engine.current?.setLimiter(e.target.checked); }} /> Limiter</label>
        </div>
        {line && <p role="status" className={`text-sm ${line.ok ? "" : "text-bad"}`} data-testid="audition-line">{line.ok ? "▶ " : "✕ "}{line.text}</p>}
        <MidiStatusLine status={midi.status} message={midi.message} inputs={midi.inputs} onConnect={midi.connect} />
        {midi.status === "ready" && <MidiMonitor events={events} middleC={middleC} />}
      </section>
    </div>
  );
}
