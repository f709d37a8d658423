// Onset (leading silence) and attack time of a one-shot.
// Onset: the first sample whose magnitude (any channel) reaches a threshold of -50 dB re the sample peak,
// raised to twice the largest magnitude of the first millisecond when the file starts in noise (so a noisy
// lead-in is not mistaken for the strike) and never above -20 dB re peak; each channel's DC offset is
// removed first. (Thresholds: common practice in
// trimming tools, no published source.)
// Attack: 10 % to 90 % of the amplitude envelope peak (common rise-time definition), on the Hilbert
// envelope (magnitude of the analytic signal, computed with one FFT over the first 120 ms after onset)
// of the loudest channel, so low drums whose waveform period exceeds the attack still have a smooth envelope.
import FFT from "fft.js";

export const ONSET_THRESHOLD_DB = -50;
export const ATTACK_WINDOW_SEC = 0.12;

export function peakOf(channels: ArrayLike<number>[]): number {
  let p = 0;
  for (const x of channels) for (let i = 0; i < x.length; i++) { const a = Math.abs(x[i]); if (a > p) p = a; }
  return p;
}

/** Index of the first sample of the strike, or 0 for silence. */
export function onsetIndex(channels: ArrayLike<number>[], fs: number, peak = peakOf(channels), dcOffsets?: number[]): number {
  if (peak === 0) return 0;
  const n = channels[0].length;
  const dc = (c: number) => dcOffsets?.[c] ?? 0; // a DC offset must not pass for the strike
  const lead = Math.min(n, Math.max(1, Math.round(fs / 1000)));
  let leadMax = 0;
  channels.forEach((x, c) => { const d = dc(c); for (let i = 0; i < lead; i++) leadMax = Math.max(leadMax, Math.abs(x[i] - d)); });
  const thr = Math.min(peak * 10 ** (-20 / 20), Math.max(peak * 10 ** (ONSET_THRESHOLD_DB / 20), 2 * leadMax));
  let first = n;
  channels.forEach((x, c) => {
    const d = dc(c);
    for (let i = 0; i < first; i++) if (Math.abs(x[i] - d) >= thr) { first = i; break; }
  });
  return first === n ? 0 : first;
}

const fftCache = new Map<number, FFT>();
export function getFft(n: number): FFT {
  let f = fftCache.get(n);
  if (!f) { f = new FFT(n); fftCache.set(n, f); }
  return f;
}

/**
 * Hilbert envelope |x + j H{x}| of x[start, start + len), zero-padded to a power of two of at least
 * `padding` times len (the default quarter of padding keeps circular wrap-around away from the start).
 */
export function hilbertEnvelope(x: ArrayLike<number>, start: number, len: number, padding = 1.25): Float64Array {
  let N = 1;
  while (N < padding * len) N *= 2;
  const f = getFft(N);
  const input = new Float64Array(N);
  for (let i = 0; i < len && start + i < x.length; i++) input[i] = x[start + i];
  const spec = new Float64Array(2 * N);
  f.realTransform(spec, input);
  f.completeSpectrum(spec);
  // analytic signal: keep DC and Nyquist, double positive frequencies, zero negative ones
  for (let k = 1; k < N / 2; k++) { spec[2 * k] *= 2; spec[2 * k + 1] *= 2; }
  for (let k = N / 2 + 1; k < N; k++) { spec[2 * k] = 0; spec[2 * k + 1] = 0; }
  const out = new Float64Array(2 * N);
  f.inverseTransform(out, spec);
  const env = new Float64Array(len);
  for (let i = 0; i < len; i++) { const re = out[2 * i], im = out[2 * i + 1]; env[i] = Math.sqrt(re * re + im * im); }
  return env;
}

/** 10 % -> 90 % rise time of the envelope peak, in ms, starting the search at the onset. */
export function attackMs(channels: ArrayLike<number>[], fs: number, onset: number, loudestChannel?: number): number {
  let loud = channels[loudestChannel ?? 0];
  if (loudestChannel === undefined) {
    let lp = 0;
    for (const x of channels) { const p = peakOf([x]); if (p > lp) { lp = p; loud = x; } }
  }
  const pre = Math.min(onset, Math.round(0.002 * fs));
  const start = onset - pre;
  const len = Math.min(loud.length - start, Math.round(ATTACK_WINDOW_SEC * fs) + pre);
  const env = hilbertEnvelope(loud, start, len);
  let peak = 0, peakAt = 0;
  for (let i = 0; i < len; i++) if (env[i] > peak) { peak = env[i]; peakAt = i; }
  const crossing = (level: number): number => {
    for (let i = 0; i <= peakAt; i++) {
      if (env[i] >= level) {
        if (i === 0) return 0;
        return i - 1 + (level - env[i - 1]) / (env[i] - env[i - 1]); // linear interpolation between samples
      }
    }
    return peakAt;
  };
  return ((crossing(0.9 * peak) - crossing(0.1 * peak)) / fs) * 1000;
}
