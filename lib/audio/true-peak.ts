// True peak per ITU-R BS.1770-4 Annex 2: oversample (4x below 96 kHz; 2x from 96 kHz up, which still
// reaches the >= 192 kHz rate Annex 2 aims at, common practice) with a polyphase FIR interpolator and
// take the largest absolute value. The interpolator is a Kaiser-windowed sinc of 48 taps at 4x (12 per
// phase, the size of the Annex 2 example filter); phase 0 returns the samples themselves.
// Speed: the interpolated value near sample n is bounded by (largest |x| within the filter span) times
// the largest per-phase L1 norm of the coefficients, so blocks that cannot beat the running maximum are
// skipped exactly, without approximation; inside a block, so are samples whose two nearest taps plus the
// far taps at the block's neighbourhood maximum cannot beat it. Drum one-shots decay fast, so most of the file is skipped.

export const TAPS_PER_PHASE = 12;
const KAISER_BETA = 6;
export const BLOCK = 64; // must equal levels.ts PEAK_BLOCK for its block maxima to be used

function besselI0(x: number): number {
  let sum = 1, term = 1;
  for (let k = 1; k < 50; k++) {
    term *= (x / (2 * k)) ** 2;
    sum += term;
    if (term < 1e-12 * sum) break;
  }
  return sum;
}

export function oversamplingFactor(fs: number): number {
  return fs < 96000 ? 4 : 2;
}

/** Coefficients per phase p = 1..L-1, tap j multiplies x[n - T/2 + 1 + j] to give y(n + p/L). */
export function interpolatorPhases(L: number, T = TAPS_PER_PHASE): Float64Array[] {
  const phases: Float64Array[] = [];
  const half = T / 2;
  const i0b = besselI0(KAISER_BETA);
  for (let p = 1; p < L; p++) {
    const c = new Float64Array(T);
    let sum = 0;
    for (let j = 0; j < T; j++) {
      const u = p / L + half - 1 - j; // t - m
      const sinc = Math.sin(Math.PI * u) / (Math.PI * u);
      const r = u / half;
      const w = Math.abs(r) >= 1 ? 0 : besselI0(KAISER_BETA * Math.sqrt(1 - r * r)) / i0b;
      c[j] = sinc * w;
      sum += c[j];
    }
    for (let j = 0; j < T; j++) c[j] /= sum; // unity gain at DC for every phase
    phases.push(c);
  }
  return phases;
}

interface PhaseSet {
  phases: Float64Array[];
  l1: number; // largest per-phase sum of |c|
  near: Float64Array; // per phase: |c| of the taps on x[i] and x[i+1], interleaved
  rest: number; // largest per-phase sum of |c| over the other taps
}
const phaseCache = new Map<number, PhaseSet>();
function getPhases(L: number): PhaseSet {
  let e = phaseCache.get(L);
  if (!e) {
    const phases = interpolatorPhases(L);
    const half = TAPS_PER_PHASE / 2;
    const sums = phases.map((c) => c.reduce((s, v) => s + Math.abs(v), 0));
    const near = new Float64Array(2 * phases.length);
    phases.forEach((c, p) => { near[2 * p] = Math.abs(c[half - 1]); near[2 * p + 1] = Math.abs(c[half]); });
    const rest = Math.max(...phases.map((c, p) => sums[p] - near[2 * p] - near[2 * p + 1]));
    e = { phases, l1: Math.max(...sums), near, rest };
    phaseCache.set(L, e);
  }
  return e;
}

/** Largest absolute interpolated value of one channel (linear; 1.0 = 0 dBTP). */
export function truePeakChannel(x: ArrayLike<number>, fs: number, blockMaxima?: Float64Array): number {
  const n = x.length;
  const L = oversamplingFactor(fs);
  const { phases, l1, near, rest } = getPhases(L);
  const P = phases.length;
  const T = TAPS_PER_PHASE;
  const half = T / 2;
  const nb = Math.ceil(n / BLOCK);
  let bmax = blockMaxima && blockMaxima.length === nb ? blockMaxima : null;
  if (!bmax) {
    bmax = new Float64Array(nb);
    for (let b = 0; b < nb; b++) {
      let m = 0;
      const end = Math.min(n, (b + 1) * BLOCK);
      for (let i = b * BLOCK; i < end; i++) {
        const a = Math.abs(x[i]);
        if (a > m) m = a;
      }
      bmax[b] = m;
    }
  }
  let best = 0;
  for (let b = 0; b < nb; b++) if (bmax[b] > best) best = bmax[b];
  // Neighbourhood bound per block (filter span is shorter than a block).
  const bound = new Float64Array(nb);
  for (let b = 0; b < nb; b++) bound[b] = Math.max(bmax[b], b > 0 ? bmax[b - 1] : 0, b + 1 < nb ? bmax[b + 1] : 0) * l1;
  const order = Array.from({ length: nb }, (_, b) => b).sort((a, b) => bound[b] - bound[a]);
  for (const b of order) {
    if (bound[b] <= best) break;
    const end = Math.min(n, (b + 1) * BLOCK);
    const restBound = (bound[b] / l1) * rest; // the far taps can add at most this
    for (let i = b * BLOCK; i < end; i++) {
      // Per-sample bound: the two nearest taps exactly, the others at the neighbourhood maximum.
      const a0 = Math.abs(x[i]), a1 = i + 1 < n ? Math.abs(x[i + 1]) : 0;
      let nb2 = 0;
      for (let p = 0; p < P; p++) nb2 = Math.max(nb2, near[2 * p] * a0 + near[2 * p + 1] * a1);
      if (nb2 + restBound <= best) continue;
      const base = i - half + 1;
      for (const c of phases) {
        let y = 0;
        if (base >= 0 && base + T <= n) for (let j = 0; j < T; j++) y += c[j] * x[base + j];
        else for (let j = 0; j < T; j++) { const k = base + j; if (k >= 0 && k < n) y += c[j] * x[k]; }
        const a = y < 0 ? -y : y;
        if (a > best) best = a;
      }
    }
  }
  return best;
}

export function truePeak(channels: ArrayLike<number>[], fs: number): number {
  return Math.max(0, ...truePeaks(channels, fs));
}

/** True peak of each channel (linear). */
export function truePeaks(channels: ArrayLike<number>[], fs: number, blockMaxima?: Float64Array[]): number[] {
  return channels.map((ch, i) => truePeakChannel(ch, fs, blockMaxima?.[i]));
}
