// Microphone consistency of multi-mic takes. A take recorded through several microphones (close, overhead,
// room ...) is matched by what its names say apart from the microphone: instrument, stroke, layer and round
// robin. Against the close microphone of the same take, every other microphone has an arrival offset (sound
// travels about 0.34 m per ms, so an overhead 1 m away hears the hit about 2.9 ms later) and a polarity (the
// sign of the cross-correlation of the two strike windows, lib/audio/onset-wave.ts). Both should be the same
// for every take of an instrument: a take whose overhead is shifted, or flipped, was edited wrongly. A
// microphone that some takes of a group have and others lack is reported too.
//
// Tolerances (common practice of multi-mic editing, no published source): an offset more than 0.25 ms from the
// group's median (12 samples at 48 kHz, where comb filtering starts to be heard on a mix); polarity read only
// when the windows correlate by 0.3 or more.

import { decodeOnsetWave, ONSET_WAVE_RATE } from "../audio/onset-wave";
import type { Measurement } from "../audio/types";
import type { HealthFinding } from "./health";

export const OFFSET_TOLERANCE_MS = 0.25;
export const MIN_CORRELATION = 0.3;
/** Largest lag searched around the two onsets, ms. */
const MAX_LAG_MS = 1.5;

export interface MicSample {
  id: string;
  path: string;
  /** Instrument and stroke, as the catalogue named them ("Ride 21 / bow"). */
  group: string;
  /** The take within the group (layer and round robin), as the names say. */
  take: string;
  mic: string;
  measurement: Pick<Measurement, "onsetMs" | "onsetWave">;
}

export interface MicOffset {
  take: string;
  sampleId: string;
  offsetMs: number;
  /** +1 same polarity as the close mic, -1 inverted, 0 too weakly correlated to tell. */
  polarity: 1 | -1 | 0;
  correlation: number;
}

/** The offsets of one microphone against the close one over the takes of one group (for the plot). */
export interface MicSeries {
  group: string;
  mic: string;
  medianOffsetMs: number;
  takes: MicOffset[];
}

/** A take's name within its group: its velocity and round-robin words when the names have them (so every mic of a
 * take matches, whatever layer its own loudness gave it), else its layer and round robin. */
export function takeName(velocityWord: string | null, nameRoundRobin: number | null, layerIndex: number | null, roundRobin: number | null): string {
  const v = velocityWord ?? (layerIndex !== null ? `layer ${layerIndex + 1}` : "?");
  const rr = nameRoundRobin !== null ? `rr${nameRoundRobin}` : roundRobin !== null ? `rr${roundRobin}` : "";
  return `${v} ${rr}`.trim();
}

/** Best lag (in window samples) of `x` against `ref` within +-maxLag, and the normalised correlation there. */
export function crossCorrelate(ref: Float64Array, x: Float64Array, maxLag: number): { lag: number; r: number } {
  let best = { lag: 0, r: 0 };
  for (let lag = -maxLag; lag <= maxLag; lag++) {
    let s = 0, ea = 0, eb = 0;
    for (let i = 0; i < ref.length; i++) {
      const j = i + lag;
      if (j < 0 || j >= x.length) continue;
      s += ref[i]! * x[j]!;
      ea += ref[i]! ** 2;
      eb += x[j]! ** 2;
    }
    const r = ea > 0 && eb > 0 ? s / Math.sqrt(ea * eb) : 0;
    if (Math.abs(r) > Math.abs(best.r) + 1e-12) best = { lag, r };
  }
  return best;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};
const r2 = (x: number) => Math.round(x * 100) / 100 + 0;

/** Offsets per group and microphone, and the findings: shifted takes, flipped takes, missing microphones. */
export function micConsistency(samples: readonly MicSample[]): { series: MicSeries[]; findings: HealthFinding[] } {
  const groups = new Map<string, Map<string, Map<string, MicSample>>>(); // group -> take -> mic -> sample
  for (const s of samples) {
    const takes = groups.get(s.group) ?? new Map<string, Map<string, MicSample>>();
    const mics = takes.get(s.take) ?? new Map<string, MicSample>();
    mics.set(s.mic, s);
    takes.set(s.take, mics);
    groups.set(s.group, takes);
  }
  const series: MicSeries[] = [];
  const findings: HealthFinding[] = [];
  for (const [group, takes] of groups) {
    const allMics = [...new Set([...takes.values()].flatMap((m) => [...m.keys()]))].sort();
    if (allMics.length < 2) continue;
    // a microphone missing from some takes
    for (const mic of allMics) {
      const lacking = [...takes.entries()].filter(([, m]) => !m.has(mic));
      if (lacking.length === 0) continue;
      const others = lacking.flatMap(([, m]) => [...m.values()].map((s) => s.id));
      findings.push({
        code: "mic-missing", severity: "warning", sampleIds: others,
        message: `${group}: ${lacking.length} take${lacking.length > 1 ? "s have" : " has"} no ${mic} microphone (${lacking.map(([t]) => t).slice(0, 6).join(", ")}${lacking.length > 6 ? " …" : ""}) while ${takes.size - lacking.length} other take${takes.size - lacking.length > 1 ? "s have" : " has"} one.`,
      });
    }
    if (!allMics.includes("close")) continue;
    for (const mic of allMics.filter((m) => m !== "close")) {
      const rows: MicOffset[] = [];
      for (const [take, m] of [...takes.entries()].sort(([a], [b]) => a.localeCompare(b, undefined, { numeric: true }))) {
        const close = m.get("close");
        const other = m.get(mic);
        if (!close?.measurement.onsetWave || !other?.measurement.onsetWave) continue;
        const a = close.measurement.onsetWave;
        const b = other.measurement.onsetWave;
        const { lag, r } = crossCorrelate(decodeOnsetWave(a), decodeOnsetWave(b), Math.round((MAX_LAG_MS / 1000) * ONSET_WAVE_RATE));
        // x[n + lag] matches ref[n]: the other mic hears it at (its window start + lag) against the close window start
        const offsetMs = b.startMs - a.startMs + (lag / a.rate) * 1000;
        rows.push({ take, sampleId: other.id, offsetMs: r2(offsetMs), polarity: Math.abs(r) < MIN_CORRELATION ? 0 : r > 0 ? 1 : -1, correlation: r2(r) });
      }
      if (rows.length === 0) continue;
      const med = median(rows.map((r) => r.offsetMs));
      series.push({ group, mic, medianOffsetMs: r2(med), takes: rows });
      if (rows.length < 3) continue; // two takes cannot say which of them is the odd one
      for (const row of rows) {
        const off = row.offsetMs - med;
        if (Math.abs(off) > OFFSET_TOLERANCE_MS) {
          findings.push({
            code: "mic-offset", severity: "warning", sampleIds: [row.sampleId],
            message: `${group}, take ${row.take}: the ${mic} microphone arrives ${Math.abs(off).toFixed(1)} ms ${off > 0 ? "later" : "earlier"} than in the other takes (${row.offsetMs.toFixed(2)} ms after the close microphone; usually ${r2(med).toFixed(2)} ms). An edit may have shifted it.`,
          });
        }
      }
      const votes = rows.filter((r) => r.polarity !== 0);
      const plus = votes.filter((r) => r.polarity === 1).length;
      const usual = plus >= votes.length - plus ? 1 : -1;
      for (const row of votes.filter((r) => r.polarity !== usual)) {
        findings.push({
          code: "mic-polarity", severity: "warning", sampleIds: [row.sampleId],
          message: `${group}, take ${row.take}: the ${mic} microphone's polarity is inverted against the close microphone, unlike the other takes. Flip it back.`,
        });
      }
    }
  }
  return { series, findings };
}
