// The full measurement of one WAV one-shot (the Measurement record of types.ts): levels, BS.1770-4
// loudness and true peak, onset and attack, Schroeder decay, tail state and noise floor, stereo
// correlation, pitch, and spectral features summarised over the strike (first 80 ms after the onset) and
// the body (from there until the sound falls to 10 dB above the noise floor; at most 8 frames spread
// evenly). Only those frames are analysed, one real FFT each, so a 1.5 s file costs a dozen FFTs.
import type { Measurement, SpectralSummary } from "./types";
import { decodeWav, type DecodedWav, type DecodeOptions } from "./decode";
import type { WavMetadata } from "./chunks";
import { MEASURE_VERSION } from "./version";
import { levels, correlationAndMono, toDb, SILENCE_DB } from "./levels";
import { truePeaks } from "./true-peak";
import { loudness } from "./loudness";
import { onsetIndex, attackMs } from "./onset";
import { onsetWave } from "./onset-wave";
import { analyseDecay } from "./decay";
import { analyzerFor, frameSizeFor, lowPeakHz, summarize, MFCC_COUNT, BARK_BANDS, type FrameFeatures } from "./spectral";

export const STRIKE_SEC = 0.08;
export const MAX_BODY_FRAMES = 8;

function emptySummary(): SpectralSummary {
  return { centroidHz: 0, spreadHz: 0, rolloffHz: 0, flatness: 0, slope: 0, zcrPerSec: 0, mfcc: new Array(MFCC_COUNT).fill(0), barkLoudness: new Array(BARK_BANDS).fill(0) };
}

/** Mono mix (mean of the channels) used for the spectral features and pitch. */
export function monoMix(channels: Float32Array[]): Float32Array {
  if (channels.length === 1) return channels[0];
  const n = channels[0].length;
  const out = new Float32Array(n);
  const g = 1 / channels.length;
  for (const x of channels) for (let i = 0; i < n; i++) out[i] += x[i] * g;
  return out;
}

export function measure(decoded: DecodedWav): Measurement {
  const { format, channels } = decoded;
  const fs = format.sampleRate;
  const n = format.frames;
  const warnings = [...decoded.warnings];
  const lv = levels(channels, decoded.clipLevel);
  const { correlation, mono } = correlationAndMono(channels);
  const base = {
    measureVersion: MEASURE_VERSION,
    format,
    dcOffset: lv.dcOffset,
    clippedRuns: lv.clippedRuns,
    clippedSamples: lv.clippedSamples,
    truncated: decoded.truncated,
    stereoCorrelation: correlation,
  };
  if (lv.samplePeak === 0) {
    warnings.push("silent: every sample is zero");
    return {
      ...base,
      samplePeakDbfs: SILENCE_DB, truePeakDbtp: SILENCE_DB, rmsDbfs: SILENCE_DB, strikeLufs: SILENCE_DB, integratedLufs: null,
      crestDb: 0, onsetMs: 0, attackMs: 0, edtSec: null, t20Sec: null, tail: "decayed", noiseFloorDbfs: SILENCE_DB,
      tailEndDb: SILENCE_DB, tailEndAboveFloorDb: null,
      pitchHz: null, strike: emptySummary(), body: null, warnings,
      perChannel: channels.map(() => ({ samplePeakDbfs: SILENCE_DB, truePeakDbtp: SILENCE_DB, rmsDbfs: SILENCE_DB, dcOffset: 0, clippedRuns: 0 })),
    };
  }
  if (lv.clippedRuns > 0) warnings.push(`clipped: ${lv.clippedRuns} run(s) of full-scale samples (${lv.clippedSamples} samples)`);
  const tps = truePeaks(channels, fs, lv.perChannel.map((c) => c.blockMax));
  const tp = Math.max(...tps);
  const ld = loudness(channels, fs, decoded.channelMask);
  const onset = onsetIndex(channels, fs, lv.samplePeak, lv.perChannel.map((c) => c.dc));
  const attack = attackMs(channels, fs, onset, lv.loudestChannel);
  const dec = analyseDecay(channels, fs, onset, { pcmBits: format.encoding === "pcm" ? format.validBits : null });
  if (dec.tail === "cut") warnings.push(`tail cut off while still sounding (it stops ${Math.round(-dec.tailEndDb)} dB under its peak level)`);

  const N = frameSizeFor(fs);
  const hop = N / 2;
  const an = analyzerFor(N, fs);
  const strikeLen = Math.round(STRIKE_SEC * fs);
  const strikeFrames: FrameFeatures[] = [];
  const kStrike = Math.max(1, Math.round((strikeLen - N) / hop) + 1);
  for (let k = 0; k < kStrike; k++) {
    const s = onset + k * hop;
    if (s >= n) break;
    strikeFrames.push(an.analyze(mono, s));
  }
  const bodyStart = onset + strikeLen;
  const bodyEnd = Math.min(n, Math.max(dec.soundEnd, bodyStart));
  let body: SpectralSummary | null = null;
  if (bodyEnd - bodyStart >= N / 2) {
    const span = Math.max(0, bodyEnd - bodyStart - N);
    const count = Math.min(MAX_BODY_FRAMES, Math.floor(span / hop) + 1);
    const frames: FrameFeatures[] = [];
    for (let k = 0; k < count; k++) frames.push(an.analyze(mono, bodyStart + (count === 1 ? 0 : Math.round((k * span) / (count - 1)))));
    body = summarize(frames, N, fs);
  }
  const pitchN = N * 4;
  const pitchStart = body ? bodyStart : onset;
  const pitchHz = lowPeakHz(mono, pitchStart, pitchN, fs);

  const rmsDb = toDb(lv.rms);
  const peakDb = toDb(lv.samplePeak);
  return {
    ...base,
    samplePeakDbfs: peakDb,
    truePeakDbtp: toDb(tp),
    rmsDbfs: rmsDb,
    strikeLufs: Number.isFinite(ld.maxMomentaryLufs) ? Math.max(SILENCE_DB, ld.maxMomentaryLufs) : SILENCE_DB,
    integratedLufs: ld.integratedLufs,
    crestDb: peakDb - rmsDb,
    onsetMs: (onset / fs) * 1000,
    onsetWave: onsetWave(channels, fs, onset),
    attackMs: attack,
    edtSec: dec.edtSec,
    t20Sec: dec.t20Sec,
    tail: dec.tail,
    noiseFloorDbfs: dec.noiseFloorDbfs,
    noiseFloorMeasured: dec.noiseFloorKnown,
    tailEndDb: dec.tailEndDb,
    tailEndAboveFloorDb: dec.tailEndAboveFloorDb,
    pitchHz,
    strike: strikeFrames.length ? summarize(strikeFrames, N, fs) : emptySummary(),
    body,
    warnings,
    perChannel: lv.perChannel.map((c, i) => ({ samplePeakDbfs: toDb(c.peak), truePeakDbtp: toDb(tps[i]), rmsDbfs: toDb(c.rms), dcOffset: c.dc, clippedRuns: c.clippedRuns })),
  };
}

export type MeasuredFile = Measurement & { metadata: WavMetadata };

/** Decode and measure, throwing the WavRefusal (tests and tools that want the record alone; the pipeline calls measureWav). */
export function measureBytes(bytes: Uint8Array, opts?: DecodeOptions): MeasuredFile {
  const decoded = decodeWav(bytes, opts);
  return { ...measure(decoded), metadata: decoded.metadata };
}
