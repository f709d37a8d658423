// The browser-side helpers, run in Node: MIDI message parsing, note names, audition layer choice and level,
// the tom ordering of the kit editor. (Pure functions; no database.)
import { describe, expect, it } from "vitest";
import { parseMidiMessage } from "@/components/midi/use-midi";
import { noteName } from "@/components/midi/note-name";
import { dbToGain, layerFor } from "@/components/audit/audition-engine";
import { orderTomSlots } from "@/components/kit/kit-editor";

describe("MIDI 1.0 channel messages (MIDI 1.0 Detailed Specification, channel voice messages)", () => {
  it("note on 9n kk vv on channel n+1; velocity 0 counts as note off", () => {
    expect(parseMidiMessage([0x99, 38, 100], "in", 1)).toEqual({ kind: "note-on", channel: 10, note: 38, velocity: 100, input: "in", at: 1 });
    expect(parseMidiMessage([0x90, 60, 0])?.kind).toBe("note-off");
    expect(parseMidiMessage([0x8f, 60, 64])).toMatchObject({ kind: "note-off", channel: 16, note: 60 });
  });
  it("control change Bn cc vv (controller 4 is the Foot Controller)", () => {
    expect(parseMidiMessage([0xb9, 4, 127])).toMatchObject({ kind: "cc", channel: 10, controller: 4, value: 127 });
  });
  it("ignores other and short messages", () => {
    expect(parseMidiMessage([0xf8])).toBeNull();
    expect(parseMidiMessage([0xe0, 0, 64])).toBeNull();
  });
});

describe("note names", () => {
  it("note 60 is middle C: C4 or C3 by the chosen convention (common practice, no published source)", () => {
    expect(noteName(60, "C4")).toBe("C4");
    expect(noteName(60, "C3")).toBe("C3");
  });
  it("note 69 is A4 (440 Hz) with middle C = C4 (MIDI Tuning Standard: note 69 = A 440 Hz)", () => {
    expect(noteName(69, "C4")).toBe("A4");
    expect(noteName(0, "C4")).toBe("C-1");
    expect(noteName(127, "C4")).toBe("G9");
    expect(noteName(38, "C4")).toBe("D2");
    expect(noteName(128)).toBe("?");
  });
});

describe("audition", () => {
  const layers = [
    { index: 0, velocityLow: 1, velocityHigh: 40, sampleIds: ["a"] },
    { index: 1, velocityLow: 61, velocityHigh: 127, sampleIds: ["b", "c"] },
    { index: 2, velocityLow: 41, velocityHigh: 60, sampleIds: [] },
  ];
  it("picks the layer the velocity falls in, else the nearest layer holding samples", () => {
    expect(layerFor(layers, 20)?.index).toBe(0);
    expect(layerFor(layers, 100)?.index).toBe(1);
    expect(layerFor(layers, 45)?.index).toBe(0); // 45 is 5 above layer 0 and 16 below layer 1; layer 2 holds nothing
    expect(layerFor(layers, 58)?.index).toBe(1);
    expect(layerFor([], 10)).toBeNull();
  });
  it("starts at -24 dB: amplitude 10^(-24/20) = 0.0631 (decibel definition for amplitude ratios)", () => {
    expect(dbToGain(-24)).toBeCloseTo(0.0631, 4);
    expect(dbToGain(0)).toBe(1);
  });
});

describe("kit editor: order toms by pitch", () => {
  it("reassigns the instruments of tom slots from high to low measured pitch, keeping slot places (common practice, no published source)", () => {
    const inst = (id: string, pitchHz: number | null) => ({ id, name: id, family: "tom" as const, libraryId: "l", libraryName: "L", pitchHz, sampleCount: 1, articulations: ["centre"] });
    const instruments = [inst("floor", 82), inst("rack-hi", 196), inst("rack-lo", 147), inst("unpitched", null)];
    const slots = [
      { id: "kick", name: "Kick", family: "kick" as const, instrumentId: "k" },
      { id: "tom-1", name: "Tom 1", family: "tom" as const, instrumentId: "floor" },
      { id: "tom-2", name: "Tom 2", family: "tom" as const, instrumentId: "unpitched" },
      { id: "tom-3", name: "Tom 3", family: "tom" as const, instrumentId: "rack-hi" },
      { id: "tom-4", name: "Tom 4", family: "tom" as const, instrumentId: "rack-lo" },
    ];
    expect(orderTomSlots(slots, instruments).map((s) => s.instrumentId)).toEqual(["k", "rack-hi", "rack-lo", "floor", "unpitched"]);
  });
});
