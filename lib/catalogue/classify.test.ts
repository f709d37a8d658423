import { describe, expect, it } from "vitest";
import { buildLabelModel, grossMisfits, nameSoundConflict, suggestByRules, suggestFromSound } from "./classify";
import { featureVector } from "./features";
import type { Family, Articulation } from "./taxonomy";
import { measurement, rng, type DrumShape } from "./test-helpers";

// Fixtures built from typical acoustic ranges of drums and cymbals (common practice, no published source;
// ranges from memory: kick fundamentals 40-90 Hz, snare 150-300 Hz with wire noise, toms 70-300 Hz tonal,
// cymbals bright and noisy with crash/ride decays of seconds, closed hi-hat under 0.3 s, cowbell 500-900 Hz;
// amplitude-spectrum flatness of coloured drum noise well below white noise's 0.85 (computed), tonal drums near 0.01-0.05).
const DRUMS: Record<string, [Partial<DrumShape>, Family, Articulation?]> = {
  "kick 55 Hz, dark body, 0.45 s": [{ pitchHz: 55, bodyCentroidHz: 120, strikeCentroidHz: 1500, strikeFlatness: 0.04, bodyFlatness: 0.01, decaySec: 0.45 }, "kick", "centre"],
  "snare 200 Hz with wires (flatness 0.25), 0.35 s": [{ pitchHz: 200, bodyCentroidHz: 1200, strikeCentroidHz: 3000, strikeFlatness: 0.25, bodyFlatness: 0.15, decaySec: 0.35 }, "snare", "centre"],
  "rack tom 140 Hz tonal, 0.8 s": [{ pitchHz: 140, bodyCentroidHz: 300, strikeCentroidHz: 1000, strikeFlatness: 0.03, bodyFlatness: 0.02, decaySec: 0.8 }, "tom", "centre"],
  "floor tom 90 Hz tonal, 1.4 s": [{ pitchHz: 90, bodyCentroidHz: 200, strikeCentroidHz: 900, strikeFlatness: 0.03, bodyFlatness: 0.01, decaySec: 1.4 }, "tom", "centre"],
  "closed hi-hat 9 kHz, 0.15 s": [{ pitchHz: null, bodyCentroidHz: 8000, strikeCentroidHz: 9000, strikeFlatness: 0.55, bodyFlatness: 0.6, decaySec: 0.15 }, "hi-hat", "closed"],
  "hi-hat pedal chick 5 kHz, 100 ms": [{ pitchHz: null, bodyCentroidHz: 5000, strikeCentroidHz: 5000, strikeFlatness: 0.3, bodyFlatness: 0.3, decaySec: 0.1 }, "hi-hat", "pedal"],
  "crash 5 kHz noisy wash, 3 s": [{ pitchHz: null, bodyCentroidHz: 5500, strikeCentroidHz: 5000, strikeFlatness: 0.5, bodyFlatness: 0.45, decaySec: 3 }, "crash", "crash-hit"],
  "ride 4 kHz with a ping (strike flatness 0.12), 4 s": [{ pitchHz: null, bodyCentroidHz: 4000, strikeCentroidHz: 4000, strikeFlatness: 0.12, bodyFlatness: 0.15, decaySec: 4 }, "ride", "bow"],
  "china 3 kHz trashy (flatness 0.6), 2 s": [{ pitchHz: null, bodyCentroidHz: 2500, strikeCentroidHz: 3500, strikeFlatness: 0.5, bodyFlatness: 0.6, decaySec: 2 }, "china", "crash-hit"],
  "cowbell 700 Hz tonal, 0.35 s": [{ pitchHz: 700, bodyCentroidHz: 1200, strikeCentroidHz: 2000, strikeFlatness: 0.02, bodyFlatness: 0.02, decaySec: 0.35 }, "cowbell", "hit"],
};

// The rules of thumb stay as the explanation and as the fallback (soundModel: null); the trained model is tested
// in sound-model.test.ts against held-out real recordings.
const RULES = { soundModel: null } as const;

describe("suggestFromSound without labels: rules of thumb (common practice, no published source)", () => {
  for (const [name, [shape, family, art]] of Object.entries(DRUMS)) {
    it(name, () => {
      const s = suggestFromSound(measurement(shape), undefined, RULES);
      expect(s.family).toBe(family);
      if (art) expect(s.articulation).toBe(art);
      expect(s.source).toBe("rules");
      expect(s.confidence).toBeGreaterThan(0.3);
      expect(s.confidence).toBeLessThanOrEqual(0.85);
    });
  }
  it("gives its reasons in plain words", () => {
    const s = suggestByRules(measurement({ decaySec: 1.9, strikeCentroidHz: 7400, bodyFlatness: 0.61, pitchHz: null }));
    expect(s.reasons[0]).toBe("decay 1.9 s, centroid 7.4 kHz, flatness 0.61");
    expect(s.reasons.join(" ")).toMatch(/rules of thumb/);
  });
  it("hi-hat openness follows the decay (closed < 0.3 s, open > 1.5 s)", () => {
    const hat = (d: number) => suggestFromSound(measurement({ pitchHz: null, bodyCentroidHz: 8000, strikeCentroidHz: 9000, strikeFlatness: 0.55, bodyFlatness: 0.6, decaySec: d }), undefined, RULES);
    expect(hat(0.2).articulation).toBe("closed");
    expect(hat(0.5)).toMatchObject({ family: "hi-hat", articulation: "quarter-open" });
    expect(hat(0.8)).toMatchObject({ family: "hi-hat", articulation: "half-open" });
  });
  it("a choked crash (stopped at 0.3 s) is not called a crash hit", () => {
    const s = suggestFromSound(measurement({ pitchHz: null, bodyCentroidHz: 5500, strikeCentroidHz: 5000, strikeFlatness: 0.5, bodyFlatness: 0.45, decaySec: 0.3 }), undefined, RULES);
    expect(s.articulation).not.toBe("crash-hit");
  });
  it("a sound that fits nothing gets a low confidence", () => {
    const s = suggestFromSound(measurement({ pitchHz: 3000, bodyCentroidHz: 15000, strikeCentroidHz: 200, strikeFlatness: 0.99, bodyFlatness: 0.0, decaySec: 20 }), undefined, RULES);
    expect(s.confidence).toBeLessThan(0.4);
  });
});

describe("suggestFromSound learns from confirmed labels (k nearest neighbours over z-scores)", () => {
  const r = rng(42);
  const jitter = (shape: Partial<DrumShape>): Partial<DrumShape> => {
    const out: Partial<DrumShape> = { ...shape };
    for (const k of ["decaySec", "strikeCentroidHz", "bodyCentroidHz"] as const) if (out[k]) out[k] = out[k]! * (0.9 + 0.2 * r());
    return out;
  };
  // a studio whose electronic snares have no tonal body: by the rules they look like closed hi-hats
  const elecSnare: Partial<DrumShape> = { pitchHz: null, strikeCentroidHz: 5200, bodyCentroidHz: 4200, strikeFlatness: 0.7, bodyFlatness: 0.7, decaySec: 0.22 };
  const hat: Partial<DrumShape> = { pitchHz: null, strikeCentroidHz: 11000, bodyCentroidHz: 10000, strikeFlatness: 0.45, bodyFlatness: 0.5, decaySec: 0.08 };
  const kick: Partial<DrumShape> = DRUMS["kick 55 Hz, dark body, 0.45 s"]![0];
  const ex = (shape: Partial<DrumShape>, family: Family, articulation: Articulation) => ({ features: featureVector(measurement(jitter(shape))), family, articulation });
  const labelled = [
    ...Array.from({ length: 6 }, () => ex(elecSnare, "snare", "centre")),
    ...Array.from({ length: 6 }, () => ex(hat, "hi-hat", "closed")),
    ...Array.from({ length: 5 }, () => ex(kick, "kick", "centre")),
    ...Array.from({ length: 2 }, () => ex(DRUMS["cowbell 700 Hz tonal, 0.35 s"]![0], "cowbell", "hit")),
  ];
  const model = buildLabelModel(labelled);

  it("before: the rules call it a hi-hat; after confirming labels: snare", () => {
    const query = measurement(jitter(elecSnare));
    expect(suggestFromSound(query, undefined, RULES).family).toBe("hi-hat");
    const s = suggestFromSound(query, model, RULES);
    expect(s).toMatchObject({ family: "snare", articulation: "centre", source: "labels" });
    expect(s.confidence).toBeGreaterThan(0.6);
    expect(s.reasons[1]).toMatch(/nearest confirmed samples are snare/);
  });
  it("families with too few labels (cowbell: 2 < 3) fall back to the rules", () => {
    expect(model.learned).toEqual(["hi-hat", "kick", "snare"]);
    const s = suggestFromSound(measurement(DRUMS["cowbell 700 Hz tonal, 0.35 s"]![0]), model, RULES);
    expect(s).toMatchObject({ family: "cowbell", source: "rules" });
    expect(s.reasons.join(" ")).toMatch(/too few confirmed labels/);
  });
  it("an empty model behaves like the rules", () => {
    const m = measurement(DRUMS["ride 4 kHz with a ping (strike flatness 0.12), 4 s"]![0]);
    expect(suggestFromSound(m, buildLabelModel([]), RULES).family).toBe(suggestByRules(m).family);
  });
});

describe("nameSoundConflict", () => {
  // Rules of thumb (common practice, no published source): a snare rings well under ~1 s with a fundamental in
  // roughly 140-330 Hz; a ride bell rings for seconds with a fundamental of several hundred Hz.
  const rideBell = measurement({ decaySec: 4.3, strikeCentroidHz: 2800, bodyCentroidHz: 2800, strikeFlatness: 0.09, bodyFlatness: 0.05, pitchHz: 780 });
  const snare = measurement({ decaySec: 0.5, strikeCentroidHz: 3000, bodyCentroidHz: 1500, strikeFlatness: 0.25, bodyFlatness: 0.15, pitchHz: 200 });
  it("a ride bell named snare is ruled out as a snare by its ring and its pitch: strong, even when the averaged fit looks fair", () => {
    expect(grossMisfits(rideBell, "snare").sort()).toEqual(["decay", "pitch"]);
    expect(grossMisfits(snare, "snare")).toEqual([]);
    const s = suggestFromSound(rideBell, undefined, RULES);
    expect(s.family).toBe("ride");
    expect(nameSoundConflict({ family: "snare", articulation: "centre" }, s, { measurement: rideBell }).level).toBe("strong");
    expect(nameSoundConflict({ family: "snare", articulation: "centre" }, suggestFromSound(snare, undefined, RULES), { measurement: snare }).level).toBe("none");
  });

  const sound = (family: Family, confidence: number, articulation: Articulation = "hit") => ({ family, articulation, confidence, reasons: ["decay 2.0 s"] });
  it("strong when unlike families disagree with a confident sound", () => {
    expect(nameSoundConflict({ family: "kick" }, sound("crash", 0.8)).level).toBe("strong");
  });
  it("with family scores: strong only when the named family fits the sound badly", () => {
    const withScores = (scores: Partial<Record<Family, number>>) => ({ ...sound("crash", 0.4), familyScores: scores });
    expect(nameSoundConflict({ family: "kick" }, withScores({ crash: 1, kick: 0.2 })).level).toBe("strong");
    expect(nameSoundConflict({ family: "kick" }, withScores({ crash: 1, kick: 0.8 })).level).toBe("mild");
    // from the rules: a crash-like sound named kick
    const s = suggestFromSound(measurement(DRUMS["crash 5 kHz noisy wash, 3 s"]![0]), undefined, RULES);
    expect(nameSoundConflict({ family: "kick" }, s).level).toBe("strong");
    expect(nameSoundConflict({ family: "china" }, s).level).toBe("mild");
  });
  it("mild between alike families or with low confidence; none when they agree or the name says nothing", () => {
    expect(nameSoundConflict({ family: "crash" }, sound("china", 0.8)).level).toBe("mild");
    expect(nameSoundConflict({ family: "kick" }, sound("crash", 0.55)).level).toBe("mild");
    // a cross-stick's woody click resembles a cowbell (common practice)
    expect(nameSoundConflict({ family: "snare", articulation: "cross-stick" }, sound("cowbell", 0.9)).level).toBe("mild");
    expect(nameSoundConflict({ family: "snare", articulation: "centre" }, sound("cowbell", 0.9)).level).toBe("strong");
    expect(nameSoundConflict({ family: "ride" }, sound("ride", 0.9, "bow")).level).toBe("none");
    expect(nameSoundConflict({ family: null }, sound("ride", 0.9)).level).toBe("none");
    expect(nameSoundConflict({ family: "ride", articulation: "bell" }, sound("ride", 0.9, "bow")).level).toBe("mild");
  });
});

describe("cymbals have little energy below ~300 Hz (common practice, from memory of cymbal spectra)", () => {
  it("a bright drum hit with a clear 200 Hz fundamental is not called a cymbal", () => {
    const s = suggestFromSound(measurement({ pitchHz: 200, strikeCentroidHz: 4100, bodyCentroidHz: 3000, strikeFlatness: 0.3, bodyFlatness: 0.3, decaySec: 0.8 }), undefined, RULES);
    expect(["hi-hat", "crash", "ride", "china", "splash", "stack"]).not.toContain(s.family);
  });
});
