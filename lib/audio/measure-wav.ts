// The one measuring entry point of the pipeline: the bytes of one WAV file in, everything Kitwright keeps
// about it out: the Measurement (measure.ts) with the file's metadata chunks, and the waveform overview
// (peaks.ts, PEAK_BUCKETS min/max pairs rounded to 4 decimals as they are stored). Or, when the file cannot
// be measured, why: a WavRefusal's code and message (`final`: the same bytes will always be refused), or any
// other failure as code "error" (not final: the caller may try again). Never throws.
//
// `kitwright measure | catalogue | audit` and the worker's measure jobs both call this, on the worker threads
// of lib/audio-pool, so one file gives one answer everywhere.
import type { MeasuredFile } from "./measure";
import { measure } from "./measure";
import { decodeWav, type DecodeOptions } from "./decode";
import { computePeaks } from "./peaks";
import { isWavRefusal, type WavRefusalCode } from "./refusal";
import { crossCheckWithWavefile } from "./wavefile-check";

/** Buckets of the stored waveform overview. */
export const PEAK_BUCKETS = 400;

export interface Peaks { min: number[]; max: number[] }

export interface MeasureWavOptions extends DecodeOptions {
  /** Also compare the fmt fields and every sample with wavefile's reader; differences become warnings. */
  crossCheck?: boolean;
}

export type MeasureOutcome =
  | { ok: true; measurement: MeasuredFile; peaks: Peaks }
  | { ok: false; code: WavRefusalCode | "error"; reason: string; final: boolean };

const r4 = (x: number) => Math.round(x * 10_000) / 10_000;

export function measureWav(bytes: Uint8Array, opts: MeasureWavOptions = {}): MeasureOutcome {
  try {
    const { crossCheck, ...decodeOpts } = opts;
    const decoded = decodeWav(bytes, decodeOpts);
    const measurement: MeasuredFile = { ...measure(decoded), metadata: decoded.metadata };
    if (crossCheck) measurement.warnings.push(...crossCheckWithWavefile(bytes, decoded));
    const p = computePeaks(decoded, PEAK_BUCKETS);
    return { ok: true, measurement, peaks: { min: p.min.map(r4), max: p.max.map(r4) } };
  } catch (e) {
    if (isWavRefusal(e)) return { ok: false, code: e.code, reason: e.message, final: true };
    return { ok: false, code: "error", reason: `could not measure: ${(e as Error)?.message ?? String(e)}`, final: false };
  }
}
