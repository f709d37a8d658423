import { describe, expect, it } from "vitest";
import { runAudit, uncoveredRanges, itemScore, hasSilentPads } from "./audit";
import { buildDefaultKit, expectedSlots } from "./kits";
import { getTemplate } from "./templates";
import { testCatalogue } from "./test-catalogue";
import type { AuditResult, Kit, Layout } from "./types";

// The expected findings below are worked out by hand from the generated catalogue (test-catalogue.ts)
// and the fallback graph; the fallback choices follow common practice of drum libraries (no published source).

const cat = testCatalogue();

function auditTemplate(name: string): AuditResult {
  const layout = getTemplate(name)!;
  return runAudit(layout, buildDefaultKit(layout, cat), cat);
}

type Row = [string, string, string | null]; // [pad label or id, outcome, plays]
const brief = (r: AuditResult, key: "label" | "padId" = "label"): Row[] => r.pads.map((p) => [p[key], p.outcome, p.plays]);

describe("default kit (toms high to low by pitch: common practice, no published source)", () => {
  it("orders toms by measured pitch, high to low, and keeps every instrument", () => {
    const layout = getTemplate("grid-24")!;
    const kit = buildDefaultKit(layout, cat);
    const bySlot = Object.fromEntries(kit.slots.map((s) => [s.id, s.instrumentId]));
    expect(bySlot["tom-1"]).toBe("tom-10");
    expect(bySlot["tom-2"]).toBe("tom-12");
    expect(bySlot["tom-3"]).toBe("tom-16");
    expect(bySlot["splash"]).toBeNull();
    // instruments no slot asked for are kept as extra slots: one slot per instrument
    expect(kit.slots.filter((s) => s.id.startsWith("extra-")).map((s) => s.instrumentId)).toEqual(["cowbell", "conga-11"]);
    const held = kit.slots.map((s) => s.instrumentId).filter(Boolean);
    expect(new Set(held).size).toBe(cat.length);
  });

  it("matches percussion slots by name (a conga goes to the conga slot, not the first hand-drum slot)", () => {
    const kit = buildDefaultKit(getTemplate("gm-percussion")!, cat);
    const bySlot = Object.fromEntries(kit.slots.map((s) => [s.id, s.instrumentId]));
    expect(bySlot["conga-high"]).toBe("conga-11");
    expect(bySlot["bongo-high"]).toBeNull();
    expect(bySlot["cowbell"]).toBe("cowbell");
  });

  it("does not depend on the order the catalogue lists its instruments in: equally rich snares go by name", () => {
    // two snares with the same articulations and takes; the app lists instruments by name, the command line by key
    const piccolo = { ...cat.find((i) => i.id === "snare-14")!, id: "snare-13-piccolo", name: "Piccolo snare 13" };
    const toms = cat.filter((i) => i.family === "tom").map((i) => ({ ...i, pitchHz: null }));
    const a = [...cat, piccolo, ...toms.map((t) => ({ ...t, id: `${t.id}-b` }))];
    const layout = getTemplate("grid-24")!;
    const slots = (list: typeof a) => Object.fromEntries(buildDefaultKit(layout, list).slots.filter((s) => !s.id.startsWith("extra-")).map((s) => [s.id, s.instrumentId]));
    expect(slots([...a].reverse())).toEqual(slots(a));
    // "Piccolo snare 13" < "Snare 14 brass" (name order, not listing order)
    expect(slots(a).snare).toBe("snare-13-piccolo");
  });

  it("infers slot families from slot ids when a layout has no slot list", () => {
    const layout = getTemplate("grid-2x8")!;
    delete layout.slots;
    const fam = Object.fromEntries(expectedSlots(layout).map((s) => [s.id, s.family]));
    expect(fam).toMatchObject({ kick: "kick", snare: "snare", "tom-1": "tom", "hi-hat": "hi-hat", "crash-1": "crash", "ride-1": "ride", china: "china", splash: "splash" });
  });
});

describe("audit of the generated kit against each template (expected findings worked by hand)", () => {
  it("grid-24", () => {
    const r = auditTemplate("grid-24");
    expect(brief(r)).toEqual([
      ["Crash 1", "direct", "crash-hit"], ["China", "direct", "crash-hit"], ["Ride bell", "direct", "bell"], ["Ride bow", "direct", "bow"], ["Splash", "silent", null], ["Crash 2", "silent", null],
      ["Tom 1", "direct", "centre"], ["Tom 1 rim", "direct", "rim-shot"], ["Tom 2", "direct", "centre"], ["Tom 2 rim", "stand-in", "centre"], ["Tom 3", "direct", "centre"], ["Tom 3 rim", "stand-in", "centre"],
      ["Snare", "direct", "centre"], ["Snare half-edge", "stand-in", "centre"], ["Snare edge", "direct", "edge"], ["Snare rim shot", "direct", "rim-shot"], ["Cross-stick", "direct", "cross-stick"], ["Snare flam", "stand-in", "centre"],
      ["Kick left", "direct", "centre"], ["Kick right", "direct", "centre"], ["Hat closed", "direct", "closed"], ["Hat half-open", "stand-in", "open"], ["Hat open", "direct", "open"], ["Hat pedal", "direct", "pedal"],
    ]);
    const pad = (label: string) => r.pads.find((p) => p.label === label)!;
    expect(pad("Snare half-edge").standIn).toEqual({ path: ["half-edge", "centre"], cost: 1, source: "graph", edges: [{ from: "half-edge", to: "centre", cost: 1, owner: "built-in" }] });
    expect(pad("Tom 2 rim").standIn).toEqual({ path: ["rim-shot", "centre"], cost: 2, source: "graph", edges: [{ from: "rim-shot", to: "centre", cost: 2, owner: "built-in" }] });
    expect(pad("Hat half-open").standIn).toEqual({ path: ["half-open", "open"], cost: 1.5, source: "graph", edges: [{ from: "half-open", to: "open", cost: 1.5, owner: "built-in" }] });
    expect(pad("Splash").reason).toBe('slot "Splash" is empty');
    // the snare edge was recorded at 1-60 and 80-127: velocities 61-79 find no layer
    expect(pad("Snare edge").velocityGaps).toEqual([{ low: 61, high: 79 }]);
    expect(pad("Snare edge").layers.map((l) => [l.velocityLow, l.velocityHigh, l.roundRobins])).toEqual([[1, 60, 2], [80, 127, 1]]);
    expect(pad("Snare edge").minRoundRobins).toBe(1);
    // the snare centre: 4 even layers of 3 round robins, no gap
    expect(pad("Snare").layers.map((l) => [l.velocityLow, l.velocityHigh, l.roundRobins])).toEqual([[1, 31, 3], [32, 63, 3], [64, 95, 3], [96, 127, 3]]);
    expect(pad("Snare").velocityGaps).toEqual([]);
    // the two empty slots: silent pads, each slot reported once, not conflicts
    expect(r.conflicts).toEqual([]);
    expect(r.emptySlots).toEqual([
      { slotId: "splash", slotName: "Splash", padIds: ["r1c5"], labels: ["Splash"] },
      { slotId: "crash-2", slotName: "Crash 2", padIds: ["r1c6"], labels: ["Crash 2"] },
    ]);
    expect(r.summary).toMatchObject({ pads: 24, direct: 17, standIn: 5, silent: 2, conflicts: 0 });
    // score by the stated formula (SCHEMA.md "Score"): stand-ins 1 - 0.1 d (d = 2, 2, 1, 2, 1.5), the snare edge
    // covers 108 of 127 velocities: 100 * (16 + 108/127 + 0.8 + 0.8 + 0.9 + 0.8 + 0.85) / 24 = 87.50 -> 88
    expect(r.score.value).toBe(88);
    expect(r.score.sentence).toBe("22 of 24 pads will sound (17 as recorded, 5 through stand-ins); 2 stay silent, all on slots the kit leaves empty; 1 misses some velocities.");
  });

  it("grid-2x8", () => {
    const r = auditTemplate("grid-2x8");
    const silent = r.pads.filter((p) => p.outcome === "silent").map((p) => p.label);
    expect(silent).toEqual(["Crash 2", "Splash"]);
    expect(r.pads.filter((p) => p.outcome === "stand-in")).toEqual([]);
    expect(r.summary).toMatchObject({ pads: 16, direct: 14, standIn: 0, silent: 2, conflicts: 0 });
    expect(r.score.value).toBe(88); // 14/16 * 100 = 87.5, rounded half up
    expect(r.score.sentence).toBe("14 of 16 pads will sound as recorded; 2 stay silent, all on slots the kit leaves empty.");
    expect(hasSilentPads(r)).toBe(true);
  });

  it("trigger-five with its hi-hat pedal", () => {
    const r = auditTemplate("trigger-five");
    expect(brief(r, "padId")).toEqual([
      ["kick", "direct", "centre"], ["snare-head", "direct", "centre"], ["snare-rim", "direct", "rim-shot"],
      ["tom1-head", "direct", "centre"], ["tom1-rim", "direct", "rim-shot"], ["tom2-head", "direct", "centre"], ["tom2-rim", "stand-in", "centre"],
      ["tom3-head", "direct", "centre"], ["tom3-rim", "stand-in", "centre"], ["hat-bow", "direct", "closed"], ["hat-edge", "stand-in", "closed"],
      ["crash-edge", "direct", "crash-hit"], ["crash-bow", "stand-in", "crash-hit"], ["ride-bow", "direct", "bow"], ["ride-bell", "direct", "bell"], ["ride-edge", "stand-in", "bow"],
    ]);
    expect(r.pads.find((p) => p.padId === "ride-edge")!.standIn).toEqual({ path: ["edge", "bow"], cost: 1.5, source: "graph", edges: [{ from: "edge", to: "bow", cost: 1.5, owner: "built-in" }] });
    expect(r.pedal!.zones.map((z) => [z.low, z.high, z.requested, z.recorded, z.plays, z.standIn?.cost ?? 0])).toEqual([
      [0, 31, "open", true, "open", 0],
      [32, 63, "half-open", false, "open", 1.5],
      [64, 95, "quarter-open", false, "closed", 1],
      [96, 127, "closed", true, "closed", 0],
    ]);
    expect(r.pedal!.uncovered).toEqual([]);
    expect(r.pedal!.chick).toMatchObject({ note: 44, outcome: "direct", plays: "pedal" });
    expect(r.conflicts).toEqual([]);
    expect(r.summary).toMatchObject({ pads: 16, direct: 11, standIn: 5, silent: 0, pedalZones: 4, pedalZonesRecorded: 2 });
    // (14 + 0.8 + 0.8 + 0.9 + 0.9 + 0.85 + 0.85 + 0.9) / 21 * 100 = 95.238... -> 95
    expect(r.score.value).toBe(95);
    expect(r.score.sentence).toBe("All 21 pads and pedal positions will sound (14 as recorded, 7 through stand-ins).");
    expect(hasSilentPads(r)).toBe(false);
  });

  it("gm-percussion", () => {
    const r = auditTemplate("gm-percussion");
    const direct = [35, 36, 37, 38, 42, 44, 46, 47, 48, 49, 50, 51, 52, 53, 56, 63];
    const standIn = [62];
    for (const p of r.pads) {
      const expected = direct.includes(p.note) ? "direct" : standIn.includes(p.note) ? "stand-in" : "silent";
      expect(p.outcome, `note ${p.note} ${p.label}`).toBe(expected);
    }
    const byNote = (n: number) => r.pads.find((p) => p.note === n)!;
    expect(byNote(50).instrumentId).toBe("tom-10"); // High Tom gets the highest-pitched tom
    expect(byNote(47).instrumentId).toBe("tom-16");
    expect(byNote(62)).toMatchObject({ plays: "open-tone", standIn: { path: ["mute", "open-tone"], cost: 1.5 } });
    expect(r.summary).toMatchObject({ pads: 47, direct: 16, standIn: 1, silent: 30 });
  });
});

describe("slots holding other instruments (common practice, no published source)", () => {
  const layout = getTemplate("grid-2x8")!;
  it("a crash placed in the ride slot answers both bell and bow pads with its crash hit", () => {
    const kit = buildDefaultKit(layout, cat);
    const ride = kit.slots.find((s) => s.id === "ride-1")!;
    ride.instrumentId = "crash-18";
    const r = runAudit(layout, kit, cat);
    const bow = r.pads.find((p) => p.label === "Ride bow")!;
    const bell = r.pads.find((p) => p.label === "Ride bell")!;
    expect(bow).toMatchObject({ outcome: "stand-in", plays: "crash-hit", family: "crash", standIn: { path: ["bow", "crash-hit"], cost: 1 } });
    expect(bell).toMatchObject({ outcome: "stand-in", plays: "crash-hit", family: "crash", standIn: { path: ["bell", "bow", "crash-hit"], cost: 3 } });
    expect(bow.notes[0]).toMatch(/expects ride and holds a crash/);
  });

  it("a china with no bell answers both ride pads with its hit", () => {
    const kit = buildDefaultKit(layout, cat);
    kit.slots.find((s) => s.id === "ride-1")!.instrumentId = "china-18";
    const r = runAudit(layout, kit, cat);
    for (const label of ["Ride bow", "Ride bell"]) expect(r.pads.find((p) => p.label === label)).toMatchObject({ outcome: "stand-in", plays: "crash-hit" });
  });

  it("a hand drum in the snare slot uses its own articulations, never a snare's", () => {
    const kit = buildDefaultKit(layout, cat);
    kit.slots.find((s) => s.id === "snare")!.instrumentId = "conga-11";
    const r = runAudit(layout, kit, cat);
    const snare = r.pads.find((p) => p.label === "Snare")!;
    // centre is in the hand-drum graph: open-tone is 1.5 away
    expect(snare).toMatchObject({ outcome: "stand-in", plays: "open-tone", family: "hand-drum", instrumentId: "conga-11" });
  });

  it("a kit override per slot wins over the graph", () => {
    const kit = buildDefaultKit(getTemplate("grid-24")!, cat);
    kit.slots.find((s) => s.id === "snare")!.standIns = { "half-edge": "edge" };
    const r = runAudit(getTemplate("grid-24")!, kit, cat);
    expect(r.pads.find((p) => p.label === "Snare half-edge")).toMatchObject({ plays: "edge", standIn: { path: ["half-edge", "edge"], source: "override" } });
  });
});

describe("conflicts", () => {
  const kit: Kit = {
    id: "k",
    name: "Test kit",
    slots: [
      { id: "snare", name: "Snare A", family: "snare", instrumentId: "snare-14" },
      { id: "kick", name: "Kick", family: "kick", instrumentId: "kick-22" },
      { id: "empty", name: "Tom 9", family: "tom", instrumentId: null },
      { id: "ghost", name: "Ghost", family: "tom", instrumentId: "no-such-instrument" },
    ],
  };
  const layout: Layout = {
    id: "c",
    name: "Conflicting",
    surface: { kind: "grid", rows: 2, cols: 4 },
    hiHatPedal: null,
    pads: [
      { id: "a", label: "Snare", row: 1, col: 1, note: 38, channel: 10, target: { slotId: "snare", articulation: "centre" } },
      { id: "b", label: "Snare too", row: 1, col: 2, note: 38, channel: 10, target: { slotId: "snare", articulation: "centre" } },
      { id: "c", label: "Kick on 38", row: 1, col: 3, note: 38, channel: 10, target: { slotId: "kick", articulation: "centre" } },
      { id: "d", label: "Kick on 38 ch 11", row: 1, col: 4, note: 38, channel: 11, target: { slotId: "kick", articulation: "centre" } },
      { id: "e", label: "Too high", row: 2, col: 1, note: 128, channel: 10, target: { slotId: "kick", articulation: "centre" } },
      { id: "f", label: "Channel 0", row: 2, col: 2, note: 40, channel: 0, target: { slotId: "kick", articulation: "centre" } },
      { id: "g", label: "Empty", row: 2, col: 3, note: 41, channel: 10, target: { slotId: "empty", articulation: "centre" } },
      { id: "h", label: "Unknown", row: 2, col: 4, note: 42, channel: 10, target: { slotId: "nowhere", articulation: "centre" } },
      { id: "i", label: "Ghost", row: 3, col: 1, note: 43, channel: 10, target: { slotId: "ghost", articulation: "centre" } },
      { id: "j", label: "Unassigned", row: 1, col: 1, note: 44, channel: 17, target: null },
    ],
  };

  it("lists every conflict, conflicts first, in a fixed order", () => {
    const r = runAudit(layout, kit, cat);
    expect(Object.keys(r)[4]).toBe("conflicts");
    expect(r.conflicts.map((c) => [c.kind, c.padIds])).toEqual([
      ["note-shared", ["a", "b", "c"]], // one note+channel, two targets (pads a and b share a target: fine alone)
      ["note-out-of-range", ["e"]],
      ["channel-out-of-range", ["f"]],
      ["channel-out-of-range", ["j"]],
      ["unknown-slot", ["h"]],
      ["unknown-instrument", ["i"]],
      ["no-target", ["j"]],
      ["outside-grid", ["i"]],
    ]);
    expect(r.pads.map((p) => p.outcome)).toEqual(["direct", "direct", "direct", "direct", "direct", "direct", "silent", "silent", "silent", "silent"]);
    expect(r.pads.find((p) => p.padId === "h")!.reason).toBe('no slot "nowhere" in kit "Test kit"');
    // the empty slot is reported once, apart from the conflicts
    expect(r.emptySlots).toEqual([{ slotId: "empty", slotName: "Tom 9", padIds: ["g"], labels: ["Empty"] }]);
    // pads a, b, c share note 38 for two sounds, e and f cannot be sent: they count 0, like the 4 silent pads;
    // only d (kick centre, 4 even layers, no gap) plays: 100 * 1 / 10 = 10
    expect(r.score).toMatchObject({ value: 10, items: 10, sounding: 1, noteClashes: 5 });
  });

  it("two pads on one note and one target are not a conflict; a chick note clashing with a pad is", () => {
    const ok = runAudit({ ...layout, pads: layout.pads.slice(0, 2) }, kit, cat);
    expect(ok.conflicts).toEqual([]);
    const withPedal: Layout = {
      ...layout,
      pads: layout.pads.slice(0, 1),
      hiHatPedal: { controller: 4, channel: 10, slotId: "kick", closedAt: "low", chickNote: 38, zones: [{ low: 0, high: 70, articulation: "centre" }, { low: 60, high: 100, articulation: "centre" }] },
    };
    const r = runAudit(withPedal, kit, cat);
    expect(r.conflicts.map((c) => c.kind)).toEqual(["note-shared", "pedal-zone-overlap"]);
    expect(r.pedal!.uncovered).toEqual([{ low: 101, high: 127 }]);
  });
});

describe("helpers", () => {
  it("uncoveredRanges finds the velocities no layer covers", () => {
    expect(uncoveredRanges([{ low: 1, high: 40 }, { low: 50, high: 126 }], 1, 127)).toEqual([{ low: 41, high: 49 }, { low: 127, high: 127 }]);
    expect(uncoveredRanges([], 1, 127)).toEqual([{ low: 1, high: 127 }]);
  });
  it("itemScore follows the stated formula", () => {
    expect(itemScore({ outcome: "direct", standIn: null, velocityGaps: [] })).toBe(1);
    expect(itemScore({ outcome: "stand-in", standIn: { path: [], cost: 3, source: "graph", edges: [] }, velocityGaps: [] })).toBeCloseTo(0.7, 12);
    expect(itemScore({ outcome: "stand-in", standIn: { path: [], cost: 9, source: "graph", edges: [] }, velocityGaps: [] })).toBe(0.5);
    expect(itemScore({ outcome: "direct", standIn: null, velocityGaps: [{ low: 1, high: 27 }] })).toBeCloseTo(100 / 127, 12);
  });
});
