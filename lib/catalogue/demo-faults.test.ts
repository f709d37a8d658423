// The demo library's deliberate faults (lib/synth/scenario.ts DEMO_FAULTS) must each be found by the
// library health checks, and nothing else may be flagged as an error. The files are rendered by our own
// synthesizer and measured by lib/audio, as the server does. Only the instruments that carry a fault are
// rendered (with their whole groups, so layers and round robins are judged in context).
import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { DEMO_FAULTS, demoScenario } from "../synth/scenario";
import { renderScenarioFile } from "../synth/render";
import { measureWav } from "../audio";
import { catalogueSamples, type CatalogueSampleInput } from "./catalogue";
import type { HealthCode } from "./health";

const EXPECTED: Record<(typeof DEMO_FAULTS)[number]["kind"], HealthCode> = {
  clipped: "clipping",
  "late-onset": "late-onset",
  "cut-tail": "cut-tail",
  mislabelled: "name-sound-conflict",
  duplicate: "duplicate",
  "missing-layer": "missing-layer",
  "sample-rate": "mixed-sample-rate",
};

describe("the demo library's planted faults", () => {
  it("are each found by the health checks, on the file they were planted in", () => {
    const folders = new Set(DEMO_FAULTS.map((f) => f.path.split("/").slice(0, -1).join("/")));
    const files = demoScenario().filter((f) => folders.has(f.path.split("/").slice(0, -1).join("/")));
    const samples: CatalogueSampleInput[] = [];
    for (const f of files) {
      const bytes = renderScenarioFile(f);
      const r = measureWav(bytes);
      if (!r.ok) throw new Error(`${f.path}: ${r.reason}`);
      samples.push({ id: f.path, path: f.path, sha256: crypto.createHash("sha256").update(bytes).digest("hex"), measurement: r.measurement });
    }
    const cat = catalogueSamples(samples);
    for (const fault of DEMO_FAULTS) {
      const code = EXPECTED[fault.kind];
      const hits = cat.health.filter((h) => h.code === code);
      const where = fault.kind === "missing-layer" ? (fault.related ?? []) : [fault.path];
      expect(hits.some((h) => where.some((p) => h.sampleIds.includes(p))), `${fault.kind} (${code}) on ${fault.path}`).toBe(true);
    }
    const conflicts = cat.health.filter((h) => h.code === "name-sound-conflict").flatMap((h) => h.sampleIds);
    expect(conflicts).toEqual([DEMO_FAULTS.find((f) => f.kind === "mislabelled")!.path]);
    const errors = cat.health.filter((h) => h.severity === "error").flatMap((h) => h.sampleIds);
    expect(new Set(errors)).toEqual(new Set([DEMO_FAULTS.find((f) => f.kind === "clipped")!.path]));
    // every take ends with the synthesizer's 30 ms fade into its noise floor: only the planted one is cut
    const cuts = cat.health.filter((h) => h.code === "cut-tail").flatMap((h) => h.sampleIds);
    expect(cuts).toEqual([DEMO_FAULTS.find((f) => f.kind === "cut-tail")!.path]);
  }, 180_000);

  it("leave the rest of the library without a cut tail (the folders that carry no fault)", () => {
    const folders = new Set(DEMO_FAULTS.map((f) => f.path.split("/").slice(0, -1).join("/")));
    const files = demoScenario().filter((f) => !folders.has(f.path.split("/").slice(0, -1).join("/")));
    expect(files.length).toBeGreaterThan(40);
    const cut: string[] = [];
    for (const f of files) {
      const r = measureWav(renderScenarioFile(f));
      if (!r.ok) throw new Error(`${f.path}: ${r.reason}`);
      if (r.measurement.tail === "cut") cut.push(f.path);
    }
    expect(cut).toEqual([]);
  }, 180_000);
});
