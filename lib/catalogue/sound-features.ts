// The features the trained sound model reads from a measurement (lib/audio's Measurement record): the
// spectral shape of the strike (first 80 ms) and of the body, their contrast, the decay, pitch, attack and
// noise. Everything is level-free (a soft and a hard hit differ by what the sound does, not by the file's
// gain): Bark loudness is taken as each band's share of the total, the noise floor is read relative to the
// peak. The MFCCs are left out: lib/audio takes them of log(1 + energy) on a full scale of 1, where the +1
// swamps a quiet band, so every coefficient moves with the gain (at -30 dB by several times its size).
// Without them the model reads a quiet and a loud copy alike and did no worse on held-out recordings
// (scripts/sound-model/README.md). Frequencies and times are in log2 (an octave is an octave).
// Missing values (no body, no pitch, decay not measurable) become a fixed out-of-range value plus a 0/1
// flag, since the decision trees cannot take NaN.

import type { Measurement, SpectralSummary } from "../audio/types";
import { decaySec } from "./features";

const MISSING = -20;
const lg = (x: number | null | undefined) => (x !== null && x !== undefined && Number.isFinite(x) && x > 0 ? Math.log2(x) : MISSING);
const fin = (x: number | null | undefined, dflt = 0) => (x !== null && x !== undefined && Number.isFinite(x) ? x : dflt);

const SPECTRAL_NAMES = [
  "log2 centroid", "log2 spread", "log2 rolloff", "flatness", "slope", "log2 zcr",
  ...Array.from({ length: 24 }, (_, i) => `bark ${i + 1} share`),
];

function spectral(s: SpectralSummary): number[] {
  const bark = s.barkLoudness ?? [];
  const total = bark.reduce((a, b) => a + (Number.isFinite(b) ? b : 0), 0);
  return [
    lg(s.centroidHz), lg(s.spreadHz), lg(s.rolloffHz), fin(s.flatness), fin(s.slope) * 1e4, lg(s.zcrPerSec),
    ...Array.from({ length: 24 }, (_, i) => (total > 0 ? fin(bark[i]) / total : 0)),
  ];
}

export const SOUND_FEATURE_NAMES: readonly string[] = [
  "log2 decay (s)", "log2 EDT (s)", "EDT measured", "log2 T20 (s)", "T20 measured", "log2 length after onset (s)",
  "log2 pitch (Hz)", "pitch found", "crest factor (dB)", "log2 attack (ms)", "stereo correlation",
  "noise floor re peak (dB)", "body found", "log2 body/strike centroid", "body - strike flatness",
  ...SPECTRAL_NAMES.map((n) => `strike ${n}`),
  ...SPECTRAL_NAMES.map((n) => `body ${n}`),
];

/** The model's feature vector of one measurement (same order as SOUND_FEATURE_NAMES). */
export function soundFeatures(m: Measurement): number[] {
  const body = m.body ?? m.strike;
  const after = Math.max(0.001, m.format.durationSec - m.onsetMs / 1000);
  return [
    lg(decaySec(m)),
    lg(m.edtSec), m.edtSec ? 1 : 0,
    lg(m.t20Sec), m.t20Sec ? 1 : 0,
    lg(after),
    lg(m.pitchHz), m.pitchHz ? 1 : 0,
    fin(m.crestDb),
    lg(Math.max(0.05, fin(m.attackMs, 0.05))),
    m.stereoCorrelation === null ? 1 : fin(m.stereoCorrelation, 1),
    Math.max(-150, fin(m.noiseFloorDbfs, -150) - fin(m.samplePeakDbfs, 0)),
    m.body ? 1 : 0,
    lg(body.centroidHz) - lg(m.strike.centroidHz),
    fin(body.flatness) - fin(m.strike.flatness),
    ...spectral(m.strike),
    ...spectral(body),
  ];
}
