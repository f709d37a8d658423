import { describe, expect, it } from "vitest";
import { FAMILY_ARTICULATIONS, isArticulation } from "../catalogue/taxonomy";
import { renderScenarioChannels, renderScenarioFile } from "./render";
import { DEMO_FAULTS, DEMO_INSTRUMENTS, DEMO_LIBRARY, demoScenario, dynamics, layerVelocity, type ScenarioFile } from "./scenario";
import { rmsDb } from "./test-helpers";

const files = demoScenario();
const byPath = new Map(files.map((f) => [f.path, f]));
const get = (p: string): ScenarioFile => {
  const f = byPath.get(p);
  if (!f) throw new Error(`missing ${p}`);
  return f;
};
const fault = (k: string) => {
  const f = DEMO_FAULTS.find((x) => x.kind === k);
  if (!f) throw new Error(`no ${k} fault`);
  return f;
};

describe("demo scenario", () => {
  it("is a modest library of unique paths, 48 kHz 24-bit, mostly stereo", () => {
    expect(files.length).toBeGreaterThanOrEqual(150);
    expect(files.length).toBeLessThanOrEqual(300);
    expect(new Set(files.map((f) => f.path)).size).toBe(files.length);
    expect(files.filter((f) => f.sampleRate !== 48000).length).toBe(1);
    expect(files.every((f) => f.bits === 24)).toBe(true);
    const mono = files.filter((f) => f.channels === 1).length;
    expect(mono).toBeGreaterThan(0);
    expect(mono).toBeLessThan(files.length / 4);
    expect(DEMO_LIBRARY.studio).toBe("Harbour Lane Studio");
  });

  it("covers every instrument with recorded articulations from the taxonomy (common practice of drum libraries)", () => {
    for (const inst of DEMO_INSTRUMENTS) expect(files.some((f) => f.truth.instrumentId === inst.id)).toBe(true);
    for (const f of files) {
      expect(isArticulation(f.truth.articulation)).toBe(true);
      expect(FAMILY_ARTICULATIONS[f.truth.family]).toContain(f.truth.articulation);
    }
    const hat = new Set(files.filter((f) => f.truth.instrumentId === "hihat14").map((f) => f.truth.articulation));
    expect([...hat].sort()).toEqual(["closed", "foot-splash", "half-open", "open", "pedal", "quarter-open"]);
    const ride = new Set(files.filter((f) => f.truth.instrumentId === "ride21").map((f) => f.truth.articulation));
    expect(ride.has("bow") && ride.has("bell")).toBe(true);
    expect(new Set(files.map((f) => f.mic))).toEqual(new Set(["close", "overhead", "room"]));
  });

  it("has 3-6 layers with 2-4 round robins per group (common practice: 3-8 layers, 2-8 round robins)", () => {
    const groups = new Map<string, ScenarioFile[]>();
    for (const f of files) {
      if (f.path === fault("mislabelled").path || f.duplicateOf) continue;
      const k = `${f.truth.instrumentId}|${f.truth.articulation}|${f.mic}`;
      groups.set(k, [...(groups.get(k) ?? []), f]);
    }
    for (const [k, g] of groups) {
      const layers = new Set(g.map((f) => f.truth.layer));
      const count = g[0].truth.layerCount;
      expect(count, k).toBeGreaterThanOrEqual(2);
      expect(count, k).toBeLessThanOrEqual(6);
      for (const l of layers) {
        const rr = g.filter((f) => f.truth.layer === l).length;
        expect(rr, k).toBeGreaterThanOrEqual(2);
        expect(rr, k).toBeLessThanOrEqual(4);
      }
    }
    expect(groups.size).toBeGreaterThan(20);
  });

  it("layer strengths rise monotonically over about 30 dB of the level law (DLS-style square-law curve is 40 log10)", () => {
    for (const n of [2, 3, 4, 5, 6]) {
      const v = Array.from({ length: n }, (_, i) => layerVelocity(i + 1, n));
      for (let i = 1; i < n; i++) expect(v[i]).toBeGreaterThan(v[i - 1]);
      expect(v[n - 1]).toBe(127);
      expect(v[0]).toBeGreaterThanOrEqual(1);
      expect(dynamics(n)).toHaveLength(n);
    }
  });

  it("lists every deliberate fault, each present in the scenario as described", () => {
    const kinds = DEMO_FAULTS.map((f) => f.kind).sort();
    expect(kinds).toEqual(["clipped", "cut-tail", "duplicate", "late-onset", "mislabelled", "missing-layer", "sample-rate"]);
    for (const f of DEMO_FAULTS) {
      if (f.kind === "missing-layer") {
        expect(byPath.has(f.path)).toBe(false);
        for (const r of f.related ?? []) expect(byPath.has(r)).toBe(true);
        const g = files.filter((x) => x.truth.instrumentId === "snare-brass14" && x.truth.articulation === "rim-shot");
        expect([...new Set(g.map((x) => x.truth.layer))].sort()).toEqual([1, 2, 4]);
      } else {
        expect(byPath.has(f.path)).toBe(true);
      }
    }
    expect(get(fault("sample-rate").path).sampleRate).toBe(44100);
    const mis = get(fault("mislabelled").path);
    expect(mis.path.toLowerCase()).toContain("snare");
    expect(mis.truth.family).toBe("ride");
    expect(mis.sound.family).toBe("ride");
  });

  it("renders the faults: hard clipping, ~120 ms late onset, a tail cut while ringing, a byte-identical duplicate", () => {
    const clipped = renderScenarioChannels(get(fault("clipped").path))[0];
    let run = 0, longest = 0;
    for (const v of clipped) {
      run = Math.abs(v) >= 1 ? run + 1 : 0;
      longest = Math.max(longest, run);
    }
    expect(longest).toBeGreaterThanOrEqual(3); // "runs of >= 3 consecutive full-scale samples" (lib/audio contract)

    const lateFile = get(fault("late-onset").path);
    const late = renderScenarioChannels(lateFile)[0];
    expect(rmsDb(late, 0, Math.round(0.11 * 48000))).toBeLessThan(-70);
    expect(rmsDb(late, Math.round(0.12 * 48000), Math.round(0.15 * 48000))).toBeGreaterThan(-50);

    const cut = renderScenarioChannels(get(fault("cut-tail").path));
    expect(cut[0].length).toBe(Math.round(0.9 * 48000));
    expect(rmsDb(cut[0], cut[0].length - 2400)).toBeGreaterThan(-45); // still ringing at the last sample

    const dup = fault("duplicate");
    const copy = renderScenarioFile(get(dup.path));
    const orig = renderScenarioFile(get((dup.related ?? [])[0]));
    expect(Buffer.from(copy).equals(Buffer.from(orig))).toBe(true);
  });

  it("is deterministic: the same seed gives the same bytes; another seed changes the takes, not the paths", () => {
    const f = get("Percussion/Cowbell/cowbell_hit_med_2.wav");
    expect(Buffer.from(renderScenarioFile(f)).equals(Buffer.from(renderScenarioFile(f)))).toBe(true);
    const other = demoScenario({ seed: 7 });
    expect(other.map((x) => x.path)).toEqual(files.map((x) => x.path));
    const g = other.find((x) => x.path === f.path) as ScenarioFile;
    expect(Buffer.from(renderScenarioFile(g)).equals(Buffer.from(renderScenarioFile(f)))).toBe(false);
  });
});
