// Test and demo signal generators (sines with raised-cosine tapers, exponential decays, seeded noise).
// Used by the tests, which generate every signal they check, and by the benchmark.

/** Deterministic uniform noise in [-1, 1) (32-bit LCG, Numerical Recipes constants). */
export function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
}

/** amp * sin(2 pi f t + phase), with an optional raised-cosine fade in and out of `taperSec`. */
export function sine(fs: number, seconds: number, f: number, amp = 1, phaseRad = 0, taperSec = 0): Float32Array {
  const n = Math.round(seconds * fs);
  const x = new Float32Array(n);
  const fade = Math.round(taperSec * fs);
  for (let i = 0; i < n; i++) {
    let g = 1;
    if (fade > 0 && i < fade) g = 0.5 - 0.5 * Math.cos((Math.PI * i) / fade);
    if (fade > 0 && i >= n - fade) g = Math.min(g, 0.5 - 0.5 * Math.cos((Math.PI * (n - 1 - i)) / fade));
    x[i] = amp * g * Math.sin((2 * Math.PI * f * i) / fs + phaseRad);
  }
  return x;
}

export function dbToAmp(db: number): number {
  return 10 ** (db / 20);
}

export function concat(...parts: Float32Array[]): Float32Array {
  const out = new Float32Array(parts.reduce((s, p) => s + p.length, 0));
  let at = 0;
  for (const p of parts) { out.set(p, at); at += p.length; }
  return out;
}

export function silence(fs: number, seconds: number): Float32Array {
  return new Float32Array(Math.round(seconds * fs));
}

/**
 * A synthetic drum-like hit: `leadSec` of silence (or noise at `noiseDb`), then a sine of `f` Hz and a noise
 * burst, both decaying exponentially with time constant `tau` seconds.
 */
export function hit(fs: number, seconds: number, opts: { f?: number; tau?: number; leadSec?: number; noiseDb?: number; amp?: number; seed?: number; noiseMix?: number } = {}): Float32Array {
  const { f = 200, tau = 0.1, leadSec = 0, noiseDb = -Infinity, amp = 0.8, seed = 1, noiseMix = 0.2 } = opts;
  const rnd = lcg(seed);
  const n = Math.round(seconds * fs);
  const on = Math.round(leadSec * fs);
  const floor = Number.isFinite(noiseDb) ? dbToAmp(noiseDb) * Math.sqrt(3) : 0; // uniform noise: rms = a / sqrt(3)
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    let v = floor * rnd();
    if (i >= on) {
      const t = (i - on) / fs;
      v += amp * Math.exp(-t / tau) * ((1 - noiseMix) * Math.sin(2 * Math.PI * f * t) + noiseMix * rnd());
    }
    x[i] = v;
  }
  return x;
}
