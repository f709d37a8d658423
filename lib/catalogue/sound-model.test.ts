import { describe, expect, it } from "vitest";
import { measureBytes } from "../audio";
import { demoScenario } from "../synth/scenario";
import { renderScenarioFile } from "../synth/render";
import { suggestByModel, suggestFromSound } from "./classify";
import { soundFeatures, SOUND_FEATURE_NAMES } from "./sound-features";
import { RandomForestClassifier } from "ml-random-forest";
import { calibrate, calibrationTable, compactForest, predictSound, trainSoundModel, type TrainingRow } from "./sound-model";
import { trainedSoundModel } from "./sound-model-file";
import { FAMILIES, FAMILY_ARTICULATIONS } from "./taxonomy";

describe("calibration table (held-out vote share -> share right)", () => {
  it("counts each bin and pools sparse bins with their neighbours (computed by hand)", () => {
    // 20 predictions at share 0.85: 17 right; 20 at share 0.99: 20 right
    const pairs = [
      ...Array.from({ length: 20 }, (_, i) => ({ share: 0.85, right: i < 17 })),
      ...Array.from({ length: 20 }, () => ({ share: 0.99, right: true })),
    ];
    const t = calibrationTable(pairs, [0.5, 0.9, 1]);
    expect(t.counts).toEqual([0, 20, 20]);
    // the empty 0.5 bin borrows from the 0.9 bin: 17/20
    expect(t.accuracy).toEqual([0.85, 0.85, 1]);
    expect(calibrate(t, 0.7)).toBe(0.85);
    expect(calibrate(t, 0.95)).toBe(1);
  });
  it("never gives a lower confidence to a higher share", () => {
    const pairs = [
      ...Array.from({ length: 10 }, (_, i) => ({ share: 0.6, right: i < 9 })),
      ...Array.from({ length: 10 }, (_, i) => ({ share: 0.8, right: i < 7 })),
    ];
    const t = calibrationTable(pairs, [0.6, 0.8, 1]);
    expect(t.accuracy[1]).toBeGreaterThanOrEqual(t.accuracy[0]!);
  });
});

describe("training pipeline (a small subset of our generator's library: proves the steps, judges nothing)", () => {
  it("trains, serialises, reloads and tells a generated kick, hi-hat and crash of another take apart", () => {
    const pick = (seed: number) =>
      demoScenario({ seed })
        .filter((f) => !f.post && !f.duplicateOf && ["kick", "hi-hat", "crash"].includes(f.truth.family) && f.truth.roundRobin === 1)
        .slice(0, 60);
    const rows: TrainingRow[] = pick(1).map((f) => ({
      features: soundFeatures(measureBytes(renderScenarioFile(f))),
      family: f.truth.family,
      articulation: f.truth.articulation,
      group: f.truth.instrumentId,
    }));
    const model = JSON.parse(JSON.stringify(trainSoundModel(rows, { trees: 8, maxDepth: 6, minPerClass: 5 })));
    expect(model.family.classes).toEqual(["crash", "hi-hat", "kick"]);
    const test = pick(2).filter((_, i) => i % 4 === 0);
    const right = test.filter((f) => predictSound(model, soundFeatures(measureBytes(renderScenarioFile(f)))).family === f.truth.family);
    expect(right.length / test.length).toBeGreaterThanOrEqual(0.9);
  });
});

describe("compactForest: the forest's file without the fields loading and predicting never read", () => {
  it("votes exactly as the full forest (ml-random-forest's own toJSON/load) on random rows, at a fraction of the size", () => {
    // a random table: 3 classes from 6 features, the class a noisy function of two of them
    let s = 12345;
    const r = () => ((s = (s * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const X = Array.from({ length: 300 }, () => Array.from({ length: 6 }, r));
    const Y = X.map((x) => (x[0]! + 0.3 * r() > 0.8 ? 2 : x[3]! > 0.5 ? 1 : 0));
    const rf = new RandomForestClassifier({ nEstimators: 10, maxFeatures: 0.5, replacement: false, useSampleBagging: true, noOOB: true, seed: 3, treeOptions: { maxDepth: 8, minNumSamples: 2 } } as never);
    rf.train(X, Y);
    const full = rf.toJSON();
    const small = compactForest(full);
    expect(JSON.stringify(small).length).toBeLessThan(JSON.stringify(full).length * 0.5);
    const test = Array.from({ length: 200 }, () => Array.from({ length: 6 }, r));
    const votes = (j: unknown) => (RandomForestClassifier.load(j as never).predictionValues(test) as unknown as { to2DArray(): number[][] }).to2DArray();
    expect(votes(small)).toEqual(votes(full));
  });
});

describe("the committed model (lib/catalogue/sound-model.data.ts, made by npm run train:sound)", () => {
  const model = trainedSoundModel();
  it("carries its version, training data hash, command and held-out figures", () => {
    expect(model.version).toMatch(/^\d{4}-\d{2}-\d{2}-[0-9a-f]{8}$/);
    expect(model.meta.trainingDataSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(model.meta.command).toBe("npm run train:sound");
    expect(model.featureCount).toBe(SOUND_FEATURE_NAMES.length);
    expect(model.calibration?.family.edges.length).toBeGreaterThan(3);
  });
  it("answers every measured file with a known family, an articulation of that family and a confidence in 0..1", () => {
    const files = demoScenario({ seed: 3 }).filter((_, i) => i % 25 === 0);
    for (const f of files) {
      const s = suggestByModel(measureBytes(renderScenarioFile(f)), model);
      expect(FAMILIES).toContain(s.family);
      expect(FAMILY_ARTICULATIONS[s.family]).toContain(s.articulation);
      expect(s.confidence).toBeGreaterThanOrEqual(0);
      expect(s.confidence).toBeLessThanOrEqual(1);
      expect(s.source).toBe("model");
      // reasons in a drummer's words, no feature jargon
      expect(s.reasons[0]).toMatch(/^decay [\d.]+ m?s, (dark|warm|bright|very bright), (tonal|some noise|noisy)/);
      expect(s.reasons.join(" ")).not.toMatch(/centroid|flatness|mfcc|bark/i);
    }
  });
  it("keeps its answer by cache key: the same answer again, and a caller's change to it does not leak", () => {
    const f = demoScenario({ seed: 3 })[5]!;
    const m = measureBytes(renderScenarioFile(f));
    const a = suggestFromSound(m, undefined, { cacheKey: "sample-1|abc|2" });
    a.reasons.push("changed by a caller");
    const b = suggestFromSound(m, undefined, { cacheKey: "sample-1|abc|2" });
    expect(b).toEqual(suggestByModel(m, model));
  });
  it("is what suggestFromSound uses by default", () => {
    const f = demoScenario({ seed: 3 })[0]!;
    const m = measureBytes(renderScenarioFile(f));
    expect(suggestFromSound(m).family).toBe(suggestByModel(m, model).family);
    expect(suggestFromSound(m).source).toBe("model");
  });
});
