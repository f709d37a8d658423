import { describe, expect, it } from "vitest";
import { groupInstruments, instrumentDisplayName, instrumentKey, mergeInList, mergeInstruments, splitByPitch } from "./instruments";
import { parseName } from "./names";

const input = (id: string, path: string) => {
  const n = parseName(path);
  return { id, family: n.family!, stem: n.stem };
};

describe("instruments from folder and name stems (common practice of library folder structures)", () => {
  it("groups one drum named in folders and one named in files, and keeps drums apart", () => {
    const { instruments, bySample } = groupInstruments([
      input("a", "Snare 14x6.5 Brass/Center/v1_rr1.wav"),
      input("b", "Snare 14x6.5 Brass/Rimshot/v2_rr1.wav"),
      input("c", "Snares/Snare_Maple_Center_v1_rr1.wav"),
      input("d", "Snares/Snare_Maple_Edge_v1_rr2.wav"),
      input("e", "Toms/Tom1_Center_v1.wav"),
      input("f", "Toms/Tom2_Center_v1.wav"),
      input("g", "Toms/FT16_Center_v1.wav"),
      input("h", "Kick_In_v1_rr1.wav"),
      input("i", "Kick_Out_v1_rr1.wav"),
    ]);
    expect(instruments.map((i) => [i.key, i.displayName, i.sampleIds])).toEqual([
      ["kick:main", "Kick", ["h", "i"]],
      ["snare:14x6.5-brass", "Snare 14x6.5 Brass", ["a", "b"]],
      ["snare:maple", "Snare Maple", ["c", "d"]],
      ["tom:1", "Tom 1", ["e"]],
      ["tom:2", "Tom 2", ["f"]],
      ["tom:floor-16in", "Floor Tom 16in", ["g"]],
    ]);
    expect(bySample.b).toBe("snare:14x6.5-brass");
  });
  it("keys are deterministic and independent of input order", () => {
    expect(instrumentKey("crash", ["crash", "18in"])).toBe("crash:18in");
    expect(instrumentDisplayName("hand-drum", ["conga"])).toBe("Conga");
    const a = groupInstruments([input("1", "Ride 22/Bell_01.wav"), input("2", "Ride 22/Bow_01.wav")]);
    const b = groupInstruments([input("2", "Ride 22/Bow_01.wav"), input("1", "Ride 22/Bell_01.wav")]);
    expect(a).toEqual(b);
  });
  it("merges two groups of one family; refuses across families", () => {
    const { instruments } = groupInstruments([input("x", "Crash18_Hit_01.wav"), input("y", "Crash_18in_Edge_02.wav"), input("z", "Ride_Bow_01.wav")]);
    // "Crash18" and "Crash 18in" are one size already: one instrument
    expect(instruments.filter((i) => i.family === "crash").map((i) => [i.key, i.sampleIds])).toEqual([["crash:18in", ["x", "y"]]]);
    const { instruments: two } = groupInstruments([input("x", "Crash Dark/Hit_01.wav"), input("y", "Crash Bright/Hit_01.wav"), input("z", "Ride_Bow_01.wav")]);
    const merged = mergeInList(two, "crash:dark", "crash:bright");
    expect(merged.map((i) => [i.key, i.sampleIds, i.mergedFrom])).toEqual([
      ["crash:dark", ["x", "y"], ["crash:bright"]],
      ["ride:main", ["z"], []],
    ]);
    expect(() => mergeInstruments(two.find((i) => i.family === "crash")!, two.find((i) => i.family === "ride")!)).toThrow(/families differ/);
    expect(() => mergeInList(two, "crash:dark", "nope")).toThrow(/no instrument/);
  });
});

describe("splitByPitch (toms tuned a third or fourth apart, one drum's pitch moving well under a tone: common practice)", () => {
  const inst = { key: "tom:main", family: "tom" as const, displayName: "Tom", descriptors: [], sampleIds: ["a", "b", "c", "d", "e", "f", "g"], mergedFrom: [] };
  it("three toms a fourth apart become three instruments, highest first; unpitched hits kept apart", () => {
    // 98 Hz, 131 Hz (a fourth up: 98 * 2^(5/12) = 130.8), 175 Hz; each with +-0.3 semitone scatter
    const st = (hz: number, semis: number) => hz * 2 ** (semis / 12);
    const pitch = { a: st(98, -0.3), b: st(98, 0.3), c: st(131, 0), d: st(131, 0.25), e: st(175, -0.2), f: st(175, 0.2), g: null };
    const parts = splitByPitch(inst, pitch);
    expect(parts.map((p) => [p.key, p.sampleIds])).toEqual([
      ["tom:main-p1", ["e", "f"]], ["tom:main-p2", ["c", "d"]], ["tom:main-p3", ["a", "b"]], ["tom:main-unpitched", ["g"]],
    ]);
    expect(parts[0]!.displayName).toBe("Tom 1 (about 175 Hz)");
  });
  it("one drum whose pitch rises a little with strength stays one", () => {
    const pitch = { a: 100, b: 101, c: 102, d: 103.5, e: 104, f: 105, g: 106 };
    expect(splitByPitch(inst, pitch)).toEqual([inst]);
  });
});
