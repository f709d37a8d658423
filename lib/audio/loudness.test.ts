import { describe, expect, it } from "vitest";
import { channelWeights, loudness } from "./loudness";
import { concat, dbToAmp, sine } from "./signals";

const fs = 48000;
const stereo = (x: Float32Array) => [x, x];
const tone = (db: number, sec: number) => sine(fs, sec, 1000, dbToAmp(db));

describe("BS.1770-4 loudness against EBU Tech 3341 (v3) test cases (stereo 1 kHz sine, 48 kHz)", () => {
  it("case 1: -23 dBFS for 20 s -> M max and I = -23.0 +-0.1 LUFS", () => {
    const r = loudness(stereo(tone(-23, 20)), fs);
    expect(Math.abs(r.maxMomentaryLufs + 23)).toBeLessThanOrEqual(0.1);
    expect(Math.abs(r.integratedLufs! + 23)).toBeLessThanOrEqual(0.1);
  });
  it("case 2: -33 dBFS for 20 s -> I = -33.0 +-0.1 LUFS", () => {
    const r = loudness(stereo(tone(-33, 20)), fs);
    expect(Math.abs(r.integratedLufs! + 33)).toBeLessThanOrEqual(0.1);
  });
  it("case 3: -36/-23/-36 dBFS for 10/60/10 s -> I = -23.0 +-0.1 (relative gate at work; ungated about -24.2)", () => {
    const r = loudness(stereo(concat(tone(-36, 10), tone(-23, 60), tone(-36, 10))), fs);
    expect(Math.abs(r.integratedLufs! + 23)).toBeLessThanOrEqual(0.1);
    const ungated = -0.691 + 10 * Math.log10(r.blockPowers.reduce((a, b) => a + b, 0) / r.blockPowers.length);
    expect(Math.abs(ungated + 24.2)).toBeLessThanOrEqual(0.1);
  });
  it("case 5: -26/-20/-26 dBFS for 20/20.1/20 s -> I = -23.0 +-0.1", () => {
    const r = loudness(stereo(concat(tone(-26, 20), tone(-20, 20.1), tone(-26, 20))), fs);
    expect(Math.abs(r.integratedLufs! + 23)).toBeLessThanOrEqual(0.1);
  });
  it("case 13: 0.4 s bursts at -23 dBFS between silences -> max momentary = -23.0 +-0.1", () => {
    const parts: Float32Array[] = [];
    for (let k = 0; k < 10; k++) parts.push(tone(-23, 0.4), new Float32Array(Math.round(0.6 * fs)));
    const r = loudness(stereo(concat(...parts)), fs);
    expect(Math.abs(r.maxMomentaryLufs + 23)).toBeLessThanOrEqual(0.1);
  });
  it("a 0 dBFS 997 Hz sine in one channel reads -3.01 LKFS (BS.1770-4, computed from the +0.691 dB gain)", () => {
    const r = loudness([sine(fs, 5, 997, 1)], fs);
    expect(r.integratedLufs!).toBeCloseTo(-3.01, 1);
  });
  it("absolute gate: -80 dBFS tone is gated out entirely (BS.1770-4 -70 LKFS gate)", () => {
    expect(loudness(stereo(tone(-80, 5)), fs).integratedLufs).toBeNull();
  });
  it("channel weights per BS.1770-4: L R C 1.0, surrounds 1.41, LFE excluded", () => {
    expect(channelWeights(6)).toEqual([1, 1, 1, 0, 1.41, 1.41]);
    expect(channelWeights(6, 0x3f)).toEqual([1, 1, 1, 0, 1.41, 1.41]);
    expect(channelWeights(2)).toEqual([1, 1]);
  });
});
