import { describe, expect, it } from "vitest";
import { curveAttenuationDb, dannenbergCoefficients, dannenbergGainDb, dlsAttenuationDb, velocityForAttenuation, velocityRanges } from "./velocity";

describe("DLS Level 1 default curve (MMA DLS Level 1: attenuation = 40 log10(127/v); values computed from that formula)", () => {
  it("v=100 -> 4.152 dB, v=64 -> 11.905 dB, v=32 -> 23.946 dB, v=127 -> 0 dB", () => {
    expect(dlsAttenuationDb(100)).toBeCloseTo(4.152, 3);
    expect(dlsAttenuationDb(64)).toBeCloseTo(11.905, 3);
    expect(dlsAttenuationDb(32)).toBeCloseTo(23.946, 3);
    expect(dlsAttenuationDb(127)).toBe(0);
  });
  it("is the square law: gain (v/127)^2", () => {
    for (const v of [1, 17, 90]) expect(Math.pow(10, -dlsAttenuationDb(v) / 20)).toBeCloseTo((v / 127) ** 2, 10);
  });
  it("inverse gives back the velocity", () => {
    for (const v of [5, 32, 64, 100, 127]) expect(velocityForAttenuation({ kind: "dls" }, dlsAttenuationDb(v))).toBeCloseTo(v, 9);
  });
});

describe("Dannenberg, The Interpretation of MIDI Velocity, ICMC 2006 (values computed from its formula)", () => {
  it("60 dB range: m = 0.00768553, b = 0.0239372; v=64 -> -11.5 dB", () => {
    const { m, b } = dannenbergCoefficients(60);
    expect(m).toBeCloseTo(0.00768553, 8);
    expect(b).toBeCloseTo(0.0239372, 7);
    expect(dannenbergGainDb(64, 60)).toBeCloseTo(-11.5, 1);
  });
  it("spans exactly the range: v=127 -> 0 dB, v=1 -> -range dB (from the paper's definition of r)", () => {
    expect(dannenbergGainDb(127, 40)).toBeCloseTo(0, 9);
    expect(dannenbergGainDb(1, 40)).toBeCloseTo(-40, 9);
    expect(curveAttenuationDb({ kind: "dannenberg", rangeDb: 60 }, 64)).toBeCloseTo(11.5, 1);
  });
  it("inverse gives back the velocity", () => {
    const c = { kind: "dannenberg" as const, rangeDb: 48 };
    for (const v of [1, 30, 64, 127]) expect(velocityForAttenuation(c, curveAttenuationDb(c, v))).toBeCloseTo(v, 8);
  });
});

describe("velocityRanges", () => {
  const check = (r: ReturnType<typeof velocityRanges>) => {
    expect(r[0]!.velocityLow).toBe(1);
    expect(r[r.length - 1]!.velocityHigh).toBe(127);
    for (let i = 0; i < r.length; i++) {
      expect(r[i]!.velocityHigh).toBeGreaterThanOrEqual(r[i]!.velocityLow);
      if (i > 0) expect(r[i]!.velocityLow).toBe(r[i - 1]!.velocityHigh + 1);
    }
  };
  it("DLS: boundaries at the halfway level (computed from the DLS formula)", () => {
    // layers 6 dB apart: boundaries at 3, 9, 15 dB of attenuation -> 127*10^(-a/40)
    const r = velocityRanges([-36, -30, -24, -18]);
    check(r);
    expect(r.map((x) => x.velocityHigh)).toEqual([
      Math.floor(127 * 10 ** (-15 / 40)), Math.floor(127 * 10 ** (-9 / 40)), Math.floor(127 * 10 ** (-3 / 40)), 127,
    ]);
    expect(r[0]!.nominalVelocity).toBeCloseTo(127 * 10 ** (-18 / 40), 1);
  });
  it("Dannenberg over the measured range puts the softest layer at v=1", () => {
    const r = velocityRanges([-40, -28, -16], { kind: "dannenberg" });
    check(r);
    expect(r[0]!.nominalVelocity).toBe(1);
    expect(r[2]!.nominalVelocity).toBe(127);
    // boundary 1 at -6 dB (halfway 0..12) on a 24 dB curve
    const { m, b } = dannenbergCoefficients(24);
    expect(r[1]!.velocityHigh).toBe(Math.floor((10 ** (-6 / 40) - b) / m));
  });
  it("covers 1..127 without gaps even for many close layers", () => {
    const r = velocityRanges(Array.from({ length: 40 }, (_, i) => -1 + i * 0.01));
    check(r);
    expect(r).toHaveLength(40);
  });
  it("one layer answers everything; unsorted input is refused", () => {
    expect(velocityRanges([-20])).toEqual([{ velocityLow: 1, velocityHigh: 127, nominalVelocity: 127 }]);
    expect(() => velocityRanges([-10, -20])).toThrow(/sorted/);
  });
});
