import { describe, expect, it } from "vitest";
import { decaySec, distance, featureVector, FEATURE_COUNT, fitStandardiser, standardise } from "./features";
import { measurement } from "./test-helpers";

describe("featureVector", () => {
  it("takes log2 of frequencies and times, keeps flatness and crest as they are", () => {
    const v = featureVector(measurement({ decaySec: 2, strikeCentroidHz: 8000, bodyCentroidHz: 4000, strikeFlatness: 0.6, pitchHz: 440, crestDb: 20 }));
    expect(v).toHaveLength(FEATURE_COUNT);
    expect(v[0]).toBeCloseTo(1, 12);
    expect(v[1]).toBeCloseTo(Math.log2(8000), 12);
    expect(v[2]).toBeCloseTo(Math.log2(4000), 12);
    expect(v[3]).toBe(0.6);
    expect(v[6]).toBeCloseTo(Math.log2(440), 12);
    expect(v[7]).toBe(20);
  });
  it("missing pitch is NaN and standardises to the mean (0)", () => {
    const v = featureVector(measurement({ pitchHz: null }));
    expect(Number.isNaN(v[6])).toBe(true);
    expect(standardise(v, fitStandardiser([v]))[6]).toBe(0);
  });
  it("decay falls back from EDT to T20 to the duration after the onset", () => {
    expect(decaySec(measurement({ decaySec: 0.7 }))).toBe(0.7);
    expect(decaySec(measurement({}, { edtSec: null, t20Sec: 1.2 }))).toBe(1.2);
    expect(decaySec(measurement({}, { edtSec: null, t20Sec: null, onsetMs: 100 }))).toBeCloseTo(0.9, 12);
  });
});

describe("z-score standardisation (textbook definition: z = (x - mean) / sd, population sd)", () => {
  it("worked example: column [2, 4, 4, 4, 5, 5, 7, 9] has mean 5 and sd 2", () => {
    const rows = [2, 4, 4, 4, 5, 5, 7, 9].map((x) => [x, 3]);
    const s = fitStandardiser(rows);
    expect(s.mean).toEqual([5, 3]);
    expect(s.sd[0]).toBeCloseTo(2, 12);
    expect(s.sd[1]).toBe(1); // constant column
    expect(standardise([9, 3], s)).toEqual([2, 0]);
  });
  it("distance is Euclidean (3-4-5 triangle)", () => {
    expect(distance([0, 0], [3, 4])).toBe(5);
  });
});
