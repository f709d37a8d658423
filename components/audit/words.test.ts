// The audit in a drummer's words. Stroke names are the trade's own (common practice, no published source).
import { describe, expect, it } from "vitest";
import { runAudit } from "@/lib/audit/audit";
import { buildDefaultKit } from "@/lib/audit/kits";
import { getTemplate } from "@/lib/audit/templates";
import { testCatalogue } from "@/lib/audit/test-catalogue";
import { edgesInWords, gapsInWords, listInWords, playDetail, playsInWords, strokeName } from "./words";

const cat = testCatalogue();
const layout = getTemplate("grid-24")!;
const r = runAudit(layout, buildDefaultKit(layout, cat), cat);
const pad = (label: string) => r.pads.find((p) => p.label === label)!;

describe("findings in words", () => {
  it("names strokes as drummers do", () => {
    expect(strokeName("hi-hat", "closed")).toBe("closed hat");
    expect(strokeName("hi-hat", "half-open")).toBe("half-open hat");
    expect(strokeName("hi-hat", "pedal")).toBe("foot chick");
    expect(strokeName("ride", "bell")).toBe("ride bell");
    expect(strokeName("snare", "rim-shot")).toBe("rim shot");
    expect(strokeName("tom", "centre")).toBe("centre hit");
  });
  it("says what a pad plays, never a cost or a path", () => {
    expect(playsInWords(pad("Hat half-open"))).toBe("Plays the open hat instead — the nearest recorded stroke");
    expect(playsInWords(pad("Snare"))).toBe("Plays the centre hit as recorded");
    expect(playsInWords(pad("Splash"))).toBe("Silent — the kit leaves “Splash” empty");
    for (const p of r.pads) expect(playsInWords(p)).not.toMatch(/cost|path|→|->/);
  });
  it("keeps the detail for the tooltip: the steps and what the pad counts in the score", () => {
    // half-open → open is 1.5 steps: weight 1 − 0.15 = 0.85, all velocities covered
    expect(playDetail(pad("Hat half-open"))).toBe("Asked for the half-open hat of “Hi-hat”: it is not recorded; the open hat is 1.5 steps away in the hi-hat's closeness weights (via the built-in edge half open–open). Played on “Hi-hat 14”, 3 velocity layers, at least 2 round robins each; counts 85 % in the score.");
    // the snare edge covers 108 of 127 velocities: 85 %
    expect(playDetail(pad("Snare edge"))).toContain("counts 85 % in the score (some velocities find no layer)");
    expect(gapsInWords(pad("Snare edge"))).toBe("61–79");
    expect(gapsInWords({ velocityGaps: [{ low: 1, high: 9 }, { low: 127, high: 127 }] })).toBe("1–9 and 127");
  });
  it("lists names in running text", () => {
    expect(listInWords(["a", "b", "c"])).toBe("a, b and c");
    expect(listInWords(["a", "b", "c", "d"], 2)).toBe("a, b and 2 more");
  });
});

describe("stand-ins say which edges they used and whose", () => {
  const studio = [{ id: "tight", name: "tight", families: ["hi-hat" as const], words: ["tight"], neighbours: [{ to: "closed", cost: 0.5 }] }];
  const hats = [{ id: "hh", name: "Hats", family: "hi-hat" as const, articulations: [{ articulation: "quarter-open", layers: [{ index: 0, velocityLow: 1, velocityHigh: 127, meanStrikeLufs: -20, sampleIds: ["a"] }] }] }];
  const layout = { id: "l", name: "L", surface: { kind: "zones" as const }, hiHatPedal: null, pads: [{ id: "p", label: "Tight", note: 42, channel: 10, target: { slotId: "hh", articulation: "tight" } }] };
  const kit = { id: "k", name: "K", slots: [{ id: "hh", name: "Hats", family: "hi-hat" as const, instrumentId: "hh" }] };

  it("names the studio's edge and the built-in one on the way", () => {
    const f = runAudit(layout, kit, hats, { strokes: studio }).pads[0]!;
    expect(edgesInWords(f)).toBe(" (via the studio’s edge tight–closed and the built-in closed–quarter open)");
    expect(playsInWords(f)).toBe("Plays the quarter-open hat instead — the nearest recorded stroke (by the studio’s own closeness)");
    expect(playDetail(f)).toContain("1.5 steps away in the hi-hat's closeness weights (via the studio’s edge tight–closed");
  });
});
