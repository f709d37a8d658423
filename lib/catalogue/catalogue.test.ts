import { describe, expect, it } from "vitest";
import { catalogueSamples, soundFit, type CatalogueSampleInput } from "./catalogue";
import { measurement, rng, type DrumShape } from "./test-helpers";

// Acoustic shapes from typical ranges (common practice, no published source; see classify.test.ts)
const SNARE: Partial<DrumShape> = { pitchHz: 200, bodyCentroidHz: 1200, strikeCentroidHz: 3000, strikeFlatness: 0.25, bodyFlatness: 0.15, decaySec: 0.35 };
const TOM: Partial<DrumShape> = { pitchHz: 140, bodyCentroidHz: 300, strikeCentroidHz: 1000, strikeFlatness: 0.03, bodyFlatness: 0.02, decaySec: 0.8 };
const CRASH: Partial<DrumShape> = { pitchHz: null, bodyCentroidHz: 5500, strikeCentroidHz: 5000, strikeFlatness: 0.35, bodyFlatness: 0.35, decaySec: 3 };
const HAT: Partial<DrumShape> = { pitchHz: null, bodyCentroidHz: 8000, strikeCentroidHz: 9000, strikeFlatness: 0.4, bodyFlatness: 0.4, decaySec: 0.15 };

function library(): CatalogueSampleInput[] {
  const r = rng(11);
  const out: CatalogueSampleInput[] = [];
  const add = (path: string, shape: Partial<DrumShape>, lufs: number, over: Parameters<typeof measurement>[1] = {}, sha = path) =>
    out.push({ id: `id-${out.length}`, path, sha256: sha, measurement: measurement(shape, { strikeLufs: lufs, ...over }) });
  // snare: 3 layers x 2 rr, top mic
  for (const v of [1, 2, 3]) for (const rr of [1, 2]) add(`Snare 14x6.5 Brass/Snare_Top_Center_v${v}_rr${rr}.wav`, SNARE, -30 + 6 * v + (r() - 0.5));
  // tom: layers named v1, v2, v4 (v3 missing)
  for (const v of [1, 2, 4]) for (const rr of [1, 2]) add(`Toms/Tom1_Center_v${v}_rr${rr}.wav`, TOM, -32 + 5 * v + (r() - 0.5));
  // crash: nameless files (sound only), 2 layers found from the gaps
  for (const [i, l] of [-28, -27.6, -16, -15.5].entries()) add(`Misc/Audio ${i + 1}.wav`, CRASH, l);
  // hi-hat closed with defects
  add("HH/HH_Closed_01.wav", HAT, -20, { clippedRuns: 3, clippedSamples: 12, truePeakDbtp: 1.2 });
  add("HH/HH_Closed_02.wav", HAT, -20.3, { onsetMs: 40 });
  add("HH/HH_Closed_03.wav", HAT, -19.8, { tail: "cut" });
  add("HH/HH_Closed_04.wav", HAT, -20.1, {}, "HH/HH_Closed_03.wav"); // duplicate content
  // mislabelled: named kick, sounds like a crash
  add("Kick_Hard_1.wav", CRASH, -18);
  return out;
}

// These fixtures are shaped for the rules of thumb (their spectra are not real recordings), so the sound comes
// from the rules here (soundModel: null); the trained model is judged on real audio in sound-model.test.ts and
// scripts/sound-model/floors.test.ts.
const RULES = { soundModel: null } as const;

describe("catalogueSamples", () => {
  const cat = catalogueSamples(library(), RULES);
  const byPath = (p: string) => cat.samples.find((s) => s.path === p)!;

  it("labels each sample with its sources", () => {
    expect(byPath("Snare 14x6.5 Brass/Snare_Top_Center_v2_rr1.wav")).toMatchObject({
      family: "snare", familySource: "name", articulation: "centre", articulationSource: "name", mic: "top",
      instrumentKey: "snare:14x6.5-brass", instrumentName: "Snare 14x6.5 Brass", conflict: "none",
    });
    expect(byPath("Misc/Audio 1.wav")).toMatchObject({ family: "crash", familySource: "sound", articulation: "crash-hit", articulationSource: "sound" });
    expect(byPath("Misc/Audio 1.wav").reasons[0]).toMatch(/^decay 3\.0 s, centroid 5\.0 kHz, flatness 0\.35/);
  });
  it("sorts layers and round robins: names give 3 snare layers; gaps give 2 crash layers", () => {
    const snare = cat.groups.find((g) => g.instrumentKey === "snare:14x6.5-brass")!;
    expect(snare).toMatchObject({ countFrom: "names", articulation: "centre", mic: "top" });
    expect(snare.layers.map((l) => l.sampleIds.map((id) => cat.samples.find((s) => s.id === id)!.path.replace(/.*_(v\d_rr\d)\.wav/, "$1")))).toEqual([
      ["v1_rr1", "v1_rr2"], ["v2_rr1", "v2_rr2"], ["v3_rr1", "v3_rr2"],
    ]);
    const v3 = byPath("Snare 14x6.5 Brass/Snare_Top_Center_v3_rr2.wav");
    expect(v3).toMatchObject({ layerIndex: 2, layerCount: 3, roundRobin: 2, roundRobinCount: 2, velocityHigh: 127 });
    const crash = cat.groups.find((g) => g.instrumentKey === "crash:main")!;
    expect(crash.countFrom).toBe("gaps");
    expect(crash.layers.map((l) => l.sampleIds.length)).toEqual([2, 2]);
  });
  it("finds every kind of defect planted in the library", () => {
    const codes = new Set(cat.health.map((h) => h.code));
    for (const c of ["clipping", "true-peak-over", "late-onset", "cut-tail", "duplicate", "missing-layer", "name-sound-conflict"]) expect(codes).toContain(c);
    const conflict = cat.health.find((h) => h.code === "name-sound-conflict")!;
    expect(conflict.sampleIds).toEqual([byPath("Kick_Hard_1.wav").id]);
    expect(conflict.message).toMatch(/Named kick but sounds like crash/);
    expect(cat.health.find((h) => h.code === "missing-layer")!.message).toMatch(/Tom 1.*v3 is missing/);
    expect(cat.health[0]!.severity).toBe("error");
  });
  it("a member's confirmed label wins over name and sound", () => {
    const lib = library();
    const k = lib.find((s) => s.path === "Kick_Hard_1.wav")!;
    k.confirmed = { family: "crash", articulation: "crash-hit", instrumentKey: "crash:main" };
    // the fixtures' made-up spectra are read by the rules (above); the only name-sound conflict they hold is this kick
    const c = catalogueSamples(lib, RULES);
    expect(c.samples.find((s) => s.id === k.id)).toMatchObject({ family: "crash", familySource: "person", articulationSource: "person", instrumentKey: "crash:main", confidence: 1 });
    expect(c.health.some((h) => h.code === "name-sound-conflict")).toBe(false);
  });
  it("is deterministic whatever the input order; refuses duplicate ids", () => {
    const lib = library();
    const a = catalogueSamples(lib);
    const b = catalogueSamples([...lib].reverse());
    expect(b).toEqual(a);
    expect(() => catalogueSamples([lib[0]!, lib[0]!])).toThrow(/twice/);
  });
  it("gives each instrument its pitch: the median of its centre hits (edge hits measure an upper mode), else null", () => {
    const lib: CatalogueSampleInput[] = [];
    const add = (path: string, pitchHz: number | null, lufs: number) => lib.push({ id: path, path, measurement: measurement({ ...TOM, pitchHz }, { strikeLufs: lufs }) });
    add("Toms/Tom1_Center_v1.wav", 139, -30);
    add("Toms/Tom1_Center_v2.wav", 142, -20);
    for (const [i, hz] of [238, 240, 242].entries()) add(`Toms/Tom1_Edge_v${i + 1}.wav`, hz, -30 + 5 * i);
    add("Toms/Tom2_Center_v1.wav", 180, -25);
    lib.push({ id: "crash", path: "Crash/Crash_Hit_v1.wav", measurement: measurement(CRASH, { strikeLufs: -20 }) });
    const pitch = Object.fromEntries(catalogueSamples(lib).instruments.map((i) => [i.key, i.pitchHz]));
    // (139 + 142) / 2 = 140.5 (the median of an even count; NIST/SEMATECH e-Handbook 1.3.5.1, from memory)
    expect(pitch).toEqual({ "tom:1": 140.5, "tom:2": 180, "crash:main": null });
  });
  it("reads the names together: counters are round robins only where the folder shows a series (names.ts parseNames)", () => {
    const c = catalogueSamples([
      ...[1, 2, 3].map((k) => ({ id: `x${k}`, path: `Snare B/Snare_Center_x${k}.wav`, measurement: measurement(SNARE, { strikeLufs: -20 }) })),
      ...[139, 512].map((k) => ({ id: `s${k}`, path: `Snare C/Snare_Center_s${k}.wav`, measurement: measurement(SNARE, { strikeLufs: -20 }) })),
    ]);
    const rr = Object.fromEntries(c.samples.map((e) => [e.id, e.name.roundRobin]));
    expect(rr).toEqual({ x1: 1, x2: 2, x3: 3, s139: null, s512: null });
  });
  it("the Dannenberg curve can be chosen instead of DLS", () => {
    const c = catalogueSamples(library(), { curve: { kind: "dannenberg" } });
    const snare = c.groups.find((g) => g.instrumentKey === "snare:14x6.5-brass")!;
    expect(snare.layers[0]!.nominalVelocity).toBe(1);
    expect(c.curve.kind).toBe("dannenberg");
  });
});

describe("soundFit: the families the sound weighed, for the sample page", () => {
  it("lists at most four, best first, drops those under 1 %, puts the chosen family first on a tie", () => {
    const fit = soundFit({ family: "china", familyScores: { crash: 0.4, china: 0.4, splash: 0.15, ride: 0.03, "hi-hat": 0.015, tom: 0.005 } });
    expect(fit).toEqual([
      { family: "china", fit: 0.4 },
      { family: "crash", fit: 0.4 },
      { family: "splash", fit: 0.15 },
      { family: "ride", fit: 0.03 },
    ]);
    expect(soundFit({ family: "kick", familyScores: { kick: 1, tom: 0.004 } })).toEqual([{ family: "kick", fit: 1 }]);
  });
  it("every catalogued sample keeps its sound's fit with the sound's family first (rules of thumb here)", () => {
    const cat = catalogueSamples(library(), RULES);
    for (const s of cat.samples) {
      expect(s.sound.fit[0]!.family).toBe(s.sound.family);
      for (const f of s.sound.fit) expect(f.fit).toBeGreaterThanOrEqual(0.01);
    }
    // the mislabelled file: named kick, the sound says crash, and the kick is not what the sound weighed first
    const kick = cat.samples.find((s) => s.path === "Kick_Hard_1.wav")!;
    expect(kick.family).toBe("kick");
    expect(kick.sound.fit[0]!.family).toBe("crash");
  });
});
