import { describe, expect, it } from "vitest";
import { correlationAndMono, levels, stereoCorrelation, toDb } from "./levels";
import { sine } from "./signals";

const fs = 48000;

describe("levels against handbook facts", () => {
  it("RMS of a sine of amplitude A is A/sqrt(2); crest factor 3.0103 dB (handbook)", () => {
    const A = 0.5;
    const l = levels([sine(fs, 1, 1000, A)]);
    expect(l.rms).toBeCloseTo(A / Math.SQRT2, 5);
    expect(toDb(l.samplePeak) - toDb(l.rms)).toBeCloseTo(3.0103, 3);
  });
  it("square wave crest 0 dB, triangle 4.77 dB (handbook)", () => {
    const sq = Float32Array.from({ length: fs }, (_, i) => (Math.floor(i / 24) % 2 ? -0.5 : 0.5));
    const tri = Float32Array.from({ length: 4800 * 10 }, (_, i) => { const p = (i % 4800) / 4800; return p < 0.5 ? 4 * p - 1 : 3 - 4 * p; });
    const crest = (x: Float32Array) => { const l = levels([x]); return toDb(l.samplePeak) - toDb(l.rms); };
    expect(crest(sq)).toBeCloseTo(0, 6);
    expect(crest(tri)).toBeCloseTo(4.77, 2);
  });
  it("DC offset is the mean of the worst channel", () => {
    const a = Float32Array.from(sine(fs, 1, 100, 0.5), (v) => v + 0.01);
    const b = Float32Array.from(sine(fs, 1, 100, 0.5), (v) => v - 0.03);
    expect(levels([a, b]).dcOffset).toBeCloseTo(-0.03, 4);
  });
  it("counts runs of 3 or more consecutive full-scale samples, not single touches (common practice, no published source)", () => {
    const top = 32767 / 32768;
    const x = new Float32Array(100);
    x[10] = top; // single touch: no run
    x.fill(top, 20, 25); // run of 5
    x.fill(-1, 50, 53); // run of 3 at negative full scale
    x.fill(top, 70, 72); // only 2
    const l = levels([x], top);
    expect(l.clippedRuns).toBe(2);
    expect(l.clippedSamples).toBe(8);
  });
  it("stereo correlation: identical +1, inverted -1, quadrature 0, mono null (definition)", () => {
    const s = sine(fs, 1, 1000, 0.5);
    expect(stereoCorrelation([s, s])).toBeCloseTo(1, 9);
    expect(stereoCorrelation([s, s.map((v) => -v)])).toBeCloseTo(-1, 9);
    expect(stereoCorrelation([s, sine(fs, 1, 1000, 0.5, Math.PI / 2)])).toBeCloseTo(0, 3);
    expect(stereoCorrelation([s])).toBeNull();
    const q = sine(fs, 1, 1000, 0.5, Math.PI / 3);
    const fused = correlationAndMono([s, q]);
    expect(fused.correlation).toBeCloseTo(stereoCorrelation([s, q])!, 9);
    expect(fused.correlation).toBeCloseTo(Math.cos(Math.PI / 3), 3); // two sines 60 deg apart: cos 60 = 0.5
    expect(fused.mono[100]).toBeCloseTo((s[100] + q[100]) / 2, 7);
  });
});
