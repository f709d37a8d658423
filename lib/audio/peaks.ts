// Waveform overview for drawing: the minimum and maximum sample over all channels in each of `buckets`
// equal spans of the file (the usual min/max decimation of waveform displays).
import type { DecodedWav } from "./decode";

export function computePeaks(decoded: Pick<DecodedWav, "channels">, buckets: number): { min: number[]; max: number[] } {
  const chans = decoded.channels;
  const n = chans[0]?.length ?? 0;
  const B = Math.max(1, Math.floor(buckets));
  const min: number[] = new Array(B).fill(0);
  const max: number[] = new Array(B).fill(0);
  if (n === 0) return { min, max };
  for (let b = 0; b < B; b++) {
    const a = Math.floor((b * n) / B);
    const e = Math.max(a + 1, Math.floor(((b + 1) * n) / B));
    let lo = Infinity, hi = -Infinity;
    for (const x of chans) for (let i = a; i < e && i < n; i++) { const v = x[i]; if (v < lo) lo = v; if (v > hi) hi = v; }
    min[b] = Number.isFinite(lo) ? lo : 0;
    max[b] = Number.isFinite(hi) ? hi : 0;
  }
  return { min, max };
}
