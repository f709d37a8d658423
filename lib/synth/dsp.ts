// Small signal-processing building blocks for the drum synthesizer (pure TypeScript, no I/O).
// Sources (all from memory): exponentially decaying sinusoids as the impulse response of a lightly damped mode
// (any acoustics text, e.g. Fletcher & Rossing, The Physics of Musical Instruments, ch. 1-2); biquad filters from
// R. Bristow-Johnson's "Audio EQ Cookbook"; the reverberator from M. R. Schroeder, "Natural sounding artificial
// reverberation", JAES 10(3), 1962, with low-pass damping in the comb loops after J. A. Moorer, "About this
// reverberation business", Computer Music Journal 3(2), 1979.

import type { Rng } from "./rng";

export const SPEED_OF_SOUND = 343; // m/s at 20 degC (handbook value, from memory)

/** Bessel function of the first kind J_m(x) by its power series (adequate in double precision for x < 25). */
export function besselJ(m: number, x: number): number {
  const half = x / 2;
  let term = Math.pow(half, m);
  for (let k = 1; k <= m; k++) term /= k; // (x/2)^m / m!
  let sum = term;
  for (let k = 1; k < 120; k++) {
    term *= -(half * half) / (k * (k + m));
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.max(1, Math.abs(sum))) break;
  }
  return sum;
}

export interface ModeOptions {
  /** frequency in Hz (the resting frequency the mode glides down to) */
  freq: number;
  /** initial amplitude (linear) */
  amp: number;
  /** amplitude time constant in seconds (T60 = 6.9078 tau) */
  tau: number;
  /** start phase in radians (0 = starts at zero displacement, like a struck mode) */
  phase?: number;
  /** gains into the left and right buffers */
  gainL?: number;
  gainR?: number;
  /** relative pitch rise at the strike that decays away: f(t) = freq * (1 + glide * exp(-t / glideTau)) */
  glide?: number;
  glideTau?: number;
  /** start offset in samples */
  start?: number;
}

/**
 * Adds one exponentially decaying sinusoid into L (and R) with a recursive complex oscillator
 * (one complex multiply per sample; frequency refreshed every 32 samples while gliding).
 */
export function addMode(L: Float64Array, R: Float64Array | null, sr: number, o: ModeOptions): void {
  if (!(o.freq > 0) || o.freq >= sr / 2 || !(o.amp > 0) || !(o.tau > 0)) return;
  const gl = o.gainL ?? 1;
  const gr = o.gainR ?? 1;
  const start = Math.max(0, Math.floor(o.start ?? 0));
  const life = Math.ceil(o.tau * sr * Math.log(o.amp / 1e-6 + 1)); // until about -120 dB re the source peak
  const end = Math.min(L.length, start + Math.max(1, life));
  const dec = Math.exp(-1 / (o.tau * sr));
  let re = o.amp * Math.cos(o.phase ?? 0);
  let im = o.amp * Math.sin(o.phase ?? 0);
  const glide = o.glide ?? 0;
  const gt = (o.glideTau ?? 0.05) * sr;
  const block = glide > 0 ? 32 : end - start;
  for (let b = start; b < end; b += block) {
    const n = b - start;
    const f = glide > 0 ? o.freq * (1 + glide * Math.exp(-(n + block / 2) / gt)) : o.freq;
    const w = (2 * Math.PI * Math.min(f, sr * 0.499)) / sr;
    const c = Math.cos(w) * dec;
    const s = Math.sin(w) * dec;
    const stop = Math.min(end, b + block);
    if (R) {
      for (let i = b; i < stop; i++) {
        L[i] += gl * im;
        R[i] += gr * im;
        const t = re * c - im * s;
        im = re * s + im * c;
        re = t;
      }
    } else {
      for (let i = b; i < stop; i++) {
        L[i] += gl * im;
        const t = re * c - im * s;
        im = re * s + im * c;
        re = t;
      }
    }
  }
}

/** White noise, uniform, unit variance. */
export function whiteNoise(n: number, rng: Rng): Float64Array {
  const out = new Float64Array(n);
  const k = Math.sqrt(3) * 2;
  for (let i = 0; i < n; i++) out[i] = (rng.next() - 0.5) * k;
  return out;
}

export type BiquadKind = "lowpass" | "highpass" | "bandpass";

/** RBJ cookbook biquad, applied in place (direct form I). bandpass = constant 0 dB peak gain. */
export function biquad(x: Float64Array, sr: number, kind: BiquadKind, f0: number, q = Math.SQRT1_2): Float64Array {
  const f = Math.min(Math.max(f0, 5), sr * 0.47);
  const w0 = (2 * Math.PI * f) / sr;
  const cw = Math.cos(w0);
  const alpha = Math.sin(w0) / (2 * q);
  let b0: number, b1: number, b2: number;
  if (kind === "lowpass") {
    b0 = (1 - cw) / 2;
    b1 = 1 - cw;
    b2 = (1 - cw) / 2;
  } else if (kind === "highpass") {
    b0 = (1 + cw) / 2;
    b1 = -(1 + cw);
    b2 = (1 + cw) / 2;
  } else {
    b0 = alpha;
    b1 = 0;
    b2 = -alpha;
  }
  const a0 = 1 + alpha;
  const a1 = -2 * cw;
  const a2 = 1 - alpha;
  const B0 = b0 / a0, B1 = b1 / a0, B2 = b2 / a0, A1 = a1 / a0, A2 = a2 / a0;
  let x1 = 0, x2 = 0, y1 = 0, y2 = 0;
  for (let i = 0; i < x.length; i++) {
    const xi = x[i];
    const y = B0 * xi + B1 * x1 + B2 * x2 - A1 * y1 - A2 * y2;
    x2 = x1;
    x1 = xi;
    y2 = y1;
    y1 = y;
    x[i] = y;
  }
  return x;
}

/** One-pole low-pass (6 dB/octave), in place: a gentle high-frequency roll-off. */
export function onePoleLowpass(x: Float64Array, sr: number, fc: number): Float64Array {
  const a = Math.exp((-2 * Math.PI * Math.min(fc, sr * 0.45)) / sr);
  let y = 0;
  for (let i = 0; i < x.length; i++) {
    y = (1 - a) * x[i] + a * y;
    x[i] = y;
  }
  return x;
}

/** Multiplies x in place by an attack-decay envelope starting at `start` samples. */
export function applyEnvelope(
  x: Float64Array,
  sr: number,
  o: { start?: number; attack: number; tau: number; hold?: number },
): Float64Array {
  const start = Math.max(0, Math.floor(o.start ?? 0));
  const att = Math.max(1, o.attack * sr);
  const hold = Math.max(0, (o.hold ?? 0) * sr);
  const dec = Math.exp(-1 / (o.tau * sr));
  let g = 1;
  for (let i = 0; i < x.length; i++) {
    if (i < start) {
      x[i] = 0;
      continue;
    }
    const n = i - start;
    let e: number;
    if (n < att) e = 0.5 - 0.5 * Math.cos((Math.PI * n) / att);
    else if (n < att + hold) e = 1;
    else {
      g *= dec;
      e = g;
    }
    x[i] *= e;
  }
  return x;
}

/** Adds src * gain into dst starting at offset (fractional offsets are linearly interpolated). */
export function mixInto(dst: Float64Array, src: Float64Array, gain: number, offset = 0): void {
  const whole = Math.floor(offset);
  const frac = offset - whole;
  for (let i = 0; i < src.length; i++) {
    const j = i + whole;
    if (j >= dst.length) break;
    if (j >= 0) dst[j] += gain * (1 - frac) * src[i];
    if (frac > 0 && j + 1 < dst.length && j + 1 >= 0) dst[j + 1] += gain * frac * src[i];
  }
}

/** Delays x in place by d samples (fractional, linear interpolation), dropping what falls off the end. */
export function delayInPlace(x: Float64Array, d: number): Float64Array {
  if (d <= 0) return x;
  const copy = x.slice();
  x.fill(0);
  mixInto(x, copy, 1, d);
  return x;
}

/**
 * Schroeder reverberator: four parallel comb filters (low-pass damped in the loop, after Moorer) into two series
 * all-pass filters. Comb gains come from the reverberation time: g = 10^(-3 * delay / T60).
 * `spread` offsets the delays (in samples at 44.1 kHz) so that left and right decorrelate.
 */
export function schroederReverb(x: Float64Array, sr: number, t60: number, damping: number, spread = 0): Float64Array {
  const combMs = [29.7, 37.1, 41.1, 43.7];
  const apMs = [5.0, 1.7];
  const out = new Float64Array(x.length);
  const extra = (spread * sr) / 44100;
  for (const ms of combMs) {
    const d = Math.max(1, Math.round((ms / 1000) * sr + extra));
    const g = Math.pow(10, (-3 * d) / (sr * t60));
    const buf = new Float64Array(d);
    let idx = 0;
    let lp = 0;
    for (let i = 0; i < x.length; i++) {
      const y = buf[idx];
      lp = y * (1 - damping) + lp * damping;
      buf[idx] = x[i] + g * lp;
      idx = idx + 1 === d ? 0 : idx + 1;
      out[i] += y * 0.25;
    }
  }
  for (const ms of apMs) {
    const d = Math.max(1, Math.round((ms / 1000) * sr + extra / 3));
    const g = 0.7;
    const buf = new Float64Array(d);
    let idx = 0;
    for (let i = 0; i < out.length; i++) {
      const bufout = buf[idx];
      const input = out[i];
      const v = input + g * bufout;
      buf[idx] = v;
      out[i] = bufout - g * v;
      idx = idx + 1 === d ? 0 : idx + 1;
    }
  }
  return out;
}

export function peakAbs(chs: readonly Float64Array[]): number {
  let p = 0;
  for (const c of chs) for (let i = 0; i < c.length; i++) {
    const a = Math.abs(c[i]);
    if (a > p) p = a;
  }
  return p;
}

export const dbToGain = (db: number): number => Math.pow(10, db / 20);
