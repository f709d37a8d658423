// K-weighting pre-filter of ITU-R BS.1770-4 Annex 1 (high-shelf "stage 1" + RLB high-pass "stage 2"),
// derived for any sample rate by the bilinear transform (K = tan(pi f0 / fs)) from the analog prototype
// parameters below (SHELF_F0 ..., the prototype values libebur128 uses, from memory); at 48 kHz they reproduce
// BS.1770-4 Tables 1 and 2. The high-pass numerator is kept at [1, -2, 1] as in the standard's table
// (normalising it reads about 0.043 dB low).

export interface Biquad {
  b0: number;
  b1: number;
  b2: number;
  a1: number;
  a2: number;
}

export const SHELF_F0 = 1681.974450955533;
export const SHELF_GAIN_DB = 3.999843853973347;
export const SHELF_Q = 0.7071752369554196;
export const SHELF_VB_EXP = 0.4996667741545416;
export const HIGHPASS_F0 = 38.13547087602444;
export const HIGHPASS_Q = 0.5003270373238773;

export function shelfCoefficients(fs: number): Biquad {
  const K = Math.tan((Math.PI * SHELF_F0) / fs);
  const Vh = 10 ** (SHELF_GAIN_DB / 20);
  const Vb = Vh ** SHELF_VB_EXP;
  const a0 = 1 + K / SHELF_Q + K * K;
  return {
    b0: (Vh + (Vb * K) / SHELF_Q + K * K) / a0,
    b1: (2 * (K * K - Vh)) / a0,
    b2: (Vh - (Vb * K) / SHELF_Q + K * K) / a0,
    a1: (2 * (K * K - 1)) / a0,
    a2: (1 - K / SHELF_Q + K * K) / a0,
  };
}

export function highpassCoefficients(fs: number): Biquad {
  const K = Math.tan((Math.PI * HIGHPASS_F0) / fs);
  const a0 = 1 + K / HIGHPASS_Q + K * K;
  return { b0: 1, b1: -2, b2: 1, a1: (2 * (K * K - 1)) / a0, a2: (1 - K / HIGHPASS_Q + K * K) / a0 };
}

/** K-weight one channel (both stages in one pass, direct form I, float64 state). */
export function kWeight(x: ArrayLike<number>, fs: number): Float64Array {
  const y = new Float64Array(x.length);
  kWeightInto(x, fs, y, 0);
  return y;
}

/**
 * K-weight x and either store the output in `out` (gain 0) or add gain * y^2 to it (gain > 0): the second
 * form feeds the loudness meter without allocating a filtered copy of every channel.
 */
export function kWeightInto(x: ArrayLike<number>, fs: number, out: Float64Array, gain: number): void {
  const s = shelfCoefficients(fs);
  const h = highpassCoefficients(fs);
  const sb0 = s.b0, sb1 = s.b1, sb2 = s.b2, sa1 = s.a1, sa2 = s.a2, ha1 = h.a1, ha2 = h.a2;
  const n = x.length;
  let x1 = 0, x2 = 0, m1 = 0, m2 = 0, y1 = 0, y2 = 0;
  if (gain === 0) {
    for (let i = 0; i < n; i++) {
      const xi = x[i];
      const m = sb0 * xi + sb1 * x1 + sb2 * x2 - sa1 * m1 - sa2 * m2;
      const yi = m - 2 * m1 + m2 - ha1 * y1 - ha2 * y2;
      x2 = x1; x1 = xi; m2 = m1; m1 = m; y2 = y1; y1 = yi;
      out[i] = yi;
    }
  } else {
    for (let i = 0; i < n; i++) {
      const xi = x[i];
      const m = sb0 * xi + sb1 * x1 + sb2 * x2 - sa1 * m1 - sa2 * m2;
      const yi = m - 2 * m1 + m2 - ha1 * y1 - ha2 * y2;
      x2 = x1; x1 = xi; m2 = m1; m1 = m; y2 = y1; y1 = yi;
      out[i] += gain * yi * yi;
    }
  }
}

/**
 * Add ga * ya^2 + gb * yb^2 to `out` for two channels filtered in one loop: the recursions of the two
 * channels are independent, so the processor overlaps them (the one-channel loop is latency-bound).
 */
export function kWeightPairInto(xa: ArrayLike<number>, xb: ArrayLike<number>, fs: number, out: Float64Array, ga: number, gb: number): void {
  const s = shelfCoefficients(fs);
  const h = highpassCoefficients(fs);
  const sb0 = s.b0, sb1 = s.b1, sb2 = s.b2, sa1 = s.a1, sa2 = s.a2, ha1 = h.a1, ha2 = h.a2;
  const n = Math.min(xa.length, xb.length);
  let ax1 = 0, ax2 = 0, am1 = 0, am2 = 0, ay1 = 0, ay2 = 0;
  let bx1 = 0, bx2 = 0, bm1 = 0, bm2 = 0, by1 = 0, by2 = 0;
  for (let i = 0; i < n; i++) {
    const a = xa[i], b = xb[i];
    const am = sb0 * a + sb1 * ax1 + sb2 * ax2 - sa1 * am1 - sa2 * am2;
    const bm = sb0 * b + sb1 * bx1 + sb2 * bx2 - sa1 * bm1 - sa2 * bm2;
    const ay = am - 2 * am1 + am2 - ha1 * ay1 - ha2 * ay2;
    const by = bm - 2 * bm1 + bm2 - ha1 * by1 - ha2 * by2;
    ax2 = ax1; ax1 = a; am2 = am1; am1 = am; ay2 = ay1; ay1 = ay;
    bx2 = bx1; bx1 = b; bm2 = bm1; bm1 = bm; by2 = by1; by1 = by;
    out[i] += ga * ay * ay + gb * by * by;
  }
}

/** Magnitude response in dB of the cascade at frequency f (for checks such as +0.691 dB at 997 Hz). */
export function kWeightingGainDb(f: number, fs: number): number {
  const w = (2 * Math.PI * f) / fs;
  const mag = (c: Biquad) => {
    const re = (b0: number, b1: number, b2: number) => [b0 + b1 * Math.cos(w) + b2 * Math.cos(2 * w), -(b1 * Math.sin(w) + b2 * Math.sin(2 * w))];
    const [nr, ni] = re(c.b0, c.b1, c.b2);
    const [dr, di] = re(1, c.a1, c.a2);
    return Math.hypot(nr, ni) / Math.hypot(dr, di);
  };
  return 20 * Math.log10(mag(shelfCoefficients(fs)) * mag(highpassCoefficients(fs)));
}
