import { describe, expect, it } from "vitest";
import { attackMs, onsetIndex } from "./onset";
import { hit } from "./signals";

const fs = 48000;

describe("onset (leading silence): threshold -50 dB re peak, guarded against lead-in noise (our rule)", () => {
  for (const leadMs of [0, 3, 25, 120]) {
    it(`a burst after ${leadMs} ms of digital silence is found within 1 ms`, () => {
      const x = hit(fs, 0.5, { leadSec: leadMs / 1000, f: 180 });
      const ms = (onsetIndex([x], fs) / fs) * 1000;
      expect(Math.abs(ms - leadMs)).toBeLessThanOrEqual(1);
    });
  }
  it("a burst after 40 ms of noise at -70 dBFS is found within 1 ms", () => {
    const x = hit(fs, 0.5, { leadSec: 0.04, noiseDb: -70, f: 300 });
    expect(Math.abs((onsetIndex([x], fs) / fs) * 1000 - 40)).toBeLessThanOrEqual(1);
  });
  it("a DC offset of -30 dB re peak does not pass for the strike (offset removed, or caught by the lead-in guard)", () => {
    const x = Float32Array.from(hit(fs, 0.5, { leadSec: 0.03, amp: 0.5 }), (v) => v + 0.016);
    expect(Math.abs((onsetIndex([x], fs, undefined, [0.016]) / fs) * 1000 - 30)).toBeLessThanOrEqual(1);
    expect(Math.abs((onsetIndex([x], fs) / fs) * 1000 - 30)).toBeLessThanOrEqual(1);
  });
  it("uses the earliest channel", () => {
    const a = hit(fs, 0.5, { leadSec: 0.02 });
    const b = hit(fs, 0.5, { leadSec: 0.01 });
    expect(Math.abs((onsetIndex([a, b], fs) / fs) * 1000 - 10)).toBeLessThanOrEqual(1);
  });
});

describe("attack time, 10 % to 90 % of the envelope peak (common rise-time definition)", () => {
  it("a linear 20 ms ramp on a 1 kHz tone rises from 10 % to 90 % in 16 ms (+-0.5 ms)", () => {
    const n = Math.round(0.4 * fs);
    const ramp = Math.round(0.02 * fs);
    const x = Float32Array.from({ length: n }, (_, i) => {
      const g = i < ramp ? i / ramp : Math.exp(-(i - ramp) / fs / 0.1);
      return 0.8 * g * Math.sin((2 * Math.PI * 1000 * i) / fs);
    });
    expect(Math.abs(attackMs([x], fs, 0) - 16)).toBeLessThanOrEqual(0.5);
  });
  it("an instant strike has an attack under 1 ms", () => {
    const x = hit(fs, 0.4, { f: 1000, noiseMix: 0, leadSec: 0.01 });
    expect(attackMs([x], fs, onsetIndex([x], fs))).toBeLessThan(1);
  });
});
