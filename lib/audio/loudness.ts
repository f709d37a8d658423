// Loudness per ITU-R BS.1770-4 Annex 1 (K-weighting, channel weights, 400 ms blocks) and EBU Tech 3341:
// the maximum momentary loudness (our "strike loudness") and the gated integrated loudness
// (blocks of 400 ms with 75 % overlap, absolute gate -70 LKFS, relative gate -10 LU).
import { kWeightInto, kWeightPairInto } from "./k-weighting";

export const ABSOLUTE_GATE_LUFS = -70;
export const RELATIVE_GATE_LU = -10;

/** BS.1770-4 channel weights: 1.0 for L, R, C; 1.41 for surrounds; LFE excluded (weight 0). */
export function channelWeights(channels: number, channelMask = 0): number[] {
  if (channelMask) {
    // WAVE_FORMAT_EXTENSIBLE speaker bits in channel order.
    const w: number[] = [];
    for (let bit = 0; bit < 18 && w.length < channels; bit++) {
      if (!(channelMask & (1 << bit))) continue;
      const speaker = 1 << bit;
      if (speaker === 0x8) w.push(0); // LFE
      else if (speaker === 0x10 || speaker === 0x20 || speaker === 0x200 || speaker === 0x400) w.push(1.41); // back / side L R
      else w.push(1);
    }
    while (w.length < channels) w.push(1);
    return w;
  }
  if (channels === 6) return [1, 1, 1, 0, 1.41, 1.41]; // 5.1 in the usual L R C LFE Ls Rs order
  if (channels === 5) return [1, 1, 1, 1.41, 1.41];
  return new Array(channels).fill(1);
}

export function lufsOfPower(z: number): number {
  return -0.691 + 10 * Math.log10(z);
}

/** Prefix sums of the channel-weighted K-weighted power: P[i] = sum over samples < i of sum_c G_c y_c^2. */
export function weightedPowerPrefix(channels: ArrayLike<number>[], fs: number, weights = channelWeights(channels.length)): Float64Array {
  const n = channels[0]?.length ?? 0;
  const P = new Float64Array(n + 1); // P[i + 1] first collects the power of sample i, then is summed in place
  const acc = P.subarray(1);
  const live = channels.map((x, c) => ({ x, g: weights[c] ?? 1 })).filter((c) => c.g !== 0);
  let c = 0;
  for (; c + 1 < live.length; c += 2) kWeightPairInto(live[c].x, live[c + 1].x, fs, acc, live[c].g, live[c + 1].g);
  if (c < live.length) kWeightInto(live[c].x, fs, acc, live[c].g);
  for (let i = 1; i <= n; i++) P[i] += P[i - 1];
  return P;
}

export interface LoudnessResult {
  /** Max momentary loudness (400 ms window slid in 1 ms steps); -Infinity for silence. */
  maxMomentaryLufs: number;
  /** Gated integrated loudness; null when every block falls under the absolute gate. */
  integratedLufs: number | null;
  /** Power of each 400 ms gating block (75 % overlap), for callers that need them. */
  blockPowers: number[];
}

/**
 * Files shorter than one 400 ms block are measured as one block padded with silence (what a meter shows
 * after playing the file once).
 */
export function loudness(channels: ArrayLike<number>[], fs: number, channelMask = 0): LoudnessResult {
  const P = weightedPowerPrefix(channels, fs, channelWeights(channels.length, channelMask));
  const n = P.length - 1;
  const W = Math.round(0.4 * fs);
  const power = (a: number) => (P[Math.min(n, a + W)] - P[Math.max(0, a)]) / W;
  let maxZ = 0;
  if (n <= W) maxZ = power(0);
  else {
    const step = Math.max(1, Math.round(fs / 1000));
    for (let a = 0; a + W <= n; a += step) maxZ = Math.max(maxZ, power(a));
    maxZ = Math.max(maxZ, power(n - W));
  }
  const hop = Math.round(W / 4);
  const blockPowers: number[] = [];
  if (n <= W) blockPowers.push(power(0));
  else for (let a = 0; a + W <= n; a += hop) blockPowers.push(power(a));
  const absGated = blockPowers.filter((z) => z > 0 && lufsOfPower(z) > ABSOLUTE_GATE_LUFS);
  let integratedLufs: number | null = null;
  if (absGated.length) {
    const rel = lufsOfPower(absGated.reduce((s, z) => s + z, 0) / absGated.length) + RELATIVE_GATE_LU;
    const gated = absGated.filter((z) => lufsOfPower(z) > rel);
    integratedLufs = lufsOfPower(gated.reduce((s, z) => s + z, 0) / gated.length);
  }
  return { maxMomentaryLufs: maxZ > 0 ? lufsOfPower(maxZ) : -Infinity, integratedLufs, blockPowers };
}
