// The sorted sweep (forest-split.ts) against ml-cart's own split search (ml-cart 2.1.1, the reference library):
// same feature, same threshold, same Gini gain, on data with ties, several classes and constant features.
import { describe, expect, it } from "vitest";
import { RandomForestClassifier } from "ml-random-forest";
import { mlCartBestSplit, nodeFeatures, setNodeSampling, sweepBestSplit, useSweepSplits, withMlCartTraining } from "./forest-split";

function rng(seed: number) {
  let s = seed >>> 0 || 1;
  return () => { s ^= s << 13; s ^= s >>> 17; s ^= s << 5; return (s >>> 0) / 4294967296; };
}

describe("sorted-sweep split search equals ml-cart's split search", () => {
  for (const seed of [1, 2, 3, 4, 5, 6, 7, 8]) {
    it(`random table ${seed}`, () => {
      const r = rng(seed);
      const n = 20 + Math.floor(r() * 120);
      const features = 1 + Math.floor(r() * 8);
      const classes = 2 + Math.floor(r() * 4);
      // coarse values make ties; one feature in three is constant for some tables
      const cols = Array.from({ length: features }, (_, f) => Array.from({ length: n }, () => (seed % 3 === 0 && f === 0 ? 1 : Math.round(r() * (seed % 2 ? 6 : 1000)) / 4)));
      const y = Array.from({ length: n }, (_, i) => (cols[0]![i]! > 0.5 && r() < 0.7 ? 0 : Math.floor(r() * classes)));
      const XT = { rows: features, getRow: (i: number) => cols[i]! };
      const ref = mlCartBestSplit(XT, y);
      const fast = sweepBestSplit(XT, y);
      expect(fast.maxColumn).toBe(ref.maxColumn);
      expect(fast.maxValue).toBe(ref.maxValue);
      expect(fast.numberSamples).toBe(ref.numberSamples);
      expect(fast.maxGain).toBeCloseTo(ref.maxGain, 12);
    });
  }
  it("one class only: no split, like ml-cart", () => {
    const XT = { rows: 2, getRow: (i: number) => [1, 2, 3, i] };
    expect(sweepBestSplit(XT, [0, 0, 0, 0])).toEqual(mlCartBestSplit(XT, [0, 0, 0, 0]));
  });
});

describe("features tried per node (Breiman 2001: a fresh random subset at every split)", () => {
  // ten features, only the first tells the two classes apart; the others are noise
  const n = 60;
  const r = rng(11);
  const cols = Array.from({ length: 10 }, (_, f) => Array.from({ length: n }, (_, i) => (f === 0 ? (i < n / 2 ? 0 : 1) + 0.1 * r() : r())));
  const y = Array.from({ length: n }, (_, i) => (i < n / 2 ? 0 : 1));
  const XT = { rows: 10, getRow: (i: number) => cols[i]! };
  it("all features: the informative one always wins", () => {
    setNodeSampling(1, 5);
    expect(nodeFeatures(10)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(sweepBestSplit(XT, y, nodeFeatures(10)).maxColumn).toBe(0);
  });
  it("a fifth of them: two distinct features per node, the informative one in about a fifth of the nodes, reproducible from the seed", () => {
    setNodeSampling(0.2, 5);
    const draws = Array.from({ length: 500 }, () => nodeFeatures(10));
    for (const d of draws) {
      expect(d).toHaveLength(2);
      expect(d[0]).toBeLessThan(d[1]!);
    }
    const withFirst = draws.filter((d) => d.includes(0)).length / draws.length;
    expect(withFirst).toBeGreaterThan(0.15);
    expect(withFirst).toBeLessThan(0.25);
    // a node that did not draw feature 0 splits on another one
    const without = draws.find((d) => !d.includes(0))!;
    expect(sweepBestSplit(XT, y, without).maxColumn).not.toBe(0);
    setNodeSampling(0.2, 5);
    expect(Array.from({ length: 500 }, () => nodeFeatures(10))).toEqual(draws);
    setNodeSampling(1, 1);
  });
});

describe("tree growth on row indices equals ml-cart's TreeNode.train (ml-cart 2.1.1, the reference library)", () => {
  for (const seed of [21, 22, 23]) {
    it(`a 10-tree forest on random table ${seed}: the same trees, node for node`, () => {
      const r = rng(seed);
      const n = 150 + Math.floor(r() * 150);
      const features = 6 + Math.floor(r() * 10);
      // coarse values make ties and constant nodes; the class leans on the first two features
      const X = Array.from({ length: n }, () => Array.from({ length: features }, (_, f) => Math.round(r() * (f % 2 ? 8 : 500)) / 4));
      const y = X.map((row) => (row[0]! + 20 * row[1]! > 140 + 60 * r() ? 0 : Math.floor(r() * 3) + 1));
      const grow = () => {
        setNodeSampling(0.3, seed);
        const rf = new RandomForestClassifier({ nEstimators: 10, seed, maxFeatures: 1, replacement: true, noOOB: true, treeOptions: { maxDepth: 8, minNumSamples: 3 } } as never);
        rf.train(X, y);
        return JSON.stringify(rf.toJSON());
      };
      useSweepSplits();
      try {
        const fast = grow();
        const ref = withMlCartTraining(grow);
        expect(fast.length).toBeGreaterThan(2000); // real trees, not stumps
        expect(fast).toBe(ref);
      } finally {
        setNodeSampling(1, 1);
      }
    });
  }
});
