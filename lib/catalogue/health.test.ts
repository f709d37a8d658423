import { describe, expect, it } from "vitest";
import { conflictHealth, fileHealth, layerHealth, sortFindings, type HealthSample } from "./health";
import { measurement } from "./test-helpers";
import type { Measurement } from "../audio/types";

const s = (id: string, over: Partial<Measurement> = {}, sha256?: string): HealthSample => ({ id, path: `${id}.wav`, sha256, measurement: measurement({}, over) });
const fmt = (p: Partial<Measurement["format"]>): Partial<Measurement> => ({ format: { ...measurement().format, ...p } });

describe("fileHealth: one finding per defect (thresholds: common practice unless a standard is named)", () => {
  it("clean files give no findings", () => {
    expect(fileHealth([s("a"), s("b", {}, "h2")])).toEqual([]);
  });
  it("mixed sample rates, bit depths and channel counts name the minority files", () => {
    const f = fileHealth([s("a"), s("b"), s("c", fmt({ sampleRate: 48000 })), s("d", fmt({ validBits: 16, bitsPerSample: 16 })), s("e", fmt({ channels: 1 }))]);
    expect(f.find((x) => x.code === "mixed-sample-rate")).toMatchObject({ sampleIds: ["c"], severity: "warning" });
    expect(f.find((x) => x.code === "mixed-sample-rate")!.message).toMatch(/4 at 44\.1 kHz, 1 at 48 kHz/);
    expect(f.find((x) => x.code === "mixed-bit-depth")!.sampleIds).toEqual(["d"]);
    expect(f.find((x) => x.code === "mixed-channels")!.message).toMatch(/mono/);
  });
  it("duplicates by hash", () => {
    const f = fileHealth([s("a", {}, "x"), s("b", {}, "y"), s("c", {}, "x")]);
    expect(f).toEqual([expect.objectContaining({ code: "duplicate", sampleIds: ["a", "c"] })]);
  });
  it("clipping, true-peak over 0 dBTP (BS.1770-4 Annex 2), DC offset, late onset (> 10 ms), cut tail, truncated", () => {
    const f = fileHealth([
      s("clip", { clippedRuns: 2, clippedSamples: 9 }),
      s("tp", { truePeakDbtp: 0.4 }),
      s("tp0", { truePeakDbtp: 0 }),
      s("dc", { dcOffset: -0.01 }),
      s("late", { onsetMs: 25 }),
      s("ontime", { onsetMs: 9.9 }),
      s("cut", { tail: "cut" }),
      s("short", { truncated: true }),
    ]);
    const codes = Object.fromEntries(f.map((x) => [x.sampleIds[0], x.code]));
    expect(codes).toEqual({ clip: "clipping", tp: "true-peak-over", dc: "dc-offset", late: "late-onset", cut: "cut-tail", short: "truncated" });
    expect(f.find((x) => x.code === "dc-offset")!.message).toMatch(/-40 dBFS/);
    expect(f.find((x) => x.code === "late-onset")!.message).toMatch(/25 ms.*few milliseconds/);
    expect(f.find((x) => x.code === "clipping")!.severity).toBe("error");
  });
  it("a cut tail says in plain words where the sound stops: dB under its peak and above the noise floor (decay.ts rule)", () => {
    const msg = (over: Partial<Measurement>) => fileHealth([s("t", { tail: "cut", ...over })]).find((x) => x.code === "cut-tail")!.message;
    expect(msg({ tailEndDb: -31.2, tailEndAboveFloorDb: 40.4 })).toBe(
      "t.wav: the tail is cut off: the sound stops abruptly 31 dB below its peak, still 40 dB above the noise floor. Keep the full decay or fade it out.",
    );
    expect(msg({ tailEndDb: -44.6, tailEndAboveFloorDb: null })).toMatch(/stops abruptly 45 dB below its peak, no noise floor could be measured/);
    // a lead-in of exact zeros is a floor of digital silence: no "150 dB above the noise floor"
    expect(msg({ tailEndDb: -33.1, tailEndAboveFloorDb: 149.5, noiseFloorDbfs: -200 })).toMatch(/stops abruptly 33 dB below its peak, into digital silence \(the file has no noise floor\)\./);
    // a measurement from before MEASURE_VERSION 2 has no level at the stop: the finding still reads plainly
    expect(msg({})).toMatch(/^t\.wav: the tail is cut off before it decays to the noise floor/);
    // a faded or decayed tail is no finding, whatever its level at the stop
    expect(fileHealth([s("f", { tail: "decayed", tailEndDb: -38, tailEndAboveFloorDb: 45 })])).toEqual([]);
  });
  it("distant mics may start later: sound travels ~0.34 m/ms (physics), a room mic 10 m away hears the hit ~29 ms late", () => {
    const room = (id: string, onsetMs: number, mic: string | null): HealthSample => ({ ...s(id, { onsetMs }), mic });
    const f = fileHealth([room("room14", 14, "room"), room("room45", 45, "room"), room("close14", 14, "close"), room("oh20", 20, "overhead")]);
    expect(f.filter((x) => x.code === "late-onset").map((x) => x.sampleIds[0])).toEqual(["room45", "close14"]);
  });
  it("sortFindings puts errors first", () => {
    const f = sortFindings(fileHealth([s("late", { onsetMs: 25 }), s("clip", { clippedRuns: 1, clippedSamples: 3 })]));
    expect(f.map((x) => x.code)).toEqual(["clipping", "late-onset"]);
  });
});

describe("layer and conflict findings", () => {
  it("layer issues carry the group label", () => {
    const f = layerHealth("Snare / centre", [{ code: "missing-layer", sampleIds: ["b", "a"], message: "v3 is missing." }]);
    expect(f).toEqual([{ code: "missing-layer", severity: "warning", sampleIds: ["a", "b"], message: "Snare / centre: v3 is missing." }]);
  });
  it("only strong name/sound conflicts become findings", () => {
    const f = conflictHealth([
      { id: "a", conflict: { level: "strong", message: "Named kick but sounds like crash." } },
      { id: "b", conflict: { level: "mild", message: "x" } },
    ]);
    expect(f).toEqual([expect.objectContaining({ code: "name-sound-conflict", sampleIds: ["a"] })]);
  });
});
