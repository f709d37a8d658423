import { describe, expect, it } from "vitest";
import { encodeWav, measureBytes } from "../audio";
import { renderSound, type SoundSpec } from "../synth/drums";
import { curveLine, velocityResponse, type ResponseLayer } from "./velocity-response";
import { curveAttenuationDb } from "./velocity";

const L = (index: number, velocityLow: number, velocityHigh: number, strikeLufs: number): ResponseLayer => ({ index, velocityLow, velocityHigh, strikeLufs });
const FOUR = (lufs: number[]) => [L(0, 1, 32, lufs[0]!), L(1, 33, 64, lufs[1]!), L(2, 65, 96, lufs[2]!), L(3, 97, 127, lufs[3]!)];

describe("velocityResponse: worked examples from the curve formulas", () => {
  it("DLS Level 1 (attenuation 40 log10(127/v) dB, MMA Downloadable Sounds Level 1): targets and trims by hand", () => {
    // by hand: 40 log10(127/32) = 40 x 0.598654 = 23.946; 40 log10(127/64) = 40 x 0.297624 = 11.905;
    // 40 log10(127/96) = 40 x 0.121532 = 4.861. Measured relative to the top layer: -22, -12, -4, 0.
    const r = velocityResponse(FOUR([-40, -30, -22, -18]), { curve: { kind: "dls" } });
    expect(r.layers.map((l) => l.measuredDb)).toEqual([-22, -12, -4, 0]);
    const targets = [-23.946, -11.905, -4.861, 0];
    r.layers.forEach((l, i) => expect(l.targetDb).toBeCloseTo(targets[i]!, 1));
    // trims = target - measured: -1.946, +0.095, -0.861, 0
    [-1.946, 0.095, -0.861, 0].forEach((t, i) => expect(r.layers[i]!.trimDb).toBeCloseTo(t, 1));
    expect(r.rmsBeforeDb).toBeCloseTo(Math.sqrt((1.946 ** 2 + 0.095 ** 2 + 0.861 ** 2) / 4), 1);
    expect(r.outOfOrder).toEqual([]);
    expect(r.tooClose).toEqual([]);
  });

  it("Dannenberg ('The Interpretation of MIDI Velocity', ICMC 2006) with a 40 dB range: exact fractions by hand", () => {
    // r = 10^(40/20) = 100, sqrt r = 10: b = 127/1260 - 1/126 = 13/140, m = (1 - b)/127 = 1/140.
    // level(v) = 40 log10((v + 13)/140): v = 127 -> 0 dB; v = 64 -> 40 log10(0.55) = -10.385; v = 32 -> 40 log10(45/140) = -19.717.
    const layers = [L(0, 1, 32, -50), L(1, 33, 64, -41), L(2, 65, 127, -30)];
    const r = velocityResponse(layers, { curve: { kind: "dannenberg", rangeDb: 40 } });
    expect(r.rangeDb).toBe(40);
    expect(r.layers.map((l) => l.targetDb)).toEqual([-19.72, -10.39, 0]);
    // measured -20, -11, 0: trims +0.283, +0.615, 0
    expect(r.layers.map((l) => l.trimDb)).toEqual([0.28, 0.61, 0]);
  });

  it("flags a layer quieter than the one below it, layers within 1 dB, and boosts over 6 dB", () => {
    const r = velocityResponse(FOUR([-30, -31, -20.5, -20]), { curve: { kind: "dls" } });
    expect(r.outOfOrder).toEqual([{ lower: 0, upper: 1, db: -1 }]);
    expect(r.tooClose).toEqual([{ lower: 2, upper: 3, db: 0.5 }]);
    const quiet = velocityResponse(FOUR([-60, -30, -22, -18]), { curve: { kind: "dls" } });
    expect(quiet.bigBoosts).toEqual([0]); // -42 measured against a -23.9 target: +18 dB
  });

  it("draws the curve relative to the reference velocity", () => {
    const line = curveLine({ kind: "dls" }, 84);
    expect(line).toHaveLength(127);
    expect(line[126]).toEqual({ velocity: 127, db: 0 });
    expect(line[63]!.db).toBeCloseTo(-11.905, 2);
    expect(() => velocityResponse([L(0, 1, 127, -20)], { curve: { kind: "dls" } })).toThrow(/two or more/);
  });
});

describe("velocityResponse on generated takes with known level errors", () => {
  it("recovers each layer's error within 0.1 dB after measuring the files (lib/audio strike loudness)", () => {
    const SNARE: SoundSpec = { family: "snare", instrument: { diameterIn: 14, depthIn: 6.5, tuneHz: 195, shell: "brass" }, articulation: "centre" };
    const hit = renderSound(SNARE, { sampleRate: 48000, velocity: 100, seed: "ladder", channels: 2 });
    const ranges: [number, number][] = [[1, 40], [41, 80], [81, 110], [111, 127]];
    const errors = [2.0, -1.5, 0.7, 0]; // dB off the DLS curve; the top layer is the reference
    const layers = ranges.map(([lo, hi], i) => {
      const db = -curveAttenuationDb({ kind: "dls" }, hi) + errors[i]! - 6; // 6 dB of headroom
      const g = 10 ** (db / 20);
      const m = measureBytes(encodeWav(hit.map((c) => c.map((x) => x * g)), { sampleRate: 48000, bits: 24 }));
      return L(i, lo, hi, m.strikeLufs);
    });
    const r = velocityResponse(layers, { curve: { kind: "dls" } });
    r.layers.forEach((l, i) => expect(Math.abs(l.trimDb + errors[i]!)).toBeLessThan(0.1));
  });
});
