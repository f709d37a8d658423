"use client";
// The pad chart drawn like the layout (grid rows × columns, or the trigger-zone list), each pad with its
// outcome in words and an icon, what it plays and its velocity bar; and the audition controls: click a pad
// (or hit it on the controller) to hear what the kit plays at that velocity.
import { useCallback, useEffect, useRef, useState } from "react";
import type { AuditResult, PadFinding } from "@/lib/audit/types";
import { OutcomeIcon, OUTCOME_TEXT } from "./outcome-icon";
import { VelocityBar } from "./velocity-bar";
import { AuditionEngine, START_LEVEL_DB, type SoundInstrument } from "./audition-engine";
import { MiddleCSetting, noteName, useMiddleC } from "@/components/midi/notes";
import { useMidi, type MidiEvent } from "@/components/midi/use-midi";
import { MidiMonitor, MidiStatusLine } from "@/components/midi/midi-panel";
import { errorText } from "@/components/form-bits";
import { useAuditSoundsLoader } from "@/components/data/audits";
import { loadSampleAudio } from "@/components/data/samples";

const CAUTION_KEY = "kw.hearingCaution.v1";

function PadCell({ p, middleC, active, onPlay }: { p: PadFinding; middleC: "C3" | "C4"; active: boolean; onPlay: (p: PadFinding) => void }) {
  const frame = p.outcome === "direct" ? "border-line" : p.outcome === "stand-in" ? "border-warn/60 border-dashed" : "border-bad/70 border-2";
  return (
    <button type="button" onClick={() => onPlay(p)} data-testid="chart-pad" data-pad-id={p.padId} data-outcome={p.outcome}
      className={`flex min-h-24 w-full flex-col gap-1 rounded-md border bg-card p-2 text-left text-xs break-inside-avoid ${frame} ${active ? "ring-2 ring-brand" : ""}`}
      aria-describedby="pad-chart-audition-hint">
      <span className="flex items-start justify-between gap-1">
        <span className="font-medium leading-tight">{p.label}</span>
        <span className="num shrink-0 text-muted">{p.note} {noteName(p.note, middleC)}</span>
      </span>
      <span className="flex items-center gap-1 font-semibold"><OutcomeIcon outcome={p.outcome} /> {OUTCOME_TEXT[p.outcome]}</span>
      <span className="leading-tight text-muted">
        {p.outcome === "silent" ? p.reason : `${p.plays}${p.standIn ? ` (for ${p.requested})` : ""}`}
      </span>
      {p.outcome !== "silent" && <VelocityBar layers={p.layers} gaps={p.velocityGaps} compact />}
    </button>
  );
}

export function PadChart({ studioId, auditId, result }: { studioId: string; auditId: string; result: AuditResult }) {
  const [middleC, setMiddleC] = useMiddleC();
  const engine = useRef<AuditionEngine | null>(null);
  const sounds = useRef<SoundInstrument[] | null>(null);
  const [level, setLevel] = useState(START_LEVEL_DB);
  const [limiter, setLimiter] = useState(true);
  const [velocity, setVelocity] = useState(100);
  const [line, setLine] = useState<{ ok: boolean; text: string } | null>(null);
  const [pending, setPending] = useState<{ p: PadFinding; v: number } | null>(null);
  const [active, setActive] = useState<string | null>(null);
  const [events, setEvents] = useState<MidiEvent[]>([]);
  const loadSounds = useAuditSoundsLoader(studioId, auditId);

  useEffect(() => () => engine.current?.close(), []);

  const doPlay = useCallback(async (p: PadFinding, v: number) => {
    setActive(p.padId);
    if (!engine.current) { engine.current = new AuditionEngine((libraryId, sampleId) => loadSampleAudio(studioId, libraryId, sampleId)); engine.current.setLevel(level); engine.current.setLimiter(limiter); }
    try {
      if (!sounds.current) sounds.current = await loadSounds();
      const info = await engine.current.play(p, v, sounds.current);
      setLine({ ok: info.ok, text: `${p.label}: ${info.text}` });
    } catch (e) {
      setLine({ ok: false, text: `Could not load the sounds: ${errorText(e, "no answer from the server").replace(/\.$/, "")}.` });
    }
  }, [studioId, level, limiter, loadSounds]);

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

  const rows = Math.max(0, ...result.pads.map((p) => p.row ?? 0));
  const cols = Math.max(0, ...result.pads.map((p) => p.col ?? 0));
  const isGrid = rows > 0 && cols > 0 && result.pads.every((p) => p.row && p.col);

  return (
    <div className="space-y-4">
      <p id="pad-chart-audition-hint" className="sr-only">Press a pad to audition it.</p>
      <div className="no-print flex flex-wrap items-center justify-between gap-3">
        <MiddleCSetting value={middleC} onChange={setMiddleC} />
        <span className="flex flex-wrap items-center gap-3 text-xs text-muted" aria-label="Legend">
          <span className="inline-flex items-center gap-1"><OutcomeIcon outcome="direct" /> direct: recorded</span>
          <span className="inline-flex items-center gap-1"><OutcomeIcon outcome="stand-in" /> stand-in: nearest recorded articulation</span>
          <span className="inline-flex items-center gap-1"><OutcomeIcon outcome="silent" /> silent: nothing plays</span>
        </span>
      </div>
      {isGrid ? (
        <div className="grid gap-2" style={{ gridTemplateColumns: `repeat(${cols}, minmax(0, 1fr))` }} data-testid="pad-chart">
          {Array.from({ length: rows * cols }, (_, i) => {
            const r = Math.floor(i / cols) + 1;
            const c = (i % cols) + 1;
            const p = result.pads.find((x) => x.row === r && x.col === c);
            return p ? <PadCell key={p.padId} p={p} middleC={middleC} active={active === p.padId} onPlay={(x) => play(x, velocity)} /> : <div key={i} className="rounded-md border border-dashed border-line" aria-hidden />;
          })}
          {result.pedal?.chick && (
            <div style={{ gridColumn: "1 / -1" }} className="max-w-xs">
              <p className="mb-1 text-xs text-muted">Pedal chick note</p>
              <PadCell p={result.pedal.chick} middleC={middleC} active={active === result.pedal.chick.padId} onPlay={(x) => play(x, velocity)} />
            </div>
          )}
        </div>
      ) : (
        <div className="grid gap-2 sm:grid-cols-3 lg:grid-cols-5 print:grid-cols-4" data-testid="pad-chart">
          {result.pads.map((p) => <PadCell key={p.padId} p={p} middleC={middleC} active={active === p.padId} onPlay={(x) => play(x, velocity)} />)}
          {result.pedal?.chick && <PadCell p={result.pedal.chick} middleC={middleC} active={active === result.pedal.chick.padId} onPlay={(x) => play(x, velocity)} />}
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
