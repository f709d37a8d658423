// Spectral and time-domain features of short frames, from one real FFT per frame (fft.js):
// centroid and spread in Hz (first moment and standard deviation of the amplitude spectrum), rolloff
// (99 % of the amplitude sum, in Hz), flatness (geometric / arithmetic mean of the amplitude spectrum),
// slope (Peeters 2004: linear-regression slope of amplitude against frequency, divided by the amplitude
// sum, per Hz), zero-crossing rate (rect window), 13 MFCCs and 24 Bark-band specific loudness values.
// The formulas of centroid, spread, flatness, zcr, MFCC and Bark loudness follow meyda 5.6.3 exactly (same
// symmetric Hann window, mel filter bank, log(1 + energy) and DCT-II, Bark band edges, 0.23 exponent) and
// are tested against it; centroid and spread are converted from bins to Hz; rolloff uses the true bin width
// fs/N (meyda divides by N/2 - 1 bins); slope is computed per Peeters because meyda's denominator omits the
// bin count (its sign is inverted): tested against a general-purpose linear regression.
// All of them read the spectrum up to ANALYSIS_TOP_HZ (24 kHz, the Nyquist frequency of 48 kHz audio) and no
// higher: at 44.1 and 48 kHz that is the whole spectrum, as meyda reads it; at 88.2, 96 or 192 kHz the bins above
// are left out, so a sound recorded at a high rate gives the features it gives at 48 kHz (counting the mostly
// empty band above 24 kHz would drop the flatness several times over and move the slope, Bark bands and mel bank).
import FFT from "fft.js";

/** The top of the band the frame features read (Hz): the Nyquist frequency of 48 kHz audio. */
export const ANALYSIS_TOP_HZ = 24000;

export const MFCC_COUNT = 13;
export const MEL_BANDS = 26;
export const BARK_BANDS = 24;

export interface FrameFeatures {
  centroidHz: number;
  spreadHz: number;
  rolloffHz: number;
  flatness: number;
  slope: number;
  zcr: number; // crossings in the frame (meyda's count)
  mfcc: number[];
  bark: number[];
  energy: number; // sum of squared amplitude spectrum (frame weight)
}

/** meyda's symmetric Hann window: 0.5 - 0.5 cos(2 pi i / (N - 1)). */
export function hann(N: number): Float64Array {
  const w = new Float64Array(N);
  for (let i = 0; i < N; i++) w[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (N - 1));
  return w;
}

/** Frame length for a sample rate: the power of two nearest to about 43 ms (2048 at 44.1/48 kHz), at least 512. */
export function frameSizeFor(fs: number): number {
  return 2 ** Math.max(9, Math.round(Math.log2(fs * 0.0427))); // at least 512 so 26 mel bands get bins
}

const melOf = (f: number) => 1125 * Math.log(1 + f / 700);
const hzOfMel = (m: number) => 700 * (Math.exp(m / 1125) - 1);

export class SpectralAnalyzer {
  readonly N: number;
  readonly fs: number;
  private fft: FFT;
  private window: Float64Array;
  private input: Float64Array;
  private out: Float64Array;
  readonly amp: Float64Array; // amplitude spectrum of the last frame, bins 0..N/2-1
  /** bins the features read: 0..L-1, up to ANALYSIS_TOP_HZ (all N/2 at 48 kHz and below) */
  readonly L: number;
  private mel: { start: number; w: Float64Array }[];
  private barkLimits: Int32Array;
  private dct: Float64Array;

  constructor(N: number, fs: number) {
    this.N = N;
    this.fs = fs;
    this.fft = new FFT(N);
    this.window = hann(N);
    this.input = new Float64Array(N);
    this.out = new Float64Array(2 * N); // typed storage: fft.js indexes it like its own arrays, faster
    this.amp = new Float64Array(N / 2);
    this.L = Math.min(N / 2, Math.ceil((ANALYSIS_TOP_HZ * N) / fs)); // bins under ANALYSIS_TOP_HZ
    // mel filter bank as meyda builds it (triangles on floor((N + 1) f / fs) bins, 0 to Nyquist; here to the
    // analysis top when the rate is higher)
    const melMax = melOf(Math.min(fs / 2, ANALYSIS_TOP_HZ));
    const bins: number[] = [];
    const f32 = Math.fround; // meyda keeps these in Float32Arrays; round alike so the bins match
    for (let i = 0; i < MEL_BANDS + 2; i++) bins.push(Math.floor(((N + 1) * f32(hzOfMel(f32((i * melMax) / (MEL_BANDS + 1))))) / fs));
    this.mel = [];
    for (let j = 0; j < MEL_BANDS; j++) {
      const a = bins[j], b = bins[j + 1], c = bins[j + 2];
      const w = new Float64Array(Math.max(0, Math.min(c, this.L) - a));
      for (let i = a; i < b && i < this.L; i++) w[i - a] = (i - a) / (b - a);
      for (let i = b; i < c && i < this.L; i++) w[i - a] = (c - i) / (c - b);
      this.mel.push({ start: a, w });
    }
    // Bark band limits as meyda computes them (Traunmueller-like 13 atan(f/1315.8) + 3.5 atan((f/7518)^2))
    const L = this.L;
    const bark = new Float64Array(L);
    for (let i = 0; i < L; i++) { const f = (i * fs) / N; bark[i] = 13 * Math.atan(f / 1315.8) + 3.5 * Math.atan((f / 7518) ** 2); }
    // meyda keeps the scale in a Float32Array: round the same way so band edges match bin for bin
    const bark32 = Float32Array.from(bark);
    const limits = new Int32Array(BARK_BANDS + 1);
    let end = bark32[L - 1] / BARK_BANDS, band = 1;
    for (let i = 0; i < L; i++) {
      while (bark32[i] > end) { limits[band++] = i; end = (band * bark32[L - 1]) / BARK_BANDS; }
    }
    limits[BARK_BANDS] = L - 1;
    this.barkLimits = limits;
    this.dct = new Float64Array(MFCC_COUNT * MEL_BANDS);
    for (let k = 0; k < MFCC_COUNT; k++) for (let n = 0; n < MEL_BANDS; n++) this.dct[k * MEL_BANDS + n] = 2 * Math.cos((Math.PI / MEL_BANDS) * (n + 0.5) * k);
  }

  /** Amplitude spectrum |FFT(hann * frame)| of x[start, start + N) (zero beyond the end). */
  spectrum(x: ArrayLike<number>, start: number): Float64Array {
    const { N, input, window, out, amp } = this;
    const avail = Math.max(0, Math.min(N, x.length - start));
    for (let i = 0; i < avail; i++) input[i] = x[start + i] * window[i];
    input.fill(0, avail);
    this.fft.realTransform(out, input);
    for (let k = 0; k < N / 2; k++) { const re = out[2 * k], im = out[2 * k + 1]; amp[k] = Math.sqrt(re * re + im * im); }
    return amp;
  }

  /** All features of the frame x[start, start + N). */
  analyze(x: ArrayLike<number>, start: number): FrameFeatures {
    const { N, fs } = this;
    let zcr = 0;
    const end = Math.min(x.length, start + N);
    for (let i = start + 1; i < end; i++) if ((x[i - 1] >= 0) !== (x[i] >= 0)) zcr++;
    const a = this.spectrum(x, start);
    return { ...featuresOfSpectrum(a.subarray(0, this.L), fs, N, this.mel, this.barkLimits, this.dct), zcr };
  }
}

function featuresOfSpectrum(
  a: Float64Array,
  fs: number,
  N: number,
  mel: { start: number; w: Float64Array }[],
  barkLimits: Int32Array,
  dct: Float64Array,
): Omit<FrameFeatures, "zcr"> {
  const L = a.length;
  const binHz = fs / N;
  let sum = 0, m1 = 0, m2 = 0, logSum = 0, energy = 0, sf = 0, sff = 0, sfa = 0;
  for (let k = 0; k < L; k++) {
    const v = a[k];
    sum += v;
    m1 += k * v;
    m2 += k * k * v;
    logSum += Math.log(v);
    energy += v * v;
    const f = k * binHz;
    sf += f;
    sff += f * f;
    sfa += f * v;
  }
  const mu1 = m1 / sum;
  const centroidHz = mu1 * binHz;
  const spreadHz = Math.sqrt(Math.max(0, m2 / sum - mu1 * mu1)) * binHz;
  let ec = sum, n = L - 1;
  const thr = 0.99 * sum;
  while (ec > thr && n >= 0) { ec -= a[n]; n--; }
  const rolloffHz = (n + 1) * binHz;
  const flatness = (Math.exp(logSum / L) * L) / sum;
  const slope = (L * sfa - sf * sum) / (L * sff - sf * sf) / sum;
  const logMel = new Float64Array(MEL_BANDS);
  for (let j = 0; j < MEL_BANDS; j++) {
    const { start, w } = mel[j];
    let e = 0;
    for (let i = 0; i < w.length; i++) e += w[i] * a[start + i] * a[start + i];
    logMel[j] = Math.log(e + 1);
  }
  const mfcc: number[] = [];
  for (let k = 0; k < MFCC_COUNT; k++) { let s = 0; for (let j = 0; j < MEL_BANDS; j++) s += dct[k * MEL_BANDS + j] * logMel[j]; mfcc.push(s); }
  const bark: number[] = [];
  for (let b = 0; b < BARK_BANDS; b++) { let s = 0; for (let j = barkLimits[b]; j < barkLimits[b + 1]; j++) s += a[j]; bark.push(s ** 0.23); }
  return { centroidHz, spreadHz, rolloffHz, flatness, slope, mfcc, bark, energy };
}

/** Peeters' spectral slope of any amplitude spectrum (exported for tests). */
export function spectralSlope(a: ArrayLike<number>, fs: number, N: number): number {
  let sum = 0, sf = 0, sff = 0, sfa = 0;
  const L = a.length;
  for (let k = 0; k < L; k++) { const f = (k * fs) / N; sum += a[k]; sf += f; sff += f * f; sfa += f * a[k]; }
  return (L * sfa - sf * sum) / (L * sff - sf * sf) / sum;
}

export interface SpectralSummaryInput {
  frames: FrameFeatures[];
  N: number;
  fs: number;
}

/** Energy-weighted mean of the frames' features; silent frames (energy 0) carry no weight. */
export function summarize(frames: FrameFeatures[], N: number, fs: number): import("./types").SpectralSummary {
  const live = frames.filter((f) => f.energy > 0 && Number.isFinite(f.centroidHz));
  const total = live.reduce((s, f) => s + f.energy, 0);
  const avg = (get: (f: FrameFeatures) => number) => (total > 0 ? live.reduce((s, f) => s + f.energy * (Number.isFinite(get(f)) ? get(f) : 0), 0) / total : 0);
  const vec = (get: (f: FrameFeatures) => number[], len: number) => Array.from({ length: len }, (_, i) => avg((f) => get(f)[i]));
  return {
    centroidHz: avg((f) => f.centroidHz),
    spreadHz: avg((f) => f.spreadHz),
    rolloffHz: avg((f) => f.rolloffHz),
    flatness: avg((f) => f.flatness),
    slope: avg((f) => f.slope),
    zcrPerSec: avg((f) => (f.zcr * fs) / (N - 1)),
    mfcc: vec((f) => f.mfcc, MFCC_COUNT),
    barkLoudness: vec((f) => f.bark, BARK_BANDS),
  };
}

/**
 * Strongest spectral peak between 30 Hz and 1 kHz of x[start, start + N) (Hann window, parabolic
 * interpolation of the dB magnitudes). null when it is not a peak (less than 12 dB over the median of the
 * range) or the range is 40 dB or more below the strongest bin of the whole spectrum (nothing tonal down there).
 */
export function lowPeakHz(x: ArrayLike<number>, start: number, N: number, fs: number): number | null {
  const an = analyzerFor(N, fs);
  const a = an.spectrum(x, start);
  const lo = Math.max(1, Math.ceil((30 * N) / fs));
  const hi = Math.min(a.length - 2, Math.floor((1000 * N) / fs));
  if (hi <= lo) return null;
  let best = lo, all = 0;
  for (let k = 1; k < a.length; k++) all = Math.max(all, a[k]);
  for (let k = lo; k <= hi; k++) if (a[k] > a[best]) best = k;
  const range = Array.from(a.subarray(lo, hi + 1)).sort((p, q) => p - q);
  const median = range[Math.floor(range.length / 2)];
  if (a[best] === 0 || a[best] < 4 * median || a[best] < all * 0.01) return null;
  const db = (k: number) => 20 * Math.log10(Math.max(a[k], 1e-300));
  const y0 = db(best - 1), y1 = db(best), y2 = db(best + 1);
  const d = y0 - 2 * y1 + y2;
  const delta = d === 0 ? 0 : (0.5 * (y0 - y2)) / d;
  return ((best + delta) * fs) / N;
}

const analyzers = new Map<string, SpectralAnalyzer>();
export function analyzerFor(N: number, fs: number): SpectralAnalyzer {
  const key = `${N}@${fs}`;
  let a = analyzers.get(key);
  if (!a) { a = new SpectralAnalyzer(N, fs); analyzers.set(key, a); }
  return a;
}
