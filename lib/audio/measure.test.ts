import { describe, expect, it } from "vitest";
import { computePeaks, decodeWav, encodeWav, measure, measureBytes, MEASURE_VERSION, SILENCE_DB } from "./index";
import { hit, sine } from "./signals";

const fs = 48000;

describe("measure(): the whole record on generated one-shots", () => {
  const L = hit(fs, 1.5, { f: 110, tau: 0.12, leadSec: 0.012, noiseDb: -78, seed: 2 });
  const R = Float32Array.from(L, (v) => 0.8 * v);
  const bytes = encodeWav([L, R], { sampleRate: fs, bits: 24 });
  const m = measureBytes(bytes);

  it("fills every field with finite, JSON-safe values", () => {
    expect(JSON.parse(JSON.stringify(m))).toEqual(m);
    expect(m.measureVersion).toBe(MEASURE_VERSION);
    expect(m.format).toMatchObject({ channels: 2, sampleRate: fs, bitsPerSample: 24, frames: 72000, durationSec: 1.5 });
    expect(m.strike.mfcc).toHaveLength(13);
    expect(m.strike.barkLoudness).toHaveLength(24);
    expect(m.body).not.toBeNull();
  });
  it("agrees with the parts: onset 12 ms (+-1), pitch 110 Hz (1 %), decayed tail, T60 = 6.9078 tau (5 %), floor near -78 dBFS", () => {
    expect(Math.abs(m.onsetMs - 12)).toBeLessThanOrEqual(1);
    expect(Math.abs(m.pitchHz! / 110 - 1)).toBeLessThan(0.01);
    expect(m.tail).toBe("decayed");
    expect(Math.abs(m.t20Sec! / (6.9078 * 0.12) - 1)).toBeLessThan(0.05);
    expect(Math.abs(m.noiseFloorDbfs + 78)).toBeLessThan(2);
    expect(m.noiseFloorMeasured).toBe(true);
  });
  it("reports where the tail stops: far down (and at the floor) for this decayed hit; a hit stopped 20 dB down is cut and says so", () => {
    expect(m.tailEndDb!).toBeLessThan(-60);
    expect(Math.abs(m.tailEndAboveFloorDb!)).toBeLessThan(3);
    // e^(-t/tau) falls 8.6859 dB per tau (handbook): tau 0.3 s stopped 20 / 8.6859 tau after the strike
    const cut = measureBytes(encodeWav([hit(fs, 0.01 + (20 / 8.6859) * 0.3, { f: 180, tau: 0.3, leadSec: 0.01, noiseDb: -90 })], { sampleRate: fs, bits: 24 }));
    expect(cut.tail).toBe("cut");
    expect(Math.abs(cut.tailEndDb! + 20)).toBeLessThanOrEqual(1);
    expect(cut.tailEndAboveFloorDb!).toBeGreaterThan(60);
    expect(cut.warnings).toContain("tail cut off while still sounding (it stops 20 dB under its peak level)");
  });
  it("levels are consistent: true peak >= sample peak, crest = peak - RMS, correlation 1 for scaled copies", () => {
    expect(m.truePeakDbtp).toBeGreaterThanOrEqual(m.samplePeakDbfs - 1e-9);
    expect(m.crestDb).toBeCloseTo(m.samplePeakDbfs - m.rmsDbfs, 9);
    expect(m.stereoCorrelation!).toBeCloseTo(1, 6);
    expect(m.strikeLufs).toBeGreaterThan(m.integratedLufs! - 1e-9);
  });
  it("per-channel levels: the right channel, a 0.8x copy, reads 20 log10(0.8) = -1.94 dB below the left", () => {
    const [l, r] = m.perChannel!;
    expect(r.samplePeakDbfs - l.samplePeakDbfs).toBeCloseTo(20 * Math.log10(0.8), 1);
    expect(r.rmsDbfs - l.rmsDbfs).toBeCloseTo(20 * Math.log10(0.8), 1);
    expect(Math.max(l.truePeakDbtp, r.truePeakDbtp)).toBe(m.truePeakDbtp);
  });
  it("the strike (noise burst plus tone) is brighter than the body (tone)", () => {
    expect(m.strike.centroidHz).toBeGreaterThan(m.body!.centroidHz);
  });
  it("a 0.5 amplitude 1 kHz sine file reads -6.02 dBFS peak, -9.03 dBFS RMS, 3.01 dB crest (handbook)", () => {
    const s = measureBytes(encodeWav([sine(fs, 1, 1000, 0.5, 0, 0.05)], { sampleRate: fs, bits: 32, float: true }));
    expect(s.samplePeakDbfs).toBeCloseTo(-6.02, 2);
    expect(s.rmsDbfs).toBeCloseTo(-9.03 - 0.2, 0); // the 50 ms tapers lower the RMS slightly
    expect(s.stereoCorrelation).toBeNull();
  });
  it("silence is measured, not refused, with the silence level and a warning", () => {
    const s = measureBytes(encodeWav([new Float32Array(4800)], { sampleRate: fs, bits: 16 }));
    expect(s.samplePeakDbfs).toBe(SILENCE_DB);
    expect(s.warnings.join()).toMatch(/silent/);
  });
  it("clipping is counted and warned about", () => {
    const x = sine(fs, 0.2, 100, 1.5);
    const s = measureBytes(encodeWav([x], { sampleRate: fs, bits: 16 }));
    expect(s.clippedRuns).toBeGreaterThan(30);
    expect(s.warnings.join()).toMatch(/clipped/);
  });
  it("measure() on decoded 44.1 kHz 16-bit mono works the same way", () => {
    const d = decodeWav(encodeWav([hit(44100, 0.8, { f: 200, tau: 0.05, leadSec: 0.005 })], { sampleRate: 44100, bits: 16 }));
    const mm = measure(d);
    expect(Math.abs(mm.onsetMs - 5)).toBeLessThanOrEqual(1);
    expect(Math.abs(mm.pitchHz! / 200 - 1)).toBeLessThan(0.01);
  });
});

describe("computePeaks (min/max per bucket over all channels)", () => {
  it("returns the extremes of each span", () => {
    const a = Float32Array.from([0, 0.5, -0.25, 0, 0.1, 0.2, 0, 0]);
    const b = Float32Array.from([0, 0, 0, -0.75, 0, 0, 0.9, 0]);
    expect(computePeaks({ channels: [a, b] }, 4)).toEqual({ min: [0, -0.75, 0, 0], max: [0.5, 0, Math.fround(0.2), Math.fround(0.9)] });
  });
});
