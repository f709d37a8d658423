// The out-of-fold calibration check, on predictions small enough to work by hand. The expected calibration
// error is the file-weighted mean of |confidence shown - share right| over bins (Naeini, Cooper & Hauskrecht,
// "Obtaining well calibrated probabilities using Bayesian binning", AAAI 2015).
import { describe, expect, it } from "vitest";
import type { Row } from "./dataset";
import { learningCurveSvg, outOfFoldCalibration, powerLawFit, recordingShare, type Prediction } from "./evaluate";

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

describe("recordingShare", () => {
  // rows of 200 recordings, three rows each (a file and two copies)
  const rows = Array.from({ length: 600 }, (_, i) => ({ group: `rec${Math.floor(i / 3)}`, id: i }));
  const groups = (rs: { group: string }[]) => new Set(rs.map((r) => r.group));

  it("keeps whole recordings, about the share asked for, none at 0 and all at 1", () => {
    expect(recordingShare(rows, 0, 7)).toEqual([]);
    expect(recordingShare(rows, 1, 7)).toHaveLength(600);
    const half = recordingShare(rows, 0.5, 7);
    for (const g of groups(half)) expect(half.filter((r) => r.group === g)).toHaveLength(3);
    // a fair draw of 200 recordings at 1/2: 100 +- 3 standard deviations (sqrt(200 / 4) = 7.1)
    expect(groups(half).size).toBeGreaterThan(78);
    expect(groups(half).size).toBeLessThan(122);
  });

  it("a larger share keeps every recording a smaller one kept; another seed draws another subset", () => {
    const quarter = groups(recordingShare(rows, 0.25, 7));
    const threeQuarters = groups(recordingShare(rows, 0.75, 7));
    for (const g of quarter) expect(threeQuarters.has(g)).toBe(true);
    expect([...groups(recordingShare(rows, 0.25, 8))].sort()).not.toEqual([...quarter].sort());
  });
});

describe("powerLawFit", () => {
  it("recovers a and b of error = a n^-b from points on the curve, and inverts it", () => {
    // 0.8 n^-0.5 at n = 16, 64, 256 is 0.2, 0.1, 0.05 (worked by hand)
    const fit = powerLawFit([{ n: 16, error: 0.2 }, { n: 64, error: 0.1 }, { n: 256, error: 0.05 }, { n: 0, error: 0.4 }]);
    expect(fit.a).toBeCloseTo(0.8, 10);
    expect(fit.b).toBeCloseTo(0.5, 10);
    expect(fit.recordingsFor(0.025)).toBeCloseTo(1024, 6);
  });

  it("needs two usable points", () => {
    expect(() => powerLawFit([{ n: 0, error: 0.3 }, { n: 10, error: 0.2 }])).toThrow(/two points/);
  });
});

describe("learningCurveSvg", () => {
  it("draws a dot per seed and share with recordings, the targets, and the mean at its height", () => {
    const points = [
      { n: 0, family: [0.6, 0.7], stroke: [0.5, 0.5] },
      { n: 20, family: [0.7, 0.8], stroke: [0.6, 0.6] },
      { n: 40, family: [0.8, 0.9], stroke: [0.7, 0.7] },
    ];
    const svg = learningCurveSvg(points, { family: { a: 1, b: 0.5 }, stroke: { a: 1, b: 0.4 } });
    // the share with no recordings has no place on a log axis: 2 shares x 2 seeds x 2 series
    expect(svg.match(/<circle /g)).toHaveLength(8);
    expect(svg).toContain("family target 95 %");
    expect(svg).toContain("stroke target 85 %");
    // the family mean at 40 recordings is 85 %: y = 24 + (0.15 / 0.6) * (400 - 24 - 48) = 106
    expect(svg).toContain("family 85.0 %");
    expect(svg).toMatch(/,106\.0"/);
  });
});
