import { describe, expect, it } from "vitest";
import { interpolatorPhases, oversamplingFactor, TAPS_PER_PHASE, truePeak, truePeakChannel } from "./true-peak";
import { hit, sine } from "./signals";

const db = (x: number) => 20 * Math.log10(x);
// EBU Tech 3341 (v3) true-peak cases; tolerance +0.2 / -0.4 dB. Tones are tapered with a 0.1 s raised
// cosine (common practice: hard edges make any interpolator ring and over-read, by up to 0.7 dB).
const within = (got: number, expected: number) => {
  expect(got).toBeLessThanOrEqual(expected + 0.2);
  expect(got).toBeGreaterThanOrEqual(expected - 0.4);
};

describe("true peak, ITU-R BS.1770-4 Annex 2, against EBU Tech 3341 cases 15-19 (48 kHz)", () => {
  const fs = 48000;
  const deg = Math.PI / 180;
  const tp = (f: number, amp: number, phaseDeg: number) => db(truePeak([sine(fs, 1, f, amp, phaseDeg * deg, 0.1)], fs));
  it("case 15: fs/4, 0.5 FS, phase 0 -> -6.0 dBTP", () => within(tp(fs / 4, 0.5, 0), -6.0));
  it("case 16: fs/4, 0.5 FS, 45 deg -> -6.0 dBTP", () => within(tp(fs / 4, 0.5, 45), -6.0));
  it("case 17: fs/6, 0.5 FS, 60 deg -> -6.0 dBTP", () => within(tp(fs / 6, 0.5, 60), -6.0));
  it("case 18: fs/8, 0.5 FS, 67.5 deg -> -6.0 dBTP", () => within(tp(fs / 8, 0.5, 67.5), -6.0));
  it("case 19: fs/4, 1.41 FS, 45 deg -> +3.0 dBTP", () => within(tp(fs / 4, 1.41, 45), 3.0));
});

describe("inter-sample peaks (handbook: x[n] = sin(pi n / 2 + pi / 4))", () => {
  it("every sample is +-0.7071 (-3.01 dBFS) but the true peak is 0 dBTP", () => {
    const fs = 48000;
    const x = sine(fs, 1, fs / 4, 1, Math.PI / 4, 0.1);
    let sp = 0;
    for (let i = Math.round(0.2 * fs); i < Math.round(0.8 * fs); i++) sp = Math.max(sp, Math.abs(x[i]));
    expect(db(sp)).toBeCloseTo(-3.01, 2);
    within(db(truePeak([x], fs)), 0);
  });
  it("oversamples 4x below 96 kHz and 2x from 96 kHz (Annex 2 practice) and still finds the peak at 96 kHz", () => {
    expect(oversamplingFactor(44100)).toBe(4);
    expect(oversamplingFactor(48000)).toBe(4);
    expect(oversamplingFactor(96000)).toBe(2);
    expect(oversamplingFactor(192000)).toBe(2);
    const fs = 96000;
    within(db(truePeak([sine(fs, 1, fs / 4, 1, Math.PI / 4, 0.1)], fs)), 0);
  });
  it("takes the largest channel", () => {
    const fs = 48000;
    expect(db(truePeak([sine(fs, 0.5, 1000, 0.25, 0, 0.1), sine(fs, 0.5, 1000, 0.5, 0, 0.1)], fs))).toBeCloseTo(-6.02, 1);
  });
});

describe("the skipping of blocks that cannot hold the true peak is exact", () => {
  it("equals a brute-force evaluation of every phase at every sample on decaying noisy hits", () => {
    const fs = 44100;
    const phases = interpolatorPhases(4);
    for (const seed of [1, 2, 3]) {
      const x = hit(fs, 0.3, { f: 90 * seed, tau: 0.05, noiseMix: 0.7, seed });
      let brute = 0;
      for (let i = 0; i < x.length; i++) {
        brute = Math.max(brute, Math.abs(x[i]));
        for (const c of phases) {
          let y = 0;
          for (let j = 0; j < TAPS_PER_PHASE; j++) { const k = i - TAPS_PER_PHASE / 2 + 1 + j; if (k >= 0 && k < x.length) y += c[j] * x[k]; }
          brute = Math.max(brute, Math.abs(y));
        }
      }
      expect(truePeakChannel(x, fs)).toBe(brute);
    }
  });
});
