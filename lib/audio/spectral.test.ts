import { describe, expect, it } from "vitest";
import Meyda from "meyda";
import { linearRegression } from "simple-statistics";
import { SpectralAnalyzer, frameSizeFor, lowPeakHz, spectralSlope, summarize } from "./spectral";
import { hit, lcg, sine } from "./signals";

const fs = 48000;
const N = 2048;
const noise = (n: number, seed = 3) => { const r = lcg(seed); return Float32Array.from({ length: n }, () => r()); };

type MeydaApi = {
  bufferSize: number;
  sampleRate: number;
  windowingFunction: string;
  numberOfMFCCCoefficients: number;
  melFilterBank?: unknown;
  barkScale?: unknown;
  extract: (f: string | string[], s: Float32Array) => Record<string, unknown> | null;
};
const meyda = Meyda as unknown as MeydaApi;
function meydaFrame(frame: Float32Array, win: "hanning" | "rect") {
  meyda.bufferSize = frame.length;
  meyda.sampleRate = fs;
  meyda.windowingFunction = win;
  meyda.numberOfMFCCCoefficients = 13;
  return meyda.extract(["spectralCentroid", "spectralSpread", "spectralFlatness", "spectralRolloff", "mfcc", "loudness", "zcr"], frame)!;
}
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1e-9, Math.abs(b));

describe("spectral features against meyda 5.6.3 on the same frames (general-purpose reference library)", () => {
  const frames: [string, Float32Array][] = [
    ["white noise", noise(N)],
    ["a 440 Hz tone plus noise", Float32Array.from(sine(fs, N / fs + 0.001, 440, 0.5).subarray(0, N), (v, i) => v + 0.05 * noise(N, 9)[i])],
    ["a decaying 180 Hz hit with noise", hit(fs, N / fs + 0.001, { f: 180, tau: 0.03, seed: 5 }).subarray(0, N)],
  ];
  const an = new SpectralAnalyzer(N, fs);
  for (const [name, frame] of frames) {
    it(`${name}: centroid and spread (meyda in bins, times fs/N), flatness, MFCC 1-13, Bark loudness, zcr`, () => {
      const ours = an.analyze(frame, 0);
      const m = meydaFrame(frame, "hanning");
      expect(rel(ours.centroidHz, (m.spectralCentroid as number) * (fs / N))).toBeLessThan(1e-4);
      expect(rel(ours.spreadHz, (m.spectralSpread as number) * (fs / N))).toBeLessThan(1e-4);
      expect(rel(ours.flatness, m.spectralFlatness as number)).toBeLessThan(1e-3);
      const mm = m.mfcc as number[];
      ours.mfcc.forEach((v, i) => expect(Math.abs(v - mm[i])).toBeLessThan(1e-3 * Math.max(1, Math.abs(mm[0]))));
      const spec = (m.loudness as { specific: Float32Array }).specific;
      ours.bark.forEach((v, i) => expect(rel(v, spec[i])).toBeLessThan(1e-4));
      // rolloff: same 99 % bin; meyda multiplies it by fs / (2 (N/2 - 1)) instead of fs / N (meyda 5.6.3's source)
      expect(rel(ours.rolloffHz, ((m.spectralRolloff as number) * (N / 2 - 1)) / (N / 2))).toBeLessThan(1e-6);
      // zcr is a time-domain feature: meyda with a rect window (its Hann default would alter the count)
      expect(ours.zcr).toBe(meydaFrame(frame, "rect").zcr);
    });
  }
});

describe("spectral features against handbook values (pure tone and white noise, computed)", () => {
  const an = new SpectralAnalyzer(N, fs);
  it("zero-crossing rate of a sine is 2f/fs crossings per sample (2f per second)", () => {
    const f = 1234.5;
    const x = sine(fs, 0.5, f, 0.5, 0.3);
    const frames = [0, 1, 2, 3].map((k) => an.analyze(x, k * N));
    expect(Math.abs(summarize(frames, N, fs).zcrPerSec / (2 * f) - 1)).toBeLessThan(0.01);
  });
  it("flatness of a pure tone is about 0", () => {
    expect(an.analyze(sine(fs, 0.1, 1000, 0.5), 0).flatness).toBeLessThan(0.05);
  });
  it("flatness of one frame of white noise is about 0.85 on the amplitude spectrum (computed)", () => {
    const vals = [1, 2, 3, 4, 5].map((s) => an.analyze(noise(N, s), 0).flatness);
    expect(Math.abs(vals.reduce((a, b) => a + b) / vals.length - 0.85)).toBeLessThan(0.02);
  });
  it("flatness of all-zero input is undefined (NaN), and summaries skip such frames", () => {
    const z = an.analyze(new Float32Array(N), 0);
    expect(Number.isNaN(z.flatness)).toBe(true);
    const tone = an.analyze(sine(fs, 0.1, 1000, 0.5), 0);
    expect(summarize([z, tone], N, fs).flatness).toBeCloseTo(tone.flatness, 12);
  });
  for (const f of [250, 1000, 5000]) {
    it(`centroid of a ${f} Hz sine is within one bin (${(fs / N).toFixed(1)} Hz)`, () => {
      expect(Math.abs(an.analyze(sine(fs, 0.1, f, 0.5), 0).centroidHz - f)).toBeLessThan(fs / N);
    });
  }
  it("spectral slope (Peeters 2004) equals the least-squares slope of amplitude vs frequency over the amplitude sum (simple-statistics linearRegression)", () => {
    const a = Float64Array.from({ length: N / 2 }, (_, k) => Math.exp(-k / 200) + 0.1 * Math.abs(Math.sin(k)));
    const pts = Array.from(a, (v, k) => [(k * fs) / N, v]);
    const expected = linearRegression(pts).m / a.reduce((s, v) => s + v, 0);
    expect(rel(spectralSlope(a, fs, N), expected)).toBeLessThan(1e-9);
    expect(spectralSlope(a, fs, N)).toBeLessThan(0); // falling spectrum, negative slope (meyda's sign is inverted)
  });
  it("frame size is the power of two near 43 ms", () => {
    expect([frameSizeFor(44100), frameSizeFor(48000), frameSizeFor(96000), frameSizeFor(8000)]).toEqual([2048, 2048, 4096, 512]);
  });
});

describe("pitch: strongest low spectral peak with parabolic interpolation", () => {
  for (const f of [55, 110, 196.5, 440]) {
    it(`a damped ${f} Hz sine reads ${f} Hz within 1 %`, () => {
      const x = hit(fs, 1, { f, tau: 0.25, noiseMix: 0.02 });
      const p = lowPeakHz(x, Math.round(0.08 * fs), 8192, fs)!;
      expect(Math.abs(p / f - 1)).toBeLessThan(0.01);
    });
  }
  it("white noise has no low pitch peak", () => {
    expect(lowPeakHz(noise(8192, 11), 0, 8192, fs)).toBeNull();
  });
});

describe("the frame features read up to 24 kHz: a sound at 96 kHz measures as it does at 48 kHz", () => {
  // The same band-limited sound (sines at 180, 1250, 4300 and 11 800 Hz, each decaying, all well under 24 kHz)
  // sampled at both rates: by the sampling theorem (Shannon 1949) both hold the same signal, so a feature that
  // describes the sound, not the file, must agree. Frames are ~43 ms at both rates (2048 and 4096 samples: the
  // same 23.4 Hz bins).
  const tones = [[180, 1], [1250, 0.5], [4300, 0.25], [11800, 0.12]] as const;
  function sound(rate: number): Float32Array {
    const n = Math.round(rate * 0.2);
    const x = new Float32Array(n);
    for (let i = 0; i < n; i++) {
      const t = i / rate;
      let v = 0;
      for (const [f, a] of tones) v += a * Math.exp(-t / 0.08) * Math.sin(2 * Math.PI * f * t);
      x[i] = 0.4 * v;
    }
    return x;
  }
  const at = (rate: number) => {
    const n = frameSizeFor(rate);
    const an = new SpectralAnalyzer(n, rate);
    return summarize([0, 1, 2].map((k) => an.analyze(sound(rate), k * (n / 2))), n, rate);
  };
  const a = at(48000);
  const b = at(96000);
  it("reads the same band: 1024 bins at 48 kHz (N = 2048) and the first 1024 of 2048 at 96 kHz (N = 4096)", () => {
    expect(new SpectralAnalyzer(2048, 48000).L).toBe(1024);
    expect(new SpectralAnalyzer(4096, 96000).L).toBe(1024);
    expect(new SpectralAnalyzer(2048, 44100).L).toBe(1024); // all of it, as meyda reads it
  });
  it("centroid, spread, roll-off, flatness and slope agree within 2 %", () => {
    for (const k of ["centroidHz", "spreadHz", "rolloffHz", "flatness", "slope"] as const) expect(rel(b[k], a[k]), k).toBeLessThan(0.02);
  });
  it("the Bark band shares agree within 1 point", () => {
    const share = (s: typeof a) => { const t = s.barkLoudness.reduce((p, q) => p + q, 0); return s.barkLoudness.map((v) => v / t); };
    const sa = share(a), sb = share(b);
    for (let i = 0; i < sa.length; i++) expect(Math.abs(sa[i]! - sb[i]!), `band ${i}`).toBeLessThan(0.01);
  });
});
