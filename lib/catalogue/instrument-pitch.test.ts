import { describe, expect, it } from "vitest";
import { instrumentPitchHz, mainStroke } from "./instrument-pitch";

// The median: the middle value of the sorted data, or for an even count the mean of the two middle values
// (NIST/SEMATECH e-Handbook of Statistical Methods, 1.3.5.1 "Measures of Location"; from memory).
const hit = (articulation: Parameters<typeof instrumentPitchHz>[1][number]["articulation"], pitchHz: number | null) => ({ articulation, pitchHz });

describe("instrument pitch: median of the main-stroke hits, else of all", () => {
  it("takes the median of the centre hits: 138, 140, 142 -> 140; even count 138, 140, 141, 142 -> 140.5", () => {
    expect(instrumentPitchHz("tom", [hit("centre", 142), hit("centre", 138), hit("centre", 140)])).toBe(140);
    expect(instrumentPitchHz("tom", [hit("centre", 142), hit("centre", 138), hit("centre", 141), hit("centre", 140)])).toBe(140.5);
  });

  it("ignores edge hits and rim shots when centre hits have a pitch, however many there are", () => {
    // a 140 Hz tom whose edge hits measure an upper mode near 240 Hz: over all seven hits the median would be 239
    const hits = [hit("centre", 138), hit("centre", 140), hit("centre", 142), hit("edge", 239), hit("edge", 240), hit("edge", 241), hit("rim-shot", 242)];
    expect(instrumentPitchHz("tom", hits)).toBe(140);
  });

  it("falls back to every hit when no main-stroke hit has a pitch; null when none has", () => {
    expect(instrumentPitchHz("snare", [hit("rim-shot", 300), hit("rim-shot", 310), hit("centre", null)])).toBe(305);
    expect(instrumentPitchHz("crash", [hit("crash-hit", null), hit("choke", null)])).toBeNull();
    expect(instrumentPitchHz("tom", [])).toBeNull();
  });

  it("skips pitches that are not positive finite numbers", () => {
    expect(instrumentPitchHz("tom", [hit("centre", Number.NaN), hit("centre", 0), hit("centre", -5), hit("centre", Number.POSITIVE_INFINITY), hit("centre", 99)])).toBe(99);
  });

  it("rounds to 0.01 Hz: 146.834 -> 146.83, (100 + 100.005) / 2 -> 100.0025 -> 100", () => {
    expect(instrumentPitchHz("tom", [hit("centre", 146.834)])).toBe(146.83);
    expect(instrumentPitchHz("tom", [hit("centre", 100), hit("centre", 100.005)])).toBe(100);
  });

  it("the main stroke is the family's first articulation: centre, closed, bow, crash-hit, hit, open-tone", () => {
    expect([mainStroke("tom"), mainStroke("kick"), mainStroke("hi-hat"), mainStroke("ride"), mainStroke("crash"), mainStroke("cowbell"), mainStroke("hand-drum")]).toEqual([
      "centre", "centre", "closed", "bow", "crash-hit", "hit", "open-tone",
    ]);
    expect(instrumentPitchHz("hi-hat", [hit("closed", 700), hit("open", 500), hit("open", 510)])).toBe(700);
  });
});
