// Test helpers of lib/catalogue: a seeded random generator and a Measurement factory.
// Not used by the product code.

import type { Measurement, SpectralSummary } from "../audio/types";

/** mulberry32 (lib/synth/rng.ts): repeatable test data. */
import { mulberry32 } from "../synth/rng";
export { mulberry32 as rng };

export function spectral(p: Partial<SpectralSummary> = {}): SpectralSummary {
  return {
    centroidHz: 1000,
    spreadHz: 1500,
    rolloffHz: 5000,
    flatness: 0.2,
    slope: 0,
    zcrPerSec: 2000,
    mfcc: new Array(13).fill(0),
    barkLoudness: new Array(24).fill(0),
    ...p,
  };
}

export interface DrumShape {
  decaySec: number;
  strikeCentroidHz: number;
  bodyCentroidHz: number;
  strikeFlatness: number;
  bodyFlatness: number;
  pitchHz: number | null;
  attackMs?: number;
  crestDb?: number;
  rolloffHz?: number;
  spreadHz?: number;
}

/** A Measurement-shaped fixture; `shape` sets the features the classifier reads, `over` anything else. */
export function measurement(shape: Partial<DrumShape> = {}, over: Partial<Measurement> = {}): Measurement {
  const s: DrumShape = {
    decaySec: 0.5, strikeCentroidHz: 1500, bodyCentroidHz: 800, strikeFlatness: 0.2, bodyFlatness: 0.1, pitchHz: 150, ...shape,
  };
  const roll = s.rolloffHz ?? Math.min(20000, s.bodyCentroidHz * 4);
  return {
    measureVersion: 1,
    format: { formatTag: 1, encoding: "pcm", bitsPerSample: 24, validBits: 24, channels: 2, sampleRate: 44100, frames: 44100, durationSec: 1 },
    samplePeakDbfs: -3,
    truePeakDbtp: -2.8,
    rmsDbfs: -20,
    strikeLufs: -18,
    integratedLufs: -20,
    crestDb: s.crestDb ?? 17,
    dcOffset: 0,
    clippedRuns: 0,
    clippedSamples: 0,
    onsetMs: 1,
    attackMs: s.attackMs ?? 2,
    edtSec: s.decaySec,
    t20Sec: s.decaySec * 1.1,
    tail: "decayed",
    noiseFloorDbfs: -90,
    stereoCorrelation: 0.9,
    pitchHz: s.pitchHz,
    strike: spectral({
      centroidHz: s.strikeCentroidHz,
      flatness: s.strikeFlatness,
      zcrPerSec: s.strikeCentroidHz * 1.6,
      rolloffHz: Math.min(20000, s.strikeCentroidHz * 4),
      spreadHz: s.spreadHz ?? s.strikeCentroidHz,
    }),
    body: spectral({
      centroidHz: s.bodyCentroidHz,
      flatness: s.bodyFlatness,
      zcrPerSec: s.bodyCentroidHz * 1.6,
      rolloffHz: roll,
      spreadHz: s.spreadHz ?? s.bodyCentroidHz,
    }),
    truncated: false,
    warnings: [],
    ...over,
  };
}

/** Shuffled copy, Fisher-Yates with a seeded generator (so names and input order carry no information). */
export function shuffled<T>(xs: T[], seed: number): T[] {
  const r = mulberry32(seed);
  const out = [...xs];
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}
