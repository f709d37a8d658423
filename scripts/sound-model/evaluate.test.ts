// The out-of-fold calibration check, on predictions small enough to work by hand. The expected calibration
// error is the file-weighted mean of |confidence shown - share right| over bins (Naeini, Cooper & Hauskrecht,
// "Obtaining well calibrated probabilities using Bayesian binning", AAAI 2015).
import { describe, expect, it } from "vitest";
import type { Row } from "./dataset";
import { outOfFoldCalibration, type Prediction } from "./evaluate";

function pred(fold: number, share: number, right: boolean): Prediction {
  const row = { family: "snare", articulation: "centre", group: `g${fold}`, features: [], id: "x", source: "corpus", augmentation: "" } as unknown as Row;
  return { row, fold, family: right ? "snare" : "tom", familyShare: share, articulation: null, articulationShare: 0 };
}

describe("outOfFoldCalibration", () => {
  it("gives each fold the confidence learnt from the other folds, then compares it with how often it was right", () => {
    // fold 0: ten files at share 0.95, 9 right; fold 1: ten files at share 0.95, 7 right.
    const f0 = Array.from({ length: 10 }, (_, i) => pred(0, 0.95, i < 9));
    const f1 = Array.from({ length: 10 }, (_, i) => pred(1, 0.95, i < 7));
    const c = outOfFoldCalibration([...f0, ...f1], [...f0, ...f1]);
    // fold 0 is shown fold 1's 70 % and was right 90 %; fold 1 is shown fold 0's 90 % and was right 70 %:
    // bins 0.7 (10 files, gap 0.2) and 0.9 (10 files, gap 0.2), so ECE = 0.2 and the worst gap 0.2.
    expect(c.bins.map((b) => [b.upTo, b.n])).toEqual([[0.7, 10], [0.9, 10]]);
    expect(c.bins[0]!.meanConfidence).toBeCloseTo(0.7, 10);
    expect(c.bins[0]!.right).toBeCloseTo(0.9, 10);
    expect(c.ece).toBeCloseTo(0.2, 10);
    expect(c.worstGap).toBeCloseTo(0.2, 10);
  });

  it("a model right as often as it says has no gap", () => {
    const f0 = Array.from({ length: 10 }, (_, i) => pred(0, 0.95, i < 8));
    const f1 = Array.from({ length: 10 }, (_, i) => pred(1, 0.95, i < 8));
    const c = outOfFoldCalibration([...f0, ...f1], [...f0, ...f1]);
    expect(c.ece).toBeCloseTo(0, 10);
    expect(c.bins).toHaveLength(1);
  });
});
