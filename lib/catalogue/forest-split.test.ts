// The sorted sweep (forest-split.ts) against ml-cart's own split search (ml-cart 2.1.1, the reference library):
// same feature, same threshold, same Gini gain, on data with ties, several classes and constant features.
import { describe, expect, it } from "vitest";
import { mlCartBestSplit, sweepBestSplit } from "./forest-split";

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
