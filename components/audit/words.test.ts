// The audit in a drummer's words. Stroke names are the trade's own (common practice, no published source).
import { describe, expect, it } from "vitest";
import { runAudit } from "@/lib/audit/audit";
import { buildDefaultKit } from "@/lib/audit/kits";
import { getTemplate } from "@/lib/audit/templates";
import { testCatalogue } from "@/lib/audit/test-catalogue";
import { gapsInWords, listInWords, playDetail, playsInWords, strokeName } from "./words";

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
    expect(playDetail(pad("Hat half-open"))).toBe("Asked for the half-open hat of “Hi-hat”: it is not recorded; the open hat is 1.5 steps away in the hi-hat's closeness weights. Played on “Hi-hat 14”, 3 velocity layers, at least 2 round robins each; counts 85 % in the score.");
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
