import { describe, expect, it } from "vitest";
import { decodeWav, measure } from "../audio";
import { monoMix } from "../audio/measure";
import { lowPeakHz } from "../audio/spectral";
import { FAMILIES, FAMILY_ARTICULATIONS } from "../catalogue/taxonomy";
import { renderVariety, VARIETY_KINDS, varietyFiles, varietyInstruments, type VarietyFile } from "./varieties";
import { encodeWav } from "./wav";

const FILES = varietyFiles(1);
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const close = (f: VarietyFile): VarietyFile => ({ ...f, mic: "close" });
/** lib/audio's measurement of a rendered file, as an upload is measured */
const measured = (f: VarietyFile) => measure(decodeWav(encodeWav(renderVariety(f), { sampleRate: f.sampleRate, bits: 24 })));
/** T20 (lib/audio's Schroeder backward integration, ISO 3382-style), else its early decay time */
const decay = (f: VarietyFile) => {
  const m = measured(f);
  return m.t20Sec ?? m.edtSec ?? NaN;
};

describe("training varieties (lib/synth/varieties.ts)", () => {
  it("are deterministic from the seed, and another seed gives other instruments", () => {
    expect(varietyFiles(1)).toEqual(FILES);
    const f = FILES.find((x) => x.instrument.kind === "snare")!;
    expect(Array.from(renderVariety(f)[0]!)).toEqual(Array.from(renderVariety(f)[0]!));
    const a = varietyInstruments(1).map((i) => JSON.stringify(i.params));
    const b = varietyInstruments(2).map((i) => JSON.stringify(i.params));
    expect(a.filter((x, i) => x === b[i]).length).toBe(0);
  });

  it("cover every family of the taxonomy but the stack, each with several distinct instruments", () => {
    const insts = varietyInstruments(1);
    for (const fam of FAMILIES.filter((x) => x !== "stack")) {
      const mine = insts.filter((i) => i.family === fam);
      expect(mine.length, fam).toBeGreaterThanOrEqual(4);
      expect(new Set(mine.map((i) => JSON.stringify(i.params))).size, fam).toBe(mine.length);
    }
    expect(new Set(insts.map((i) => i.id)).size).toBe(insts.length);
    expect(new Set(insts.map((i) => i.kind))).toEqual(new Set(VARIETY_KINDS));
    // electronic voices among the drums and metals
    for (const fam of ["kick", "snare", "tom", "hi-hat", "crash", "cowbell"]) expect(insts.some((i) => i.family === fam && i.electronic), fam).toBe(true);
  });

  it("label every file with its instrument's family and a stroke the taxonomy allows for it", () => {
    for (const f of FILES) {
      expect(f.family).toBe(f.instrument.family);
      expect(FAMILY_ARTICULATIONS[f.family], f.id).toContain(f.articulation);
    }
    const strokes = (fam: string) => new Set(FILES.filter((f) => f.family === fam).map((f) => f.articulation));
    for (const a of ["centre", "rim-shot", "cross-stick"]) expect(strokes("snare")).toContain(a);
    for (const a of ["closed", "pedal", "open", "half-open"]) expect(strokes("hi-hat")).toContain(a);
    for (const a of ["bow", "bell"]) expect(strokes("ride")).toContain(a);
    for (const a of ["open-tone", "slap"]) expect(strokes("hand-drum")).toContain(a);
    // formats, microphones and strengths vary
    expect(new Set(FILES.map((f) => f.sampleRate))).toEqual(new Set([44100, 48000]));
    expect(new Set(FILES.map((f) => f.channels))).toEqual(new Set([1, 2]));
    expect(new Set(FILES.map((f) => f.mic))).toEqual(new Set(["close", "overhead", "room"]));
    expect(Math.min(...FILES.map((f) => f.velocity))).toBeLessThan(60);
  });

  it("render files of the planned length and format, peaking below full scale", () => {
    for (const f of FILES.filter((_, i) => i % 25 === 0)) {
      const chs = renderVariety(f);
      expect(chs.length).toBe(f.channels);
      expect(chs[0]!.length).toBe(Math.round(f.seconds * f.sampleRate));
      const peak = Math.max(...chs.map((c) => c.reduce((m, x) => Math.max(m, Math.abs(x)), 0)));
      expect(peak, f.id).toBeGreaterThan(0.001);
      expect(peak, f.id).toBeLessThan(1);
    }
  });

  // the electronic kick's definition (a sine with an exponential pitch fall: common practice of synthesis), measured
  it("an electronic kick's pitch falls (lib/audio's low spectral peak, strike window vs 150 ms later)", () => {
    const kicks = FILES.filter((f) => f.instrument.kind === "e-kick" && f.seed.endsWith(":0"));
    expect(kicks.length).toBeGreaterThanOrEqual(4);
    for (const f of kicks) {
      const mono = monoMix(renderVariety(close(f)));
      const pre = Math.round(0.002 * f.sampleRate);
      const early = lowPeakHz(mono, pre, 1024, f.sampleRate)!;
      const late = lowPeakHz(mono, pre + Math.round(0.15 * f.sampleRate), 4096, f.sampleRate)!;
      // the sine settles at its end frequency (within a 4096-point bin), from well above it
      expect(Math.abs(late - Number(f.instrument.params.endHz)), f.id).toBeLessThan(f.sampleRate / 4096);
      expect(early, f.id).toBeGreaterThan(1.3 * late);
    }
  });

  // smaller plates ring shorter (Fletcher & Rossing ch. 20; memory); the china's quicker decay is common practice
  it("a splash dies faster than a crash, a china faster than a crash (common practice; lib/audio T20)", () => {
    const hits = (kind: string) => FILES.filter((f) => f.instrument.kind === kind && f.articulation === "crash-hit" && f.seed.endsWith(":0"))
      .map((f) => decay({ ...close(f), seconds: 4 }));
    const splash = hits("splash"), crash = hits("crash"), china = hits("china");
    expect(Math.max(...splash)).toBeLessThan(Math.min(...crash));
    expect(median(china)).toBeLessThan(median(crash));
  });

  // a closed hat is damped within about a tenth of a second, an open one rings (common practice)
  it("an electronic hi-hat's closed stroke is shorter than its open one (lib/audio T20)", () => {
    for (const inst of varietyInstruments(1).filter((i) => i.kind === "e-hat").slice(0, 3)) {
      const mine = FILES.filter((f) => f.instrument.id === inst.id);
      const closed = decay({ ...close(mine.find((f) => f.articulation === "closed")!), seconds: 1.5 });
      const open = decay({ ...close(mine.find((f) => f.articulation === "open")!), seconds: 1.5 });
      expect(closed, inst.id).toBeLessThan(open / 2);
    }
  });
});
