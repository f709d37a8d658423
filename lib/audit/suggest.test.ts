import { describe, expect, it } from "vitest";
import { runAudit } from "./audit";
import { readZone } from "./suggest-zones";
import { suggestLayout, type Suggestion } from "./suggest";
import { mainStrike } from "./suggest-rules";
import { getTemplate } from "./templates";
import { instrument } from "./test-catalogue";
import type { CatalogueInstrument, Family, Kit, Pad } from "./types";

// Invented test data (a scenario of our own): a five-piece kit with hats, crash, ride and a second snare.
// The placement rules checked here are common practice of finger drummers and kit players (no published
// standard): the hi-hat on both sides of the snare, toms high to low from left to right, cymbals on top.
const CATALOGUE: CatalogueInstrument[] = [
  instrument("kick", "Kick 22", "kick", [["centre", 4, 3]]),
  instrument("snA", "Snare 14 brass", "snare", [["centre", 4, 3], ["rim-shot", 3, 2], ["cross-stick", 2, 2], ["edge", 2, 2]]),
  instrument("snB", "Snare 13 piccolo", "snare", [["centre", 3, 2], ["rim-shot", 2, 2]]),
  instrument("t16", "Tom 16 floor", "tom", [["centre", 3, 2]], 82),
  instrument("t10", "Tom 10", "tom", [["centre", 3, 2], ["rim-shot", 2, 2]], 196),
  instrument("t12", "Tom 12", "tom", [["centre", 3, 2]], 147),
  instrument("hat", "Hi-hat 14", "hi-hat", [["closed", 4, 4], ["open", 3, 2], ["pedal", 2, 2]]),
  instrument("crash", "Crash 18", "crash", [["crash-hit", 3, 2]]),
  instrument("ride", "Ride 21", "ride", [["bow", 4, 3], ["bell", 2, 2]]),
];
const slot = (id: string, name: string, family: Family, instrumentId: string | null) => ({ id, name, family, instrumentId });
// toms listed out of pitch order on purpose: the floor tom first
const KIT: Kit = {
  id: "five",
  name: "Five-piece",
  slots: [
    slot("kick", "Kick", "kick", "kick"), slot("snare", "Snare A", "snare", "snA"), slot("snare-2", "Snare B", "snare", "snB"),
    slot("tom-a", "Floor tom", "tom", "t16"), slot("tom-b", "Rack tom 1", "tom", "t10"), slot("tom-c", "Rack tom 2", "tom", "t12"),
    slot("hi-hat", "Hi-hat", "hi-hat", "hat"), slot("crash", "Crash", "crash", "crash"), slot("ride", "Ride", "ride", "ride"),
  ],
};

const padsOf = (s: Suggestion, slotId: string, articulation: string): Pad[] =>
  s.layout.pads.filter((p) => p.target?.slotId === slotId && p.target.articulation === articulation);
const one = (s: Suggestion, slotId: string, articulation: string): Pad => {
  const found = padsOf(s, slotId, articulation);
  expect(found, `${slotId} ${articulation}`).toHaveLength(1);
  return found[0]!;
};
const pitchOf = (slotId: string) => CATALOGUE.find((i) => i.id === KIT.slots.find((s) => s.id === slotId)!.instrumentId)!.pitchHz!;

describe("suggestLayout on a 4 x 6 grid", () => {
  const s = suggestLayout({ kind: "grid", rows: 4, cols: 6 }, KIT, CATALOGUE);

  it("puts the closed hi-hat on both sides of the snare, the two pads sharing one note", () => {
    const snare = one(s, "snare", "centre");
    const hats = padsOf(s, "hi-hat", "closed");
    expect(hats).toHaveLength(2);
    expect(hats.map((h) => h.row)).toEqual([snare.row, snare.row]);
    expect(hats.map((h) => h.col! - snare.col!).sort()).toEqual([-1, 1]);
    expect(hats[0]!.note).toBe(hats[1]!.note);
    expect(hats[0]!.note).toBe(42); // General MIDI Level 1: 42 Closed Hi-Hat
  });

  it("orders the toms high to low from left to right, whatever their order in the kit", () => {
    const toms = ["tom-a", "tom-b", "tom-c"].map((id) => ({ id, pad: one(s, id, "centre") })).sort((a, b) => a.pad.col! - b.pad.col!);
    const pitches = toms.map((t) => pitchOf(t.id));
    expect(pitches).toEqual([...pitches].sort((a, b) => b - a));
    expect(new Set(toms.map((t) => t.pad.row)).size).toBe(1);
  });

  it("places every recorded main strike and every recorded stroke (24 pads, 17 strokes)", () => {
    for (const sl of KIT.slots) expect(padsOf(s, sl.id, mainStrike(sl.family)).length, sl.id).toBeGreaterThan(0);
    for (const inst of CATALOGUE) {
      const sl = KIT.slots.find((x) => x.instrumentId === inst.id)!;
      for (const a of inst.articulations) expect(padsOf(s, sl.id, a.articulation).length, `${sl.id} ${a.articulation}`).toBeGreaterThan(0);
    }
    expect(s.leftOut).toEqual([]);
    // the closed hat twice, and a second kick pad in a cell left free
    expect(s.layout.pads).toHaveLength(17 + 2);
    const kicks = padsOf(s, "kick", "centre");
    expect(kicks.map((k) => k.note)).toEqual([36, 36]);
  });

  it("leaves no pad silent and every pad plays what it asks for (audited)", () => {
    const a = runAudit(s.layout, KIT, CATALOGUE);
    expect(a.summary.silent).toBe(0);
    expect(a.summary.direct).toBe(a.summary.pads);
  });

  it("keeps cymbals in the top row, the bell beside its bow and secondary strokes near their main strike", () => {
    expect(one(s, "crash", "crash-hit").row).toBe(1);
    expect(one(s, "ride", "bow").row).toBe(1);
    const bow = one(s, "ride", "bow");
    const bell = one(s, "ride", "bell");
    expect(Math.abs(bow.row! - bell.row!) + Math.abs(bow.col! - bell.col!)).toBe(1);
    const snare = one(s, "snare", "centre");
    const rim = one(s, "snare", "rim-shot");
    expect(Math.max(Math.abs(rim.row! - snare.row!), Math.abs(rim.col! - snare.col!))).toBe(1);
  });

  it("gives the main strikes their General MIDI notes and a reason for every pad", () => {
    expect(padsOf(s, "kick", "centre")[0]!.note).toBe(36); // GM 36 Bass Drum 1
    expect(one(s, "snare", "centre").note).toBe(38); // GM 38 Acoustic Snare
    expect(one(s, "snare-2", "centre").note).toBe(40); // GM 40 Electric Snare (second snare)
    expect(one(s, "snare", "cross-stick").note).toBe(37); // GM 37 Side Stick
    expect(one(s, "ride", "bell").note).toBe(53); // GM 53 Ride Bell
    expect(s.placements).toHaveLength(s.layout.pads.length);
    expect(s.placements.every((p) => p.reason.length > 20)).toBe(true);
    expect(s.placements.find((p) => p.slotId === "hi-hat" && p.articulation === "closed")!.reason).toMatch(/both sides of the snare/);
    // distinct strokes never share a note
    const byNote = new Map<number, string>();
    for (const p of s.layout.pads) {
      const k = `${p.target!.slotId}|${p.target!.articulation}`;
      expect(byNote.get(p.note) ?? k).toBe(k);
      byNote.set(p.note, k);
    }
  });

  it("sets up the hi-hat pedal from the recorded openness strokes, with its chick", () => {
    expect(s.layout.hiHatPedal).toEqual({
      controller: 4, channel: 10, slotId: "hi-hat", closedAt: "high", chickNote: 44,
      zones: [{ low: 0, high: 63, articulation: "open" }, { low: 64, high: 127, articulation: "closed" }],
    });
  });
});

describe("suggestLayout on a 2 x 8 strip", () => {
  const s = suggestLayout({ kind: "grid", rows: 2, cols: 8 }, KIT, CATALOGUE);
  it("fits the main strikes first and says which secondary strokes had no room", () => {
    expect(s.layout.pads).toHaveLength(16);
    for (const sl of KIT.slots) expect(padsOf(s, sl.id, mainStrike(sl.family)).length, sl.id).toBeGreaterThan(0);
    expect(s.leftOut).toHaveLength(17 + 1 - 16);
    expect(s.leftOut.every((l) => l.articulation !== mainStrike(KIT.slots.find((x) => x.id === l.slotId)!.family))).toBe(true);
    expect(s.leftOut[0]!.reason).toMatch(/16 pads for 18 strokes/);
    const snare = one(s, "snare", "centre");
    expect(snare.row).toBe(2);
    expect(padsOf(s, "hi-hat", "closed").map((h) => h.col! - snare.col!).sort()).toEqual([-1, 1]);
    expect(runAudit(s.layout, KIT, CATALOGUE).summary.silent).toBe(0);
  });
});

describe("suggestLayout for a trigger kit (named zones)", () => {
  const zones = getTemplate("trigger-five")!.pads.map((p) => p.zone!);
  const s = suggestLayout({ kind: "zones", zones: [...zones, "tom 3 head", "cowbell"] }, KIT, CATALOGUE);
  it("reads zone names as the file-name reader does", () => {
    expect(readZone("snare rim")).toMatchObject({ family: "snare", articulation: "rim-shot" });
    expect(readZone("crash edge")).toMatchObject({ family: "crash", articulation: "crash-hit" });
    expect(readZone("hi-hat top")).toMatchObject({ family: "hi-hat", articulation: "closed" });
    expect(readZone("floor tom head")).toMatchObject({ family: "tom", number: 1000 });
  });
  it("gives tom 1 the highest tom, marks stand-ins and leaves out what the kit lacks", () => {
    expect(s.layout.pads.find((p) => p.zone === "tom 1 head")!.target).toEqual({ slotId: "tom-b", articulation: "centre" });
    expect(s.layout.pads.find((p) => p.zone === "tom 3 head")!.target).toEqual({ slotId: "tom-a", articulation: "centre" });
    const crashBow = s.placements.find((p) => p.padId === "crash-bow")!;
    expect(crashBow.standIn).toBe(true);
    expect(crashBow.reason).toMatch(/the crash plays instead/);
    expect(s.leftOut.map((l) => l.reason)).toEqual(['zone "cowbell": the kit has no cowbell left for it']);
    const audit = runAudit(s.layout, KIT, CATALOGUE);
    expect(audit.summary.silent).toBe(0);
    expect(audit.summary.standIn).toBe(s.placements.filter((p) => p.standIn).length);
  });
});

describe("stand-ins on request", () => {
  it("places a never-recorded main strike only when asked, marked as a stand-in", () => {
    const cat = [instrument("ride", "Ride 20", "ride", [["bell", 2, 1]])];
    const kit: Kit = { id: "k", name: "k", slots: [slot("ride", "Ride", "ride", "ride")] };
    expect(padsOf(suggestLayout({ kind: "grid", rows: 2, cols: 2 }, kit, cat), "ride", "bow")).toHaveLength(0);
    const s = suggestLayout({ kind: "grid", rows: 2, cols: 2 }, kit, cat, { standIns: true });
    const bow = s.placements.find((p) => p.articulation === "bow")!;
    expect(bow.standIn).toBe(true);
    expect(bow.reason).toMatch(/the bell plays instead/);
  });
});
