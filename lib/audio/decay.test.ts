import { describe, expect, it } from "vitest";
import { analyseDecay } from "./decay";
import { onsetIndex } from "./onset";
import { hit, lcg } from "./signals";

const fs = 48000;

describe("decay by Schroeder backward integration (ISO 3382-1 ranges)", () => {
  // Handbook: amplitude e^(-t/tau) falls 8.6859 dB per tau, so T60 = 6.9078 tau.
  for (const tau of [0.05, 0.2, 0.6]) {
    it(`exponential decay tau = ${tau} s: EDT and T20 give T60 = 6.9078 tau within 2 %`, () => {
      const x = hit(fs, Math.min(12 * tau + 0.05, 8), { tau, f: 2000, noiseMix: 0.3, leadSec: 0.01 });
      const d = analyseDecay([x], fs, onsetIndex([x], fs));
      const t60 = 6.9078 * tau;
      expect(Math.abs(d.edtSec! / t60 - 1)).toBeLessThanOrEqual(0.02);
      expect(Math.abs(d.t20Sec! / t60 - 1)).toBeLessThanOrEqual(0.02);
    });
  }
  it("with a -80 dBFS noise floor T20 stays within 2 % (integration truncated above the floor)", () => {
    const tau = 0.15;
    const x = hit(fs, 2, { tau, f: 700, leadSec: 0.02, noiseDb: -80 });
    const d = analyseDecay([x], fs, onsetIndex([x], fs));
    expect(Math.abs(d.t20Sec! / (6.9078 * tau) - 1)).toBeLessThanOrEqual(0.02);
  });
  it("a file too short to fall 25 dB has no T20", () => {
    const x = hit(fs, 0.3, { tau: 1, f: 500 });
    expect(analyseDecay([x], fs, 0).t20Sec).toBeNull();
  });
});

describe("tail state and noise floor (our rule, see decay.ts; no published source)", () => {
  it("a hit decaying into a -75 dBFS noise floor is 'decayed' and the floor is measured near -75 dB", () => {
    const x = hit(fs, 1.5, { tau: 0.08, leadSec: 0.01, noiseDb: -75 });
    const d = analyseDecay([x], fs, onsetIndex([x], fs));
    expect(d.tail).toBe("decayed");
    expect(Math.abs(d.noiseFloorDbfs + 75)).toBeLessThan(1.5);
  });
  it("a hit decaying into digital silence is 'decayed'", () => {
    const x = hit(fs, 1.5, { tau: 0.05 });
    x.fill(0, Math.round(1.2 * fs));
    expect(analyseDecay([x], fs, 0).tail).toBe("decayed");
  });
  it("the same hit cut at 250 ms while still sounding is 'cut' (with a noisy lead-in)", () => {
    const x = hit(fs, 0.25, { tau: 0.3, leadSec: 0.01, noiseDb: -75 });
    expect(analyseDecay([x], fs, onsetIndex([x], fs)).tail).toBe("cut");
  });
  it("a hit cut while still sounding is 'cut' without any lead-in to learn the floor from", () => {
    const x = hit(fs, 0.6, { tau: 0.5, noiseDb: -80 });
    expect(analyseDecay([x], fs, 0).tail).toBe("cut");
  });
  it("a sustained tone cut off (no decay at all, no lead-in) is 'cut', not mistaken for a noise floor", () => {
    const x = Float32Array.from({ length: Math.round(0.8 * fs) }, (_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / fs));
    expect(analyseDecay([x], fs, 0).tail).toBe("cut");
  });
  it("a long cymbal-like tail (T60 about 4 s) cut at 1.2 s is 'cut'", () => {
    const rnd = lcg(7);
    const x = Float32Array.from({ length: Math.round(1.2 * fs) }, (_, i) => 0.5 * Math.exp(-i / fs / 0.6) * rnd());
    expect(analyseDecay([x], fs, 0).tail).toBe("cut");
  });
});
