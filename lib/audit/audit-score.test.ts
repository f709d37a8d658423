// The score of an audit (SCHEMA.md "Score"): the share of what a layout asks for that will really play,
// weighted by how well. Expected values are worked out by hand from the documented formula:
//   score = round(100 × Σ wᵢ·cᵢ·kᵢ / N), w = 1 recorded, max(½, 1 − d/10) stand-in d steps away, 0 silent,
//   c = covered velocities / 127, k = 0 on a note clash.
// The General MIDI Level 1 percussion key map (MMA, GM 1 specification, channel 10, notes 35-81) gives the
// 47 pads; the closeness steps (closed hat → pedal 2, ride bell → bow 2) are common practice of drum libraries,
// no published source (SCHEMA.md "Fallback").
import { describe, expect, it } from "vitest";
import { runAudit } from "./audit";
import { currentAuditResult } from "./audit-version";
import { AUDIT_SCHEMA, parseAuditJson } from "./export";
import { getTemplate } from "./templates";
import { buildDefaultKit } from "./kits";
import { instrument, testCatalogue } from "./test-catalogue";
import type { CatalogueInstrument, Kit, Layout } from "./types";

describe("an empty slot", () => {
  const cat = testCatalogue();
  const kit: Kit = {
    id: "k",
    name: "Half kit",
    slots: [
      { id: "kick", name: "Kick", family: "kick", instrumentId: "kick-22" },
      { id: "hi-hat", name: "Hi-hat", family: "hi-hat", instrumentId: null },
    ],
  };
  const layout: Layout = {
    id: "l",
    name: "Strip",
    surface: { kind: "grid", rows: 1, cols: 3 },
    pads: [
      { id: "p1", label: "Kick", row: 1, col: 1, note: 36, channel: 10, target: { slotId: "kick", articulation: "centre" } },
      { id: "p2", label: "Hat", row: 1, col: 2, note: 42, channel: 10, target: { slotId: "hi-hat", articulation: "closed" } },
      { id: "p3", label: "Hat open", row: 1, col: 3, note: 46, channel: 10, target: { slotId: "hi-hat", articulation: "open" } },
    ],
    hiHatPedal: { controller: 4, channel: 10, slotId: "hi-hat", closedAt: "high", chickNote: 44, zones: [{ low: 0, high: 63, articulation: "open" }, { low: 64, high: 127, articulation: "closed" }] },
  };
  const r = runAudit(layout, kit, cat);

  it("is reported once, with every pad, pedal zone and chick note that aims at it, and is not a conflict", () => {
    expect(r.conflicts).toEqual([]);
    expect(r.summary.conflicts).toBe(0);
    expect(r.emptySlots).toEqual([
      { slotId: "hi-hat", slotName: "Hi-hat", padIds: ["p2", "p3", "pedal-zone-1", "pedal-zone-2", "pedal-chick"], labels: ["Hat", "Hat open", "pedal 0-63 (open)", "pedal 64-127 (closed)", "Hi-hat pedal chick"] },
    ]);
  });

  it("counts once in the score: as a silent item, with no further penalty", () => {
    // 6 items (3 pads, 2 pedal zones, the chick note); only the kick plays, as recorded, 1-127 covered:
    // 100 × 1 / 6 = 16.67 → 17
    expect(r.score).toMatchObject({ value: 17, outOf: 100, items: 6, sounding: 1, noteClashes: 0, withGaps: 0 });
    expect(r.score.sentence).toBe("1 of 6 pads and pedal positions will sound as recorded; 5 stay silent, all on slots the kit leaves empty.");
  });
});

describe("the General MIDI percussion map against a small kit", () => {
  // four instruments; the kit has every slot the map aims at, four of them filled
  const small: CatalogueInstrument[] = [
    instrument("k", "Kick 20", "kick", [["centre", 2, 2]]),
    instrument("s", "Snare 14", "snare", [["centre", 1, 3]]),
    instrument("h", "Hat 14", "hi-hat", [["closed", 1, 2], ["open", 1, 2]]),
    instrument("r", "Ride 20", "ride", [["bow", 1, 2]]),
  ];
  // the snare's cross-stick covers 1-100 only: 27 velocities (101-127) find no layer
  small[1]!.articulations.push({
    articulation: "cross-stick",
    mic: null,
    layers: [
      { index: 0, velocityLow: 1, velocityHigh: 40, meanStrikeLufs: -30, sampleIds: ["x1"] },
      { index: 1, velocityLow: 41, velocityHigh: 100, meanStrikeLufs: -22, sampleIds: ["x2"] },
    ],
  });
  const layout = getTemplate("gm-percussion")!;
  const fill: Record<string, string> = { kick: "k", snare: "s", "hi-hat": "h", "ride-1": "r" };
  const kit: Kit = { id: "small", name: "Small kit", slots: layout.slots!.map((s) => ({ ...s, instrumentId: fill[s.id] ?? null })) };
  const r = runAudit(layout, kit, small);

  it("plays 9 of 47 pads, the rest silent on empty slots, each empty slot told once", () => {
    const sounding = r.pads.filter((p) => p.outcome !== "silent").map((p) => [p.note, p.outcome, p.plays]);
    expect(sounding).toEqual([
      [35, "direct", "centre"], [36, "direct", "centre"], [37, "direct", "cross-stick"], [38, "direct", "centre"],
      [42, "direct", "closed"], [44, "stand-in", "closed"], [46, "direct", "open"], [51, "direct", "bow"], [53, "stand-in", "bow"],
    ]);
    expect(r.conflicts).toEqual([]);
    // the map aims at 39 slots; 35 are empty, and 38 pads aim at them (conga high, cuica and triangle take two each)
    expect(r.emptySlots).toHaveLength(35);
    expect(r.emptySlots.reduce((s, g) => s + g.padIds.length, 0)).toBe(38);
    expect(r.emptySlots.find((g) => g.slotId === "conga-high")!.labels).toEqual(["Mute Hi Conga", "Open Hi Conga"]);
    expect(new Set(r.emptySlots.flatMap((g) => g.padIds)).size).toBe(38);
  });

  it("scores the share that plays, weighted as documented", () => {
    // 7 recorded pads, of which the cross-stick covers 100/127 of the velocities; two stand-ins 2 steps away
    // (pedal → closed, bell → bow), each 1 − 0.2 = 0.8; 38 silent pads count 0; no note clash.
    const sum = 6 + 100 / 127 + 0.8 + 0.8;
    const expected = Math.round((100 * sum) / 47); // 17.85 → 18
    expect(expected).toBe(18);
    expect(r.score.value).toBe(expected);
    expect(r.score.itemSum).toBeCloseTo(sum, 6);
    expect(r.score).toMatchObject({ items: 47, sounding: 9, withGaps: 1 });
    expect(r.score.sentence).toBe("9 of 47 pads will sound (7 as recorded, 2 through stand-ins); 38 stay silent, all on slots the kit leaves empty; 1 misses some velocities.");
  });
});

describe("audits of the earlier version (kitwright.audit/v1)", () => {
  const cat = testCatalogue();
  const layout = getTemplate("grid-24")!;
  const now = runAudit(layout, buildDefaultKit(layout, cat), cat);
  // the same audit as version 1 wrote it: the empty slots also as conflicts, 5 points off per conflict
  const { emptySlots: _e, ...rest } = structuredClone(now);
  const v1 = {
    ...rest,
    conflicts: [
      { kind: "empty-slot", message: 'slot "Splash" is empty', padIds: ["r1c5"], note: null, channel: null },
      { kind: "empty-slot", message: 'slot "Crash 2" is empty', padIds: ["r1c6"], note: null, channel: null },
    ],
    summary: { ...now.summary, conflicts: 2 },
    score: { value: 77.5, formula: "score = clamp(100 * sum(item) / items - 5 * conflicts, 0, 100)", items: 24, itemSum: 21.000394, conflictPenalty: 10 },
  };

  it("read back in today's shape: empty slots grouped, the score computed again from the findings", () => {
    expect(currentAuditResult(v1)).toEqual(now);
    expect(parseAuditJson({ schema: "kitwright.audit/v1", ...v1 })).toEqual(now);
    expect(AUDIT_SCHEMA).toBe("kitwright.audit/v3");
  });

  it("a result of today's shape is read as it is", () => {
    expect(currentAuditResult(now)).toBe(now);
    expect(() => currentAuditResult({ score: {} })).toThrow(/pads and conflicts/);
  });
});
