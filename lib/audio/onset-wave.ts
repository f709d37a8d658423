// A short picture of the strike: the first channel (the left of a pair: always the same one, so takes compare
// alike even through a spaced pair whose two sides hear the hit at different times, which a mix would blur)
// from 2 ms before the onset to 10 ms after it, resampled to 24 kHz
// (linear interpolation; a 0.04 ms grid is fine enough to compare microphones), scaled so its largest value is
// 127 and stored as signed bytes in base64 (about 400 characters). Takes recorded through several microphones are
// compared with it (lib/catalogue/mic-consistency.ts): the arrival offset and the polarity of each microphone
// against the close one, from the cross-correlation of these windows.

export const ONSET_WAVE_RATE = 24_000;
export const ONSET_WAVE_PRE_MS = 2;
export const ONSET_WAVE_MS = 12;

export interface OnsetWave {
  /** Start of the window in the file, ms (the onset minus 2 ms, not before 0). */
  startMs: number;
  rate: number;
  /** Signed bytes (-127..127, the window's peak at +-127), base64. */
  data: string;
}

const B64 = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

function toBase64(bytes: Uint8Array): string {
  let out = "";
  for (let i = 0; i < bytes.length; i += 3) {
    const a = bytes[i]!, b = bytes[i + 1], c = bytes[i + 2];
    const n = (a << 16) | ((b ?? 0) << 8) | (c ?? 0);
    out += B64[(n >> 18) & 63]! + B64[(n >> 12) & 63]! + (b === undefined ? "=" : B64[(n >> 6) & 63]!) + (c === undefined ? "=" : B64[n & 63]!);
  }
  return out;
}

function fromBase64(s: string): Uint8Array {
  const clean = s.replace(/=+$/, "");
  const out = new Uint8Array(Math.floor((clean.length * 3) / 4));
  let bits = 0, acc = 0, j = 0;
  for (const ch of clean) {
    const v = B64.indexOf(ch);
    if (v < 0) throw new Error("onset wave: not base64");
    acc = (acc << 6) | v;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out[j++] = (acc >> bits) & 255;
    }
  }
  return out;
}

/** The window around `onset` (a sample index) of `channels` at `fs`. */
export function onsetWave(channels: ArrayLike<number>[], fs: number, onset: number): OnsetWave {
  const n = channels[0]?.length ?? 0;
  const startSec = Math.max(0, onset / fs - ONSET_WAVE_PRE_MS / 1000);
  const count = Math.round((ONSET_WAVE_MS / 1000) * ONSET_WAVE_RATE);
  const first = channels[0] ?? [];
  const mono = (i: number) => first[i] ?? 0;
  const values = new Float64Array(count);
  let peak = 0;
  for (let k = 0; k < count; k++) {
    const pos = (startSec + k / ONSET_WAVE_RATE) * fs;
    const i = Math.floor(pos);
    const f = pos - i;
    const v = i + 1 < n ? mono(i) * (1 - f) + mono(i + 1) * f : i < n ? mono(i) : 0;
    values[k] = v;
    peak = Math.max(peak, Math.abs(v));
  }
  const bytes = new Uint8Array(count);
  for (let k = 0; k < count; k++) bytes[k] = (peak > 0 ? Math.round((values[k]! / peak) * 127) : 0) & 255;
  return { startMs: Math.round(startSec * 1e6) / 1000, rate: ONSET_WAVE_RATE, data: toBase64(bytes) };
}

/** The window's values, -1..1. */
export function decodeOnsetWave(w: OnsetWave): Float64Array {
  const bytes = fromBase64(w.data);
  return Float64Array.from(bytes, (b) => (b > 127 ? b - 256 : b) / 127);
}
