import { describe, expect, it } from "vitest";
import { highpassCoefficients, kWeight, kWeightingGainDb, shelfCoefficients } from "./k-weighting";

describe("K-weighting coefficients", () => {
  it("48 kHz shelf matches ITU-R BS.1770-4 Table 1 exactly", () => {
    const s = shelfCoefficients(48000);
    expect(s.b0).toBeCloseTo(1.53512485958697, 13);
    expect(s.b1).toBeCloseTo(-2.69169618940638, 13);
    expect(s.b2).toBeCloseTo(1.19839281085285, 13);
    expect(s.a1).toBeCloseTo(-1.69065929318241, 13);
    expect(s.a2).toBeCloseTo(0.73248077421585, 13);
  });
  it("48 kHz RLB high-pass matches ITU-R BS.1770-4 Table 2 exactly (numerator kept at 1, -2, 1)", () => {
    const h = highpassCoefficients(48000);
    expect([h.b0, h.b1, h.b2]).toEqual([1, -2, 1]);
    expect(h.a1).toBeCloseTo(-1.99004745483398, 13);
    expect(h.a2).toBeCloseTo(0.99007225036621, 13);
  });
  it("44.1 kHz shelf as computed from the analog prototype (BS.1770-4 prototype via the bilinear transform, computed)", () => {
    const s = shelfCoefficients(44100);
    expect(s.b0).toBeCloseTo(1.53084123005035, 12);
    expect(s.b1).toBeCloseTo(-2.65097999515473, 12);
    expect(s.b2).toBeCloseTo(1.16907907992159, 12);
    expect(s.a1).toBeCloseTo(-1.66365511325602, 12);
    expect(s.a2).toBeCloseTo(0.71259542807323, 12);
  });
  it("gain at 997 Hz is +0.691 dB (BS.1770-4: a 0 dBFS 997 Hz sine reads -3.01 LKFS; computed)", () => {
    expect(kWeightingGainDb(997, 48000)).toBeCloseTo(0.691, 2);
    expect(kWeightingGainDb(997, 44100)).toBeCloseTo(0.691, 2);
  });
  it("the filter run on a 997 Hz sine gives the same gain as the response formula", () => {
    const fs = 48000;
    const x = Float64Array.from({ length: fs }, (_, i) => Math.sin((2 * Math.PI * 997 * i) / fs));
    const y = kWeight(x, fs);
    let px = 0, py = 0;
    for (let i = fs / 2; i < fs; i++) { px += x[i] ** 2; py += y[i] ** 2; }
    expect(10 * Math.log10(py / px)).toBeCloseTo(kWeightingGainDb(997, fs), 2);
  });
});
