// Helpers for the synthesizer's tests only: spectra through fft.js (a general-purpose reference FFT) and a
// naive DFT for fine frequency resolution, envelopes and decay times.
import FFT from "fft.js";

/** Magnitude spectrum of x[start .. start+size) with a Hann window (size a power of two). */
export function magnitudeSpectrum(x: Float32Array, start: number, size: number): Float64Array {
  const f = new FFT(size);
  const input = new Array<number>(size).fill(0);
  for (let i = 0; i < size; i++) {
    const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (size - 1));
    input[i] = (x[start + i] ?? 0) * w;
  }
  const out = f.createComplexArray() as number[];
  f.realTransform(out, input);
  const mag = new Float64Array(size / 2);
  for (let k = 0; k < size / 2; k++) mag[k] = Math.hypot(out[2 * k], out[2 * k + 1]);
  return mag;
}

/** Spectral centroid in Hz of the magnitude spectrum. */
export function centroidHz(x: Float32Array, sr: number, start: number, size = 4096): number {
  const mag = magnitudeSpectrum(x, start, size);
  let num = 0;
  let den = 0;
  for (let k = 1; k < mag.length; k++) {
    num += ((k * sr) / size) * mag[k];
    den += mag[k];
  }
  return num / den;
}

/** Naive DFT magnitude at frequency f over x[start .. end) with a Hann window. */
export function dftMag(x: Float32Array, sr: number, f: number, start: number, end: number): number {
  let re = 0;
  let im = 0;
  const n = end - start;
  const w = (2 * Math.PI * f) / sr;
  for (let i = 0; i < n; i++) {
    const h = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1));
    const v = x[start + i] * h;
    re += v * Math.cos(w * i);
    im -= v * Math.sin(w * i);
  }
  return Math.hypot(re, im);
}

/** Frequency of the strongest naive-DFT peak between lo and hi Hz, in `step` Hz steps. */
export function strongestPeakHz(x: Float32Array, sr: number, lo: number, hi: number, start: number, end: number, step = 1): number {
  let best = lo;
  let bestMag = -1;
  for (let f = lo; f <= hi; f += step) {
    const m = dftMag(x, sr, f, start, end);
    if (m > bestMag) {
      bestMag = m;
      best = f;
    }
  }
  return best;
}

/** RMS envelope in dB over frames of `frameSec`, both channels summed in power. */
export function envelopeDb(chs: Float32Array[], sr: number, frameSec = 0.01): number[] {
  const n = Math.round(frameSec * sr);
  const out: number[] = [];
  for (let s = 0; s + n <= chs[0].length; s += n) {
    let e = 0;
    for (const c of chs) for (let i = s; i < s + n; i++) e += c[i] * c[i];
    out.push(10 * Math.log10(e / (n * chs.length) + 1e-30));
  }
  return out;
}

/** Seconds from the envelope maximum until it first stays `dropDb` below it. */
export function decaySeconds(chs: Float32Array[], sr: number, dropDb: number, frameSec = 0.01): number {
  const env = envelopeDb(chs, sr, frameSec);
  let imax = 0;
  for (let i = 1; i < env.length; i++) if (env[i] > env[imax]) imax = i;
  const thr = env[imax] - dropDb;
  let last = imax;
  for (let i = imax; i < env.length; i++) if (env[i] > thr) last = i;
  return (last - imax + 1) * frameSec;
}

export function rmsDb(x: Float32Array, start = 0, end = x.length): number {
  let e = 0;
  for (let i = start; i < end; i++) e += x[i] * x[i];
  return 10 * Math.log10(e / Math.max(1, end - start) + 1e-30);
}
