// Decay of a one-shot: early decay time (EDT) and T20 by Schroeder backward integration with the
// ISO 3382-1 evaluation ranges (EDT: 0 to -10 dB, x6; T20: -5 to -25 dB, x3), the noise floor, and whether
// the tail decayed into the noise floor or was cut off while still sounding.
//
// Noise floor (our rule; common practice, no published source): the mean power of the lead-in before the
// onset (when there are at least 2 ms of it) and of the last 300 ms when that stretch is stationary (its two
// halves within 1 dB, i.e. decaying slower than about 7 dB/s, and at least 20 dB under the loudest 10 ms);
// the lower of the two. With neither, the
// quietest 10 ms after the strike is reported (an upper bound) and the tail test falls back to a 60 dB range.
// Tail: 'decayed' when the last 10 ms are digital silence, within 6 dB of the noise floor, or 60 dB or more
// below the loudest 10 ms; otherwise 'cut'. Schroeder integration stops where the 10 ms level first falls
// to 5 dB above a known noise floor (a simplified truncation in the spirit of Lundeby's method); EDT needs the
// level to fall 20 dB and T20 35 dB before that point, or they are null.
import { SILENCE_DB } from "./levels";

export interface DecayResult {
  edtSec: number | null;
  t20Sec: number | null;
  noiseFloorDbfs: number;
  noiseFloorKnown: boolean;
  tail: "decayed" | "cut";
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

export function analyseDecay(channels: ArrayLike<number>[], fs: number, onset: number): DecayResult {
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

  const last10 = dbPow(meanPower(channels, Math.max(0, n - Math.round(0.01 * fs)), n));
  const decayed = last10 === SILENCE_DB || (noiseFloorKnown && last10 <= noiseFloor + 6) || last10 <= loudest - 60;

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
  return { edtSec, t20Sec, noiseFloorDbfs: noiseFloor, noiseFloorKnown, tail: decayed ? "decayed" : "cut", soundEnd };
}
