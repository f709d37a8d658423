// The feature vector used to compare sounds (classification and nearest neighbours), and z-score standardisation.
// Frequencies and times are taken in log2 so that equal ratios weigh equally (an octave is an octave at any pitch).

import type { Measurement } from "../audio/types";

export const FEATURE_NAMES = [
  "log2 decay (s)",
  "log2 strike centroid (Hz)",
  "log2 body centroid (Hz)",
  "strike flatness",
  "body flatness",
  "log2 zero-crossing rate (/s)",
  "log2 pitch (Hz)",
  "crest factor (dB)",
  "log2 attack (ms)",
  "log2 body rolloff (Hz)",
  "mfcc 1",
  "mfcc 2",
  "mfcc 3",
  "mfcc 4",
] as const;

export const FEATURE_COUNT = FEATURE_NAMES.length;

/** Decay time in seconds: EDT if measured, else T20, else the duration after the onset. */
export function decaySec(m: Measurement): number {
  if (m.edtSec !== null && Number.isFinite(m.edtSec) && m.edtSec > 0) return m.edtSec;
  if (m.t20Sec !== null && Number.isFinite(m.t20Sec) && m.t20Sec > 0) return m.t20Sec;
  return Math.max(0.001, m.format.durationSec - m.onsetMs / 1000);
}

const log2 = (x: number | null | undefined, min = 1e-6) => (x === null || x === undefined || !Number.isFinite(x) || x <= 0 ? NaN : Math.log2(Math.max(min, x)));
const fin = (x: number | null | undefined) => (x === null || x === undefined || !Number.isFinite(x) ? NaN : x);

/** The feature vector of a measurement (NaN where a feature is missing; standardisation fills it with the mean). */
export function featureVector(m: Measurement): number[] {
  const body = m.body ?? m.strike;
  return [
    log2(decaySec(m)),
    log2(m.strike.centroidHz),
    log2(body.centroidHz),
    fin(m.strike.flatness),
    fin(body.flatness),
    log2(m.strike.zcrPerSec),
    log2(m.pitchHz),
    fin(m.crestDb),
    log2(Math.max(0.05, m.attackMs)),
    log2(body.rolloffHz),
    fin(m.strike.mfcc[1]),
    fin(m.strike.mfcc[2]),
    fin(m.strike.mfcc[3]),
    fin(m.strike.mfcc[4]),
  ];
}

export interface Standardiser {
  mean: number[];
  sd: number[];
}

/** Column means and standard deviations (population), ignoring NaN; a constant column gets sd 1. */
export function fitStandardiser(rows: number[][]): Standardiser {
  const d = rows[0]?.length ?? 0;
  const mean = new Array<number>(d).fill(0);
  const sd = new Array<number>(d).fill(1);
  for (let j = 0; j < d; j++) {
    const col = rows.map((r) => r[j]!).filter((x) => Number.isFinite(x));
    if (col.length === 0) continue;
    const mu = col.reduce((a, b) => a + b, 0) / col.length;
    const v = col.reduce((a, b) => a + (b - mu) ** 2, 0) / col.length;
    mean[j] = mu;
    sd[j] = v > 1e-12 ? Math.sqrt(v) : 1;
  }
  return { mean, sd };
}

/** z-scores of one vector; missing (NaN) features become 0, the mean. */
export function standardise(v: number[], s: Standardiser): number[] {
  return v.map((x, j) => (Number.isFinite(x) ? (x - s.mean[j]!) / s.sd[j]! : 0));
}

/** Euclidean distance between two standardised vectors, optionally weighted per feature. */
export function distance(a: number[], b: number[], weights?: number[]): number {
  let s = 0;
  for (let j = 0; j < a.length; j++) {
    const w = weights?.[j] ?? 1;
    s += w * (a[j]! - b[j]!) ** 2;
  }
  return Math.sqrt(s);
}
