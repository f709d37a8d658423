// The demo studio's audits as they will read. The demo seed (db/seed-demo-kits.ts) builds the kit "Harbour Lane
// Session" with buildDefaultKit from the General MIDI slot plan and the studio's catalogue, and audits the
// layouts "General MIDI percussion map" and "Five-piece trigger kit" against it. Here the same chain runs
// without a server: every file of the demo scenario (lib/synth/scenario.ts, our own invented session) is
// rendered by our synthesizer, measured by lib/audio, catalogued by lib/catalogue (default DLS velocity curve,
// as a new library has), read by the one converter the server uses, then audited.
// The expected scores follow the documented formula (SCHEMA.md "Score") over the findings listed here; the
// stand-in distances are common practice of drum libraries, no published source.
import crypto from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import { demoScenario } from "../synth/scenario";
import { renderScenarioFile } from "../synth/render";
import { measureWav } from "../audio";
import { catalogueSamples, type CatalogueSampleInput } from "../catalogue/catalogue";
import { readCatalogue } from "./catalogue-input";
import { buildDefaultKit } from "./kits";
import { getTemplate } from "./templates";
import { runAudit } from "./audit";
import type { AuditResult } from "./types";

let gm: AuditResult;
let five: AuditResult;

beforeAll(() => {
  const samples: CatalogueSampleInput[] = [];
  for (const f of demoScenario()) {
    const bytes = renderScenarioFile(f);
    const r = measureWav(bytes);
    if (!r.ok) continue; // a refused file never reaches the catalogue
    samples.push({ id: f.path, path: f.path, sha256: crypto.createHash("sha256").update(bytes).digest("hex"), measurement: r.measurement });
  }
  const { instruments } = readCatalogue(catalogueSamples(samples));
  const kit = buildDefaultKit(getTemplate("gm-percussion")!, instruments, "Harbour Lane Session");
  gm = runAudit(getTemplate("gm-percussion")!, kit, instruments);
  five = runAudit(getTemplate("trigger-five")!, kit, instruments);
}, 300_000);

describe("the demo audits", () => {
  it("General MIDI percussion map against the session kit: 34/100, the empty slots told once", () => {
    // the session kit records kick, two snares, three toms, hi-hat (with pedal), crash, ride, china and cowbell:
    // 16 of the 47 General MIDI notes find their sound as recorded, across 1-127
    const direct = gm.pads.filter((p) => p.outcome === "direct").map((p) => p.note);
    expect(direct).toEqual([35, 36, 37, 38, 40, 42, 44, 46, 47, 48, 49, 50, 51, 52, 53, 56]);
    expect(gm.pads.filter((p) => p.outcome === "stand-in")).toEqual([]);
    expect(gm.pads.filter((p) => p.outcome === "direct" && p.velocityGaps.length)).toEqual([]);
    // the other 31 pads aim at 28 slots the kit leaves empty (three slots take two notes each); none is a conflict
    expect(gm.conflicts).toEqual([]);
    expect(gm.emptySlots).toHaveLength(28);
    expect(gm.emptySlots.reduce((s, g) => s + g.padIds.length, 0)).toBe(31);
    expect(gm.emptySlots.filter((g) => g.padIds.length === 2).map((g) => g.slotName)).toEqual(["Conga high", "Cuica", "Triangle"]);
    // 100 × 16 / 47 = 34.04 → 34
    expect(gm.score.value).toBe(Math.round((100 * 16) / 47));
    expect(gm.score.value).toBe(34);
    expect(gm.score.sentence).toBe("16 of 47 pads will sound as recorded; 31 stay silent, all on slots the kit leaves empty.");
  });

  it("Five-piece trigger kit against the session kit: 98/100, three stand-ins", () => {
    const standIns = five.pads.filter((p) => p.outcome === "stand-in").map((p) => [p.label, p.requested, p.plays, p.standIn!.cost]);
    // hi-hat shank → closed 1, cymbal bow → crash hit 1, ride edge → bow 1.5 (SCHEMA.md "Fallback" weights)
    expect(standIns).toEqual([["Hat edge", "shank", "closed", 1], ["Crash bow", "bow", "crash-hit", 1], ["Ride edge", "edge", "bow", 1.5]]);
    expect(five.pedal!.zones.map((z) => z.outcome)).toEqual(["direct", "direct", "direct", "direct"]);
    expect(five.pedal!.chick!.outcome).toBe("direct");
    expect(five.conflicts).toEqual([]);
    expect(five.emptySlots).toEqual([]);
    // 21 items: 18 as recorded, stand-ins 0.9, 0.9 and 0.85: 100 × 20.65 / 21 = 98.33 → 98
    expect(five.score.value).toBe(Math.round((100 * (18 + 0.9 + 0.9 + 0.85)) / 21));
    expect(five.score.value).toBe(98);
    expect(five.score.sentence).toBe("All 21 pads and pedal positions will sound (18 as recorded, 3 through stand-ins).");
  });
});
