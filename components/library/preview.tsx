"use client";
// Listening: Web Audio playback of the stored WAV through a gain (starts quiet, -24 dB) and an optional
// limiter (a DynamicsCompressorNode with a high ratio and fast attack). A hearing-safety caution comes before
// the first playback; accepting it is remembered in this browser. While a sample plays, the button turns into
// Stop, a "playing" line counts the time, and `onPosition` reports the playhead (0..1 of the file, null when
// stopped) for the waveform to draw.
import { useEffect, useRef, useState } from "react";

const CAUTION_KEY = "kw.hearing-caution.v1";
const LEVEL_KEY = "kw.preview-level-db";

/** `load` reads the sample's stored WAV (components/data/samples.ts loadSampleAudio), once, on the first play. */
export function Preview({ load, onPosition }: { load: () => Promise<ArrayBuffer>; onPosition?: (fraction: number | null) => void }) {
  const [accepted, setAccepted] = useState(false);
  const [asking, setAsking] = useState(false);
  const [levelDb, setLevelDb] = useState(-24);
  const [limiter, setLimiter] = useState(true);
  const [state, setState] = useState<"idle" | "loading" | "playing" | "error">("idle");
  const ctxRef = useRef<AudioContext | null>(null);
  const bufRef = useRef<AudioBuffer | null>(null);
  const srcRef = useRef<AudioBufferSourceNode | null>(null);
  const frameRef = useRef<number | null>(null);
  const [elapsed, setElapsed] = useState(0);
  const positionRef = useRef(onPosition);
  positionRef.current = onPosition;

  const stopClock = () => {
    if (frameRef.current !== null) cancelAnimationFrame(frameRef.current);
    frameRef.current = null;
    positionRef.current?.(null);
  };
  // the playhead follows the audio clock, one step per animation frame
  const startClock = (ctx: AudioContext, startedAt: number, duration: number) => {
    const tick = () => {
      const t = Math.min(duration, ctx.currentTime - startedAt);
      setElapsed(t);
      positionRef.current?.(duration > 0 ? t / duration : 0);
      frameRef.current = t < duration ? requestAnimationFrame(tick) : null;
    };
    if (frameRef.current !== null) cancelAnimationFrame(frameRef.current);
    frameRef.current = requestAnimationFrame(tick);
  };
  const stop = () => {
    const node = srcRef.current;
    srcRef.current = null;
    try { node?.stop(); } catch { /* already ended */ }
    stopClock();
    setState((s) => (s === "playing" ? "idle" : s));
  };

  useEffect(() => {
    setAccepted(localStorage.getItem(CAUTION_KEY) === "yes");
    const saved = Number(localStorage.getItem(LEVEL_KEY));
    if (Number.isFinite(saved) && saved <= 0 && saved >= -60 && localStorage.getItem(LEVEL_KEY) !== null) setLevelDb(saved);
    return () => {
      try { srcRef.current?.stop(); } catch { /* already ended */ }
      if (frameRef.current !== null) cancelAnimationFrame(frameRef.current);
      ctxRef.current?.close();
    };
  }, []);

  const play = async () => {
    if (!accepted) return setAsking(true);
    try {
      const old = srcRef.current;
      srcRef.current = null;
      try { old?.stop(); } catch { /* already ended */ }
      const ctx = ctxRef.current ?? (ctxRef.current = new AudioContext());
      await ctx.resume();
      if (!bufRef.current) {
        setState("loading");
        bufRef.current = await ctx.decodeAudioData(await load());
      }
      const node = ctx.createBufferSource();
      node.buffer = bufRef.current;
      const gain = ctx.createGain();
      gain.gain.value = 10 ** (levelDb / 20);
      node.connect(gain);
      if (limiter) {
        const lim = ctx.createDynamicsCompressor();
        lim.threshold.value = -12;
        lim.knee.value = 0;
        lim.ratio.value = 20;
        lim.attack.value = 0.001;
        lim.release.value = 0.1;
        gain.connect(lim).connect(ctx.destination);
      } else gain.connect(ctx.destination);
      // only the node still playing ends the playing state (a replay stops the one before it)
      node.onended = () => {
        if (srcRef.current !== node) return;
        srcRef.current = null;
        stopClock();
        setState((s) => (s === "playing" ? "idle" : s));
      };
      srcRef.current = node;
      node.start();
      setElapsed(0);
      startClock(ctx, ctx.currentTime, bufRef.current.duration);
      setState("playing");
    } catch {
      setState("error");
    }
  };

  return (
    <div className="space-y-2 rounded-md border border-line p-2" data-testid="preview">
      <div className="flex flex-wrap items-center gap-3">
        {state === "playing" ? (
          <button type="button" className="btn-primary px-3 py-1.5" onClick={stop} data-testid="stop">
            <span aria-hidden>■</span> Stop
          </button>
        ) : (
          <button type="button" className="btn-primary px-3 py-1.5" onClick={play} disabled={state === "loading"} data-testid="play">
            <span aria-hidden>▶</span> {state === "loading" ? "Loading…" : "Play"}
          </button>
        )}
        <span role="status" className="text-xs" data-testid="play-state">
          {state === "playing" ? (
            <span className="inline-flex items-center gap-1.5 font-medium text-brand">
              <span aria-hidden className="inline-block h-2 w-2 animate-pulse rounded-full bg-brand" />
              Playing <span className="num">{elapsed.toFixed(2)} s</span>
            </span>
          ) : state === "loading" ? "Loading the file…" : ""}
        </span>
        <label className="flex items-center gap-2 text-xs">
          Level
          <input type="range" min={-60} max={0} step={1} value={levelDb} onChange={(e) => { const v = Number(e.target.value); setLevelDb(v); localStorage.setItem(LEVEL_KEY, String(v)); }} aria-label="Preview level in dB" />
          <span className="num w-14">{levelDb} dB</span>
        </label>
        <label className="flex items-center gap-1 text-xs"><input type="checkbox" checked={limiter} onChange={(e) => setLimiter(e.target.checked)} /> Limiter</label>
      </div>
      {state === "error" && <p className="text-xs text-bad">This file could not be played in the browser.</p>}
      <p className="text-xs text-muted">Playback starts quiet. Monitoring levels are your responsibility: turn your speakers or headphones down before raising the level.</p>
      {asking && (
        <div role="alertdialog" aria-modal="true" aria-labelledby="caution-title" className="fixed inset-0 z-50 flex items-center justify-center bg-ink/40 p-4" data-testid="hearing-caution">
          <div className="card max-w-md space-y-3">
            <h2 id="caution-title">Protect your hearing</h2>
            <p className="text-sm">Drum one-shots are short, loud transients. A single hit at full level through headphones can be painful and can harm your hearing.</p>
            <ul className="list-disc pl-5 text-sm">
              <li>Turn your monitors or headphones down before the first playback.</li>
              <li>Playback starts at {levelDb} dB; raise it slowly. Keep the limiter on unless you need the raw peaks.</li>
              <li>Monitoring levels are your responsibility.</li>
            </ul>
            <div className="flex justify-end gap-2">
              <button type="button" className="btn-quiet" onClick={() => setAsking(false)}>Not now</button>
              <button type="button" className="btn-primary" onClick={() => { localStorage.setItem(CAUTION_KEY, "yes"); setAccepted(true); setAsking(false); }}>I understand, continue</button>
            </div>
          </div>
        </div>
      )}
    </div>
  );
}
