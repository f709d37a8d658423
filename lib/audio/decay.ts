// Decay of a one-shot: early decay time (EDT) and T20 by Schroeder backward integration with the
// ISO 3382-1 evaluation ranges (EDT: 0 to -10 dB, x6; T20: -5 to -25 dB, x3), the noise floor, and whether
// the tail decayed (or was faded out) or was cut off while still sounding.
//
// Noise floor (our rule; common practice, no published source): the mean power of the lead-in before the
// onset (when there are at least 2 ms of it) and of the last 300 ms when that stretch is stationary (its two
// halves within 1 dB, i.e. decaying slower than about 7 dB/s, and at least 20 dB under the loudest 10 ms);
// the lower of the two. With neither, the quietest 10 ms after the strike is reported (an upper bound).
//
// Tail (our rule; common practice of sample editing, no published source). The sound ends at its last sample
// that is not digital silence: trailing zeros say nothing about how it got there. Its envelope over the last
// 200 ms is the power of the Hilbert envelope (all channels) in 1 ms blocks, which a low drum's tone does not make
// flicker with its phase. The level at the stop (tailEndDb, re the loudest 10 ms) is the envelope's last 10 ms, or
// its last millisecond when the sound was faded out. The tail is 'cut' only when the sound stops abruptly while
// still sounding:
// - the stop is less than 60 dB under the loudest 10 ms (deeper down it is inaudible), and
// - it is at least 10 dB above the measured noise floor (where the sound is taken to have ended; without a
//   measured floor only the 60 dB range applies) and 10 dB above 1 LSB of an integer PCM file, and
// - it is not the end of a fade: the last millisecond lies less than 12 dB under the decay the envelope was
//   following just before (a least-squares line through its 1 ms levels from 60 to 15 ms before the end, read at
//   the end; a rising stretch predicts its mean). An exponential decay falls 8.6859 dB per time constant, a
//   straight line in dB, so it never reads as a fade; a linear or raised-cosine fade of 5 ms or more ends about
//   18 dB or more under the line, a hard stop within a few dB of it (the analytic signal sags at the edge, by up
//   to half at a zero crossing of a low tone).
// Limits: a fade shorter than about a period of the lowest strong partial (5 ms on a 40 Hz kick) is not resolved
// and reads as a cut, which is what it sounds like (that partial stops within a cycle); a stop in the trough of a
// beat between two close partials can read as a fade; on a noise-like tail the envelope cannot show a fade deeper
// than about 45 dB under the level before it (the 1/t spread of the analytic signal), enough for the 12 dB test.
// Schroeder integration stops where the 10 ms level first falls to 5 dB above a known noise floor (a simplified
// truncation in the spirit of Lundeby's method); EDT needs the level to fall 20 dB and T20 35 dB before that
// point, or they are null.
import { SILENCE_DB } from "./levels";
import { hilbertEnvelope } from "./onset";

export interface DecayResult {
  edtSec: number | null;
  t20Sec: number | null;
  noiseFloorDbfs: number;
  noiseFloorKnown: boolean;
  tail: "decayed" | "cut";
  /** level of the last millisecond of sound (before any trailing digital silence), dB re the loudest 10 ms */
  tailEndDb: number;
  /** the same level above the measured noise floor (dB); null when no floor could be measured */
  tailEndAboveFloorDb: number | null;
  /** the envelope fell into its last millisecond much faster than the decay before it (a fade out) */
  tailFaded: boolean;
  /** sample index where the sound has fallen to 10 dB above the noise floor (or the end) */
  soundEnd: number;
}

const dbPow = (p: number) => (p > 0 ? Math.max(SILENCE_DB, 10 * Math.log10(p)) : SILENCE_DB);

/** Mean power over all channels of samples [a, b). */
function meanPower(channels: ArrayLike<number>[], a: number, b: number): number {
  let s = 0;
  for (const x of channels) for (let i = a; i < b; i++) s += x[i] * x[i];
  return b > a ? s / ((b - a) * channels.length) : 0;
}

/** Least-squares slope (dB per second) of points (t, y) with y in [lo, hi]; null with fewer than 3 points or if not reached. */
export function fitSlope(times: ArrayLike<number>, db: ArrayLike<number>, hi: number, lo: number): number | null {
  let n = 0, st = 0, sy = 0, stt = 0, sty = 0, reached = false;
  for (let i = 0; i < db.length; i++) {
    const y = db[i];
    if (y < lo) { reached = true; break; }
    if (y > hi) continue;
    const t = times[i];
    n++; st += t; sy += y; stt += t * t; sty += t * y;
  }
  if (!reached || n < 3) return null;
  const d = n * stt - st * st;
  return d === 0 ? null : (n * sty - st * sy) / d;
}

/** Schroeder decay curve (dB re its start) of per-block energies, block times in seconds. */
export function schroederCurve(energy: ArrayLike<number>, from: number, to: number): Float64Array {
  const out = new Float64Array(Math.max(0, to - from));
  let s = 0;
  for (let k = to - 1; k >= from; k--) { s += energy[k]; out[k - from] = s; }
  const total = out[0] || 0;
  for (let i = 0; i < out.length; i++) out[i] = total > 0 && out[i] > 0 ? 10 * Math.log10(out[i] / total) : -Infinity;
  return out;
}

export function decayTimes(curveDb: ArrayLike<number>, blockSec: number): { edtSec: number | null; t20Sec: number | null } {
  const t = Float64Array.from({ length: curveDb.length }, (_, i) => i * blockSec);
  const edt = fitSlope(t, curveDb, 0, -10);
  const t20 = fitSlope(t, curveDb, -5, -25);
  return { edtSec: edt && edt < 0 ? -60 / edt : null, t20Sec: t20 && t20 < 0 ? -60 / t20 : null };
}

/** Tail-end rule constants (our rule, see the top comment). */
export const TAIL = {
  /** the envelope is read in blocks of this length; the fade test compares the last one with the trend */
  endMs: 1,
  /** the decay before the stop: the envelope from 60 ms to 15 ms before the end (shorter files: what there is) */
  trendFromMs: 60,
  trendToMs: 15,
  /** a last millisecond this far under the decay trend is the end of a fade */
  fadeDb: 12,
  /** a stop this close to the loudest 10 ms (dB) is audible; further down it is not */
  audibleDb: 60,
  /** a stop this far above a measured noise floor (dB) is the sound itself stopping */
  aboveFloorDb: 10,
  /** length of the Hilbert segment before the end */
  segmentMs: 200,
} as const;

export interface TailEnd {
  /** samples up to the last one that is not digital silence (in any channel) */
  end: number;
  /** level of the last millisecond of sound (Hilbert envelope power, all channels; dBFS on the mean-square scale) */
  lastMsDbfs: number;
  /** level the decay before the end reaches at the end (the trend line read at the last millisecond); null without a trend */
  trendDbfs: number | null;
  /** how far the last millisecond lies under that trend (dB; 0 without a trend) */
  fallDb: number;
  /** true when the last millisecond falls TAIL.fadeDb or more under the trend: the sound was faded out */
  faded: boolean;
  /** the level at the stop: the last millisecond after a fade, otherwise the last 10 ms */
  stopDbfs: number;
}

/**
 * The end of the sound: its last millisecond before any trailing digital silence, the decay trend just before it,
 * and whether the envelope falls into the end much faster than that trend (a fade). `from` is the first sample the
 * trend may use (the end of the loudest 10 ms), so the strike itself never counts as the decay.
 */
export function tailEnd(channels: ArrayLike<number>[], fs: number, from: number): TailEnd {
  let end = channels[0].length;
  while (end > 0 && channels.every((x) => x[end - 1] === 0)) end--;
  const B = Math.max(1, Math.round((TAIL.endMs * fs) / 1000));
  if (end < B) return { end, lastMsDbfs: SILENCE_DB, trendDbfs: null, fallDb: 0, faded: false, stopDbfs: SILENCE_DB };
  const len = Math.min(end, Math.round((TAIL.segmentMs * fs) / 1000));
  const start = end - len;
  // A segment that starts inside the sound is faded in over its first 20 ms so its edge does not leak into the
  // envelope at the end (the analytic signal spreads each edge as 1/t); padding to twice its length keeps the
  // circular wrap-around of the FFT away as well.
  const ramp = start > 0 ? Math.min(Math.floor(len / 4), Math.round(0.02 * fs)) : 0;
  const power = new Float64Array(len);
  const seg = new Float64Array(len);
  for (const x of channels) {
    for (let i = 0; i < len; i++) seg[i] = x[start + i] * (i < ramp ? 0.5 - 0.5 * Math.cos((Math.PI * i) / ramp) : 1);
    const env = hilbertEnvelope(seg, 0, len, 2);
    // env^2 / 2 is the mean square of a sine of that envelope: the scale of the other levels
    for (let i = 0; i < len; i++) power[i] += (env[i] * env[i]) / 2 / channels.length;
  }
  // 1 ms blocks counted back from the end: block b covers [len - b B, len - (b - 1) B); nb of them lie after `from`
  const nb = Math.floor(Math.min(len, end - from) / B);
  const blockPower = (b: number) => {
    let s = 0;
    for (let i = len - b * B; i < len - (b - 1) * B; i++) s += power[i];
    return s / B;
  };
  const lastMsDbfs = dbPow(blockPower(1));
  // least-squares line through the block levels b in [lo, hi] (x = ms before the end, negative), read at the
  // last block; a sound is never expected to grow at its end, so a rising stretch (a beat, a swell) gives its mean
  const predict = (lo: number, hi: number): number | null => {
    hi = Math.min(hi, nb);
    const count = hi - lo + 1;
    if (count < 5) return null;
    let sx = 0, sy = 0, sxx = 0, sxy = 0;
    for (let b = lo; b <= hi; b++) { const x = -(b - 0.5), y = dbPow(blockPower(b)); sx += x; sy += y; sxx += x * x; sxy += x * y; }
    const mx = sx / count, my = sy / count;
    const vx = sxx / count - mx * mx;
    const slope = Math.min(0, vx > 0 ? (sxy / count - mx * my) / vx : 0);
    return my + slope * (-0.5 - mx);
  };
  // files too short for the full stretch use what lies between the loudest 10 ms and the last 5 ms
  const trendDbfs = nb >= TAIL.trendToMs + 10 ? predict(TAIL.trendToMs + 1, TAIL.trendFromMs) : predict(6, TAIL.trendFromMs);
  const fallDb = trendDbfs === null ? 0 : trendDbfs - lastMsDbfs;
  const faded = fallDb >= TAIL.fadeDb;
  let last10 = 0;
  const k = Math.min(10, Math.floor(len / B));
  for (let b = 1; b <= k; b++) last10 += blockPower(b) / k;
  const stopDbfs = faded ? lastMsDbfs : dbPow(last10);
  return { end, lastMsDbfs, trendDbfs, fallDb, faded, stopDbfs };
}

export interface DecayOptions {
  /** Bits of an integer PCM file: its digital silence is 1 LSB (a sound stopping near it has decayed). */
  pcmBits?: number | null;
}

export function analyseDecay(channels: ArrayLike<number>[], fs: number, onset: number, opts: DecayOptions = {}): DecayResult {
  const n = channels[0].length;
  const B = Math.max(1, Math.round(fs / 1000)); // 1 ms blocks
  const nb = Math.floor(n / B);
  const energy = new Float64Array(nb);
  for (const x of channels) for (let k = 0; k < nb; k++) { let s = 0; for (let i = k * B, e = i + B; i < e; i++) s += x[i] * x[i]; energy[k] += s; }
  // 10 ms levels (dB power per sample per channel), on 1 ms steps
  const W = 10;
  const level = new Float64Array(Math.max(0, nb - W + 1));
  let run = 0;
  for (let k = 0; k < nb; k++) {
    run += energy[k];
    if (k >= W) run -= energy[k - W];
    if (k >= W - 1) level[k - W + 1] = dbPow(run / (W * B * channels.length));
  }
  let loudest = SILENCE_DB, loudAt = 0;
  for (let k = 0; k < level.length; k++) if (level[k] > loudest) { loudest = level[k]; loudAt = k; }

  const floors: number[] = [];
  if (onset >= Math.round(0.002 * fs)) floors.push(dbPow(meanPower(channels, 0, Math.max(1, onset - Math.round(0.0005 * fs)))));
  const tailLen = Math.round(0.3 * fs);
  if (n - tailLen > onset + Math.round(0.05 * fs)) {
    const a = dbPow(meanPower(channels, n - tailLen, n - tailLen / 2));
    const b = dbPow(meanPower(channels, n - tailLen / 2, n));
    const tail = dbPow(meanPower(channels, n - tailLen, n));
    // a stationary tail within 20 dB of the loudest 10 ms is a sustained sound, not a noise floor
    if ((Math.abs(a - b) < 1 && tail <= loudest - 20) || (a === SILENCE_DB && b === SILENCE_DB)) floors.push(tail);
  }
  const noiseFloorKnown = floors.length > 0;
  let noiseFloor = noiseFloorKnown ? Math.min(...floors) : SILENCE_DB;
  if (!noiseFloorKnown) {
    let q = Infinity;
    for (let k = loudAt; k < level.length; k++) if (level[k] < q) q = level[k];
    noiseFloor = Number.isFinite(q) ? q : SILENCE_DB;
  }

  // Tail: the level at the stop, against the loudest 10 ms, the measured floor and the format's digital silence
  // (a +-1 LSB square wave), and whether the envelope fell into it as a fade
  const peakRef = level.length ? loudest : dbPow(meanPower(channels, 0, n));
  const te = tailEnd(channels, fs, level.length ? Math.min(n, (loudAt + W) * B) : 0);
  const tailEndDb = te.stopDbfs === SILENCE_DB ? SILENCE_DB : Math.max(SILENCE_DB, te.stopDbfs - peakRef);
  const tailEndAboveFloorDb = noiseFloorKnown && te.stopDbfs > SILENCE_DB ? te.stopDbfs - noiseFloor : null;
  const lsbDbfs = opts.pcmBits ? 20 * Math.log10(2 ** -(opts.pcmBits - 1)) : SILENCE_DB;
  const sounding =
    te.stopDbfs > SILENCE_DB &&
    tailEndDb > -TAIL.audibleDb &&
    (tailEndAboveFloorDb === null || tailEndAboveFloorDb >= TAIL.aboveFloorDb) &&
    te.stopDbfs - lsbDbfs >= TAIL.aboveFloorDb;
  const decayed = !sounding || te.faded;

  // End of the sound and of the Schroeder integration
  let soundEnd = n, integEnd = nb;
  if (noiseFloorKnown && noiseFloor > SILENCE_DB) {
    for (let k = loudAt; k < level.length; k++) if (level[k] <= noiseFloor + 5) { integEnd = k + W; break; }
    for (let k = loudAt; k < level.length; k++) if (level[k] <= noiseFloor + 10) { soundEnd = Math.min(n, (k + W) * B); break; }
  } else if (level.length) {
    for (let k = loudAt; k < level.length; k++) if (level[k] <= loudest - 60) { soundEnd = Math.min(n, (k + W) * B); break; }
  }
  // Schroeder from the loudest 1 ms block at or after the onset
  let pk = Math.floor(onset / B), pe = 0;
  for (let k = Math.floor(onset / B); k < Math.min(nb, Math.floor(onset / B) + Math.round(0.3 * 1000)); k++) if (energy[k] > pe) { pe = energy[k]; pk = k; }
  const end = Math.max(pk + 1, Math.min(nb, integEnd));
  const curve = schroederCurve(energy, pk, end);
  const times = decayTimes(curve, B / fs);
  // The backward integral always plunges at the last block, so a decay is only trusted when the level
  // itself falls far enough: 20 dB for EDT and 35 dB for T20 (10 dB below the bottom of each range, as
  // ISO 3382-1 asks of the range above the noise).
  const endLevel = level.length ? level[Math.max(0, Math.min(level.length - 1, end - W))] : SILENCE_DB;
  const range = loudest - endLevel;
  const edtSec = range >= 20 ? times.edtSec : null;
  const t20Sec = range >= 35 ? times.t20Sec : null;
  return { edtSec, t20Sec, noiseFloorDbfs: noiseFloor, noiseFloorKnown, tail: decayed ? "decayed" : "cut", tailEndDb, tailEndAboveFloorDb, tailFaded: te.faded, soundEnd };
}
