// Measuring one stored WAV: decode, measure, waveform peaks. Pure computation (lib/audio), run on a worker
// thread by the pool (measure-pool.ts) or inline. Refusals come back with their WavRefusal code and message.
import { computePeaks, decodeWav, isWavRefusal, measure, type Measurement } from "@/lib/audio";

export const PEAK_BUCKETS = 400;

export type MeasureResult =
  | { ok: true; measurement: Measurement; peaks: { min: number[]; max: number[] } }
  | { ok: false; code: string; reason: string; final: boolean };

const r4 = (x: number) => Math.round(x * 10_000) / 10_000;

export function measureFile(bytes: Uint8Array): MeasureResult {
  try {
    const decoded = decodeWav(bytes);
    const measurement = { ...measure(decoded), metadata: decoded.metadata } as Measurement;
    const p = computePeaks(decoded, PEAK_BUCKETS);
    return { ok: true, measurement, peaks: { min: p.min.map(r4), max: p.max.map(r4) } };
  } catch (e) {
    if (isWavRefusal(e)) return { ok: false, code: e.code, reason: e.message, final: true };
    return { ok: false, code: "error", reason: `could not measure: ${(e as Error)?.message ?? String(e)}`, final: false };
  }
}
