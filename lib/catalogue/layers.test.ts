import { describe, expect, it } from "vitest";
import { ckmeans } from "simple-statistics";
import { isMonotonic, layerCountFromGaps, sortLayers, type LayerMember } from "./layers";
import { rng } from "./test-helpers";

/** Generated group: `means` layers (LUFS) x `rr` takes, each take scattered by +-scatter dB. */
function group(means: number[], rr: number, scatter: number, seed = 1, hint = false): LayerMember[] {
  const r = rng(seed);
  const out: LayerMember[] = [];
  means.forEach((mu, li) => {
    for (let t = 0; t < rr; t++) {
      out.push({
        id: `L${li + 1}-R${t + 1}`,
        strikeLufs: mu + (r() * 2 - 1) * scatter,
        roundRobin: t + 1,
        velocityHint: hint ? { scheme: "v", rank: li + 1, raw: `v${li + 1}` } : null,
      });
    }
  });
  // shuffle so order carries no information
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [out[i], out[j]] = [out[j]!, out[i]!];
  }
  return out;
}

describe("ckmeans (simple-statistics) as used here", () => {
  it("reproduces the library's documented example", () => {
    // example from the simple-statistics documentation of ckmeans
    expect(ckmeans([-1, 2, -1, 2, 4, 5, 6, -1, 2, -1], 3)).toEqual([[-1, -1, -1, -1], [2, 2, 2], [4, 5, 6]]);
  });
});

describe("sortLayers on generated groups with known layers", () => {
  it("4 layers x 3 round robins, 6 dB apart, +-0.6 dB scatter: recovers count and membership from the gaps", () => {
    for (const seed of [1, 2, 3, 4, 5]) {
      const s = sortLayers(group([-32, -26, -20, -14], 3, 0.6, seed));
      expect(s.countFrom).toBe("gaps");
      expect(s.layers).toHaveLength(4);
      s.layers.forEach((l, i) => {
        expect(l.index).toBe(i);
        expect(l.sampleIds).toEqual([`L${i + 1}-R1`, `L${i + 1}-R2`, `L${i + 1}-R3`]); // round robins in order
      });
      expect(isMonotonic(s.layers)).toBe(true);
    }
  });
  it("6 single-take layers 4 dB apart: six layers, each flagged as thin", () => {
    const s = sortLayers(group([-40, -36, -32, -28, -24, -20], 1, 0, 7));
    expect(s.layers).toHaveLength(6);
    expect(s.issues.find((i) => i.code === "thin-round-robins")?.sampleIds).toHaveLength(6);
  });
  it("a continuous sweep with no gaps above 1.5 dB stays one layer", () => {
    const members = Array.from({ length: 12 }, (_, i) => ({ id: `s${i}`, strikeLufs: -30 + i * 0.8 }));
    const s = sortLayers(members);
    expect(s.layers).toHaveLength(1);
    expect(s.countFrom).toBe("single");
    expect(s.layers[0]).toMatchObject({ velocityLow: 1, velocityHigh: 127 });
  });
  it("the gap criterion refuses splits whose gaps are narrower than the clusters", () => {
    // two clusters 1.5 dB apart but each 3 dB wide, takes 1 dB apart
    const v = [-30, -29, -28, -27, -25.5, -24.5, -23.5, -22.5];
    expect(layerCountFromGaps(v).k).toBe(1);
    expect(layerCountFromGaps([-30, -29.8, -20, -19.7]).k).toBe(2);
  });
  it("takes the layer count from the names when present (3 hints even though the loudness has 2 clear gaps only)", () => {
    const m = group([-30, -29, -20], 3, 0.2, 3, true);
    const s = sortLayers(m);
    expect(s.countFrom).toBe("names");
    expect(s.layers).toHaveLength(3);
    expect(s.layers.map((l) => l.hintRanks)).toEqual([[1], [2], [3]]);
  });
  it("velocity ranges follow the DLS curve and tile 1..127", () => {
    const s = sortLayers(group([-30, -24, -18], 2, 0.3, 9));
    expect(s.layers[0]!.velocityLow).toBe(1);
    expect(s.layers[2]!.velocityHigh).toBe(127);
    // boundary between the two loudest layers: DLS at half the measured step
    const step = s.layers[2]!.meanStrikeLufs - s.layers[1]!.meanStrikeLufs;
    expect(s.layers[1]!.velocityHigh).toBe(Math.floor(127 * 10 ** (-step / 2 / 40)));
  });
});

describe("layer issues", () => {
  it("flags layers out of loudness order versus their names (v3 recorded softer than v2)", () => {
    const m = group([-30, -24, -18], 2, 0.2, 4, true).map((x) => {
      if (x.velocityHint!.rank === 2) return { ...x, velocityHint: { ...x.velocityHint!, rank: 3 } };
      if (x.velocityHint!.rank === 3) return { ...x, velocityHint: { ...x.velocityHint!, rank: 2 } };
      return x;
    });
    const s = sortLayers(m);
    const issue = s.issues.find((i) => i.code === "layer-order");
    expect(issue?.sampleIds.sort()).toEqual(["L2-R1", "L2-R2", "L3-R1", "L3-R2"]);
  });
  it("flags one sample named for another layer", () => {
    const m = group([-30, -24, -18], 3, 0.2, 5, true).map((x) => (x.id === "L1-R2" ? { ...x, velocityHint: { scheme: "v" as const, rank: 3, raw: "v3" } } : x));
    const s = sortLayers(m);
    expect(s.issues.filter((i) => i.code === "layer-order").flatMap((i) => i.sampleIds)).toEqual(["L1-R2"]);
  });
  it("flags a missing layer when the name marks skip a number (v1, v2, v4)", () => {
    const m = group([-30, -24, -18], 2, 0.2, 6, true).map((x) => (x.velocityHint!.rank === 3 ? { ...x, velocityHint: { scheme: "v" as const, rank: 4, raw: "v4" } } : x));
    const s = sortLayers(m);
    expect(s.issues.find((i) => i.code === "missing-layer")?.message).toMatch(/v3 is missing/);
  });
  it("does not call MIDI-velocity marks (v32, v64, v96, v127) missing layers", () => {
    const m = group([-30, -24, -18, -12], 2, 0.2, 6, true).map((x) => ({ ...x, velocityHint: { scheme: "v" as const, rank: [32, 64, 96, 127][x.velocityHint!.rank - 1]!, raw: "" } }));
    const s = sortLayers(m);
    expect(s.layers).toHaveLength(4);
    expect(s.issues.map((i) => i.code)).not.toContain("missing-layer");
  });
  it("flags uneven spacing (steps of 2 dB and 12 dB) but not even steps", () => {
    expect(sortLayers(group([-34, -22, -20, -18], 2, 0.1, 8)).issues.map((i) => i.code)).toContain("uneven-layers");
    expect(sortLayers(group([-34, -28, -22, -16], 2, 0.1, 8)).issues.map((i) => i.code)).not.toContain("uneven-layers");
  });
});
