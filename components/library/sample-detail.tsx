"use client";
// One sample: waveform from the server's peaks, the reasons for its labels, key measures, and the preview.
import { useCallback, useState } from "react";
import { loadSampleAudio, useSample } from "../data/samples";
import { Preview } from "./preview";
import { Waveform } from "./waveform";
import { SoundFit } from "./sound-fit";
import { StateTag } from "./state-counts";

export function SampleDetail({ studioId, libraryId, sampleId, onClose }: { studioId: string; libraryId: string; sampleId: string; onClose: () => void }) {
  const q = useSample(studioId, libraryId, sampleId);
  const load = useCallback(() => loadSampleAudio(studioId, libraryId, sampleId), [studioId, libraryId, sampleId]);
  const s = q.data;
  const [playhead, setPlayhead] = useState<number | null>(null);
  return (
    <aside className="card h-fit space-y-3 p-4 text-sm" data-testid="sample-detail" aria-label="Sample detail">
      <div className="flex items-start justify-between gap-2">
        <h3 className="break-all font-semibold">{s?.path ?? "Loading…"}</h3>
        <button type="button" className="btn-quiet px-2 py-1" onClick={onClose} aria-label="Close the sample">✕</button>
      </div>
      {q.isError && <p className="text-bad">This sample could not be loaded.</p>}
      {s && (
        <>
          <div className="flex flex-wrap gap-2"><StateTag state={s.state} />{s.conflict === "strong" && <span className="tag border-warn/40 bg-warn-soft text-warn">⚑ name and sound disagree</span>}</div>
          {s.rejectReason && <p className="rounded border border-bad/30 bg-bad-soft p-2 text-bad">Rejected: {s.rejectReason}</p>}
          {s.peaks && <Waveform peaks={s.peaks} durationSec={s.durationSec ?? 0} onsetMs={s.measurement?.onsetMs ?? null} playhead={playhead} />}
          {s.state !== "rejected" && <Preview load={load} onPosition={setPlayhead} />}
          <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-xs">
            <dt className="text-muted">Family / articulation</dt><dd>{s.family ?? "–"} / {s.articulation ?? "–"}</dd>
            <dt className="text-muted">Instrument</dt><dd>{s.instrumentName ?? "–"}</dd>
            <dt className="text-muted">Layer, round robin</dt><dd className="num">{s.layerIndex === null ? "–" : `${s.layerIndex + 1} of ${s.layerCount}, RR ${s.roundRobin}`}</dd>
            <dt className="text-muted">Velocity range</dt><dd className="num">{s.velocityLow ?? "–"}–{s.velocityHigh ?? "–"}</dd>
            <dt className="text-muted">Strike loudness</dt><dd className="num">{s.strikeLufs?.toFixed(1) ?? "–"} LUFS</dd>
            <dt className="text-muted">True peak</dt><dd className="num">{s.truePeakDbtp?.toFixed(2) ?? "–"} dBTP</dd>
            <dt className="text-muted">Format</dt><dd className="num">{s.sampleRate ? `${s.sampleRate} Hz, ${s.bits}-bit, ${s.channels} ch` : "–"}</dd>
            {s.measurement && (<>
              <dt className="text-muted">Onset, attack</dt><dd className="num">{s.measurement.onsetMs.toFixed(1)} ms, {s.measurement.attackMs.toFixed(1)} ms</dd>
              <dt className="text-muted">Tail</dt><dd>{s.measurement.tail === "cut" ? "cut off while sounding" : "decays to the noise floor"}</dd>
            </>)}
          </dl>
          {s.reasons.length > 0 && (
            <div>
              <h4 className="text-xs font-semibold">Why these labels</h4>
              <ul className="list-disc pl-5 text-xs text-muted">{s.reasons.map((r, i) => <li key={i}>{r}</li>)}</ul>
            </div>
          )}
          {s.sound && <SoundFit sound={s.sound} family={s.family} familySource={s.familySource} />}
          {s.measurement && s.measurement.warnings.length > 0 && (
            <ul className="list-disc pl-5 text-xs text-warn">{s.measurement.warnings.map((w, i) => <li key={i}>{w}</li>)}</ul>
          )}
        </>
      )}
    </aside>
  );
}
