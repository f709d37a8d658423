import { describe, expect, it } from "vitest";
import { encodeWav, measureBytes } from "../audio";
import { catalogueSamples, type CatalogueSampleInput } from "./catalogue";
import { rng } from "./test-helpers";

// End to end through the audio engine: WAV bytes -> measure -> catalogue, with names that say nothing.
// Signals are textbook models, not recordings: a tom as an exponentially decaying sine (tau 0.15 s, T60 = 6.9 tau
// ~ 1 s) at 110 Hz; a closed hi-hat as white noise differentiated twice (bright) with tau 25 ms.
const FS = 44100;

function tom(gainDb: number, seed: number): Float32Array {
  const r = rng(seed);
  const n = Math.round(FS * 1.2);
  const x = new Float32Array(n);
  const a = 10 ** (gainDb / 20);
  for (let i = 0; i < n; i++) {
    const t = i / FS;
    x[i] = a * Math.exp(-t / 0.15) * Math.sin(2 * Math.PI * 110 * t) + 1e-5 * (r() - 0.5);
  }
  return x;
}

function hat(gainDb: number, seed: number): Float32Array {
  const r = rng(seed);
  const n = Math.round(FS * 0.5);
  const x = new Float32Array(n);
  const a = 10 ** (gainDb / 20);
  let p1 = 0;
  let p2 = 0;
  for (let i = 0; i < n; i++) {
    const w = r() * 2 - 1;
    const d2 = w - 2 * p1 + p2; // second difference: +12 dB/octave tilt
    p2 = p1;
    p1 = w;
    x[i] = 0.25 * a * Math.exp(-i / FS / 0.025) * d2;
  }
  return x;
}

describe("bytes to catalogue", () => {
  it("sorts nameless tom hits into 4 layers x 2 round robins and tells the hi-hat apart", () => {
    const inputs: CatalogueSampleInput[] = [];
    let k = 0;
    for (const [li, g] of [-30, -24, -18, -12].entries()) {
      for (const rr of [0, 1]) {
        const bytes = encodeWav([tom(g + (rr ? 0.4 : -0.3), ++k)], { sampleRate: FS, bits: 24 });
        inputs.push({ id: `t${li}${rr}`, path: `Session 3/take ${k}.wav`, measurement: measureBytes(bytes) });
      }
    }
    for (const rr of [0, 1]) {
      const bytes = encodeWav([hat(-10 + rr, 100 + rr)], { sampleRate: FS, bits: 24 });
      inputs.push({ id: `h${rr}`, path: `Session 3/take ${++k}.wav`, measurement: measureBytes(bytes) });
    }
    const cat = catalogueSamples(inputs);
    const toms = cat.samples.filter((s) => s.id.startsWith("t"));
    expect(new Set(toms.map((s) => s.family))).toEqual(new Set(["tom"]));
    expect(toms.every((s) => s.familySource === "sound")).toBe(true);
    const hats = cat.samples.filter((s) => s.id.startsWith("h"));
    expect(hats.map((s) => [s.family, s.articulation])).toEqual([["hi-hat", "closed"], ["hi-hat", "closed"]]);
    // what the sound alone said, kept for the sample page: the trained model's vote shares, best first, the
    // chosen family on top, shares of one vote (together at most 1, give or take their rounding)
    for (const s of cat.samples) {
      expect(s.sound.source).toBe("model");
      expect(s.sound.fit[0]!.family).toBe(s.sound.family);
      expect(s.sound.fit.length).toBeGreaterThanOrEqual(1);
      expect(s.sound.fit.length).toBeLessThanOrEqual(4);
      for (let i = 1; i < s.sound.fit.length; i++) expect(s.sound.fit[i]!.fit).toBeLessThanOrEqual(s.sound.fit[i - 1]!.fit);
      expect(s.sound.fit.reduce((a, f) => a + f.fit, 0)).toBeLessThanOrEqual(1 + 4 * 0.0005); // each rounded to 0.001
    }

    const g = cat.groups.find((x) => x.instrumentKey === "tom:session")!;
    expect(g.countFrom).toBe("gaps");
    expect(g.layers.map((l) => l.sampleIds)).toEqual([["t00", "t01"], ["t10", "t11"], ["t20", "t21"], ["t30", "t31"]]);
    // a sine's loudness follows its gain: the layer steps are 6 dB (within 0.5 dB)
    for (let i = 1; i < 4; i++) expect(g.layers[i]!.meanStrikeLufs - g.layers[i - 1]!.meanStrikeLufs).toBeCloseTo(6, 0);
    expect(cat.health.filter((h) => h.severity === "error")).toEqual([]);
  });
});
