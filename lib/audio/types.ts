// The measurement record of one WAV one-shot: the contract between lib/audio (which fills it),
// lib/catalogue (which sorts by it), the workers (which store it) and the UI (which shows it).
// Fields may be added; do not rename or remove fields without bumping MEASURE_VERSION and updating users.

import type { OnsetWave } from "./onset-wave";

export interface WavFormat {
  formatTag: number; // 1 PCM, 3 IEEE float, 0xFFFE extensible (the tag in the fmt chunk)
  encoding: "pcm" | "float";
  bitsPerSample: number; // container bits
  validBits: number;
  channels: number;
  sampleRate: number;
  frames: number;
  durationSec: number;
}

export interface SpectralSummary {
  centroidHz: number;
  spreadHz: number;
  rolloffHz: number;
  flatness: number; // 0..1, amplitude spectrum
  slope: number;
  zcrPerSec: number; // zero crossings per second
  mfcc: number[]; // 13
  barkLoudness: number[]; // 24 Bark bands, specific loudness
}

/** "cut": the sound stops abruptly while still sounding; "decayed": it died away or was faded out (decay.ts). */
export type TailState = "decayed" | "cut";

export interface Measurement {
  measureVersion: number;
  format: WavFormat;
  samplePeakDbfs: number;
  truePeakDbtp: number;
  rmsDbfs: number;
  strikeLufs: number; // max momentary (400 ms) K-weighted loudness
  integratedLufs: number | null; // gated BS.1770 integrated loudness; null if every block is gated out
  crestDb: number;
  dcOffset: number; // mean, in full-scale units (-1..1), worst channel
  clippedRuns: number; // runs of >= 3 consecutive full-scale samples
  clippedSamples: number;
  onsetMs: number; // leading silence
  attackMs: number; // 10 % -> 90 % of the envelope peak
  edtSec: number | null; // early decay time, extrapolated to 60 dB
  t20Sec: number | null; // T20, extrapolated to 60 dB
  tail: TailState;
  noiseFloorDbfs: number;
  stereoCorrelation: number | null; // null for mono
  pitchHz: number | null; // strongest low spectral peak of the body (drum fundamental), null if none
  strike: SpectralSummary; // first ~80 ms after onset
  body: SpectralSummary | null; // after the strike, while above the noise floor
  truncated: boolean; // data chunk shorter than its header claimed (measured what was there)
  warnings: string[];
  perChannel?: ChannelLevels[]; // added in MEASURE_VERSION 1: the level figures of each channel, in file order
  noiseFloorMeasured?: boolean; // true when the floor was measured on a lead-in or a stationary tail; false: an upper bound (quietest 10 ms)
  // added in MEASURE_VERSION 2 (decay.ts): where the sound stops, i.e. the level of its last millisecond before
  // any trailing digital silence
  tailEndDb?: number; // dB re the loudest 10 ms (e.g. -31: stops 31 dB under its peak level)
  tailEndAboveFloorDb?: number | null; // dB above the measured noise floor; null when no floor could be measured
  // added in MEASURE_VERSION 3 (onset-wave.ts): the strike's first milliseconds, to compare microphones of one take
  onsetWave?: OnsetWave;
}

export interface ChannelLevels {
  samplePeakDbfs: number;
  truePeakDbtp: number;
  rmsDbfs: number;
  dcOffset: number;
  clippedRuns: number;
}
