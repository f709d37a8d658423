import { describe, expect, it } from "vitest";
import { EXTRA_NOTES, GM_PERCUSSION, TEMPLATE_NAMES, getTemplate } from "./templates";
import { layoutBodySchema, layoutToFile, parseLayoutFile } from "./schema";

// General MIDI Level 1 percussion key map, channel 10 (MMA General MIDI System Level 1 specification), copied
// here as text and parsed.
const GM_TABLE_FROM_STANDARDS = `35 Acoustic Bass Drum, 36 Bass Drum 1, 37 Side Stick,
  38 Acoustic Snare, 39 Hand Clap, 40 Electric Snare, 41 Low Floor Tom, 42 Closed Hi-Hat, 43 High Floor Tom,
  44 Pedal Hi-Hat, 45 Low Tom, 46 Open Hi-Hat, 47 Low-Mid Tom, 48 Hi-Mid Tom, 49 Crash Cymbal 1, 50 High Tom,
  51 Ride Cymbal 1, 52 Chinese Cymbal, 53 Ride Bell, 54 Tambourine, 55 Splash Cymbal, 56 Cowbell,
  57 Crash Cymbal 2, 58 Vibraslap, 59 Ride Cymbal 2, 60 Hi Bongo, 61 Low Bongo, 62 Mute Hi Conga,
  63 Open Hi Conga, 64 Low Conga, 65 High Timbale, 66 Low Timbale, 67 High Agogo, 68 Low Agogo, 69 Cabasa,
  70 Maracas, 71 Short Whistle, 72 Long Whistle, 73 Short Guiro, 74 Long Guiro, 75 Claves, 76 Hi Wood Block,
  77 Low Wood Block, 78 Mute Cuica, 79 Open Cuica, 80 Mute Triangle, 81 Open Triangle`;

const gmTable = GM_TABLE_FROM_STANDARDS.split(",").map((s) => {
  const m = s.trim().match(/^(\d+) (.+)$/)!;
  return { note: Number(m[1]), name: m[2]! };
});

describe("General MIDI Level 1 percussion template (MMA General MIDI Level 1 key map)", () => {
  it("the table has 47 entries, notes 35-81", () => {
    expect(gmTable).toHaveLength(47);
    expect(gmTable.map((e) => e.note)).toEqual(Array.from({ length: 47 }, (_, i) => 35 + i));
  });

  it("GM_PERCUSSION equals the table (all 47 notes and names)", () => {
    expect(GM_PERCUSSION).toEqual(gmTable);
  });

  it("the template layout has one pad per GM note, named by the standard, on channel 10", () => {
    const l = getTemplate("gm-percussion")!;
    expect(l.pads.map((p) => ({ note: p.note, name: p.label }))).toEqual(gmTable);
    expect(new Set(l.pads.map((p) => p.channel))).toEqual(new Set([10]));
    for (const p of l.pads) expect(p.target).not.toBeNull();
  });

  it("targets follow the names (spot checks; our reading of the GM names)", () => {
    const t = (n: number) => getTemplate("gm-percussion")!.pads.find((p) => p.note === n)!.target;
    expect(t(37)).toEqual({ slotId: "snare", articulation: "cross-stick" });
    expect(t(42)).toEqual({ slotId: "hi-hat", articulation: "closed" });
    expect(t(44)).toEqual({ slotId: "hi-hat", articulation: "pedal" });
    expect(t(46)).toEqual({ slotId: "hi-hat", articulation: "open" });
    expect(t(53)).toEqual({ slotId: "ride-1", articulation: "bell" });
    // toms high to low: High Tom 50 -> Tom 1 ... Low Floor Tom 41 -> Tom 6
    expect([50, 48, 47, 45, 43, 41].map((n) => t(n)!.slotId)).toEqual(["tom-1", "tom-2", "tom-3", "tom-4", "tom-5", "tom-6"]);
  });
});

describe("our own templates", () => {
  it("all templates are valid kitwright.layout/v1 layouts and round-trip through JSON", () => {
    for (const name of TEMPLATE_NAMES) {
      const l = getTemplate(name)!;
      expect(layoutBodySchema.safeParse(l).success, name).toBe(true);
      expect(parseLayoutFile(JSON.stringify(layoutToFile(l)))).toEqual(l);
      // every slot a pad aims at is in the template's slot list
      const slotIds = new Set(l.slots!.map((s) => s.id));
      for (const p of l.pads) expect(slotIds.has(p.target!.slotId), `${name} ${p.label}`).toBe(true);
    }
  });

  it("grid sizes: 24 pads in 4 x 6, 16 pads in 2 x 8; every cell used once", () => {
    for (const [name, rows, cols] of [["grid-24", 4, 6], ["grid-2x8", 2, 8]] as const) {
      const l = getTemplate(name)!;
      expect(l.surface).toEqual({ kind: "grid", rows, cols });
      expect(l.pads).toHaveLength(rows * cols);
      expect(new Set(l.pads.map((p) => `${p.row},${p.col}`)).size).toBe(rows * cols);
    }
  });

  it("the five-piece trigger kit has head and rim zones and a hi-hat pedal on controller 4 (Foot Controller, MIDI 1.0)", () => {
    const l = getTemplate("trigger-five")!;
    for (const drum of ["snare", "tom1", "tom2", "tom3"]) {
      const head = l.pads.find((p) => p.id === `${drum}-head`)!;
      const rim = l.pads.find((p) => p.id === `${drum}-rim`)!;
      expect(head.target!.slotId).toBe(rim.target!.slotId);
      expect(head.note).not.toBe(rim.note);
    }
    expect(l.hiHatPedal).toMatchObject({ controller: 4, chickNote: 44, closedAt: "high" });
    const zones = l.hiHatPedal!.zones;
    expect(zones[0]!.low).toBe(0);
    expect(zones.at(-1)!.high).toBe(127);
    for (let i = 1; i < zones.length; i++) expect(zones[i]!.low).toBe(zones[i - 1]!.high + 1);
  });

  it("extra notes stay clear of the GM percussion range 35-81", () => {
    for (const n of Object.values(EXTRA_NOTES)) expect(n < 35 || n > 81).toBe(true);
    expect(new Set(Object.values(EXTRA_NOTES)).size).toBe(Object.values(EXTRA_NOTES).length);
  });

  it("unknown template names give null", () => {
    expect(getTemplate("no-such-layout")).toBeNull();
  });
});
