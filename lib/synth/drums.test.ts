import { describe, expect, it } from "vitest";
import { besselJ } from "./dsp";
import { MEMBRANE_MODES, membraneRatios, renderSound, type SoundSpec } from "./drums";
import { centroidHz, decaySeconds, dftMag, envelopeDb, magnitudeSpectrum, rmsDb, strongestPeakHz } from "./test-helpers";

const SR = 48000;
const TOM12: SoundSpec = { family: "tom", instrument: { diameterIn: 12, depthIn: 9, tuneHz: 136, floor: false }, articulation: "centre" };
const TOM10: SoundSpec = { family: "tom", instrument: { diameterIn: 10, depthIn: 8, tuneHz: 172, floor: false }, articulation: "centre" };
const TOM16: SoundSpec = { family: "tom", instrument: { diameterIn: 16, depthIn: 16, tuneHz: 88, floor: true }, articulation: "centre" };
const SNARE: SoundSpec = { family: "snare", instrument: { diameterIn: 14, depthIn: 6.5, tuneHz: 195, shell: "brass" }, articulation: "centre" };
const KICK: SoundSpec = { family: "kick", instrument: { diameterIn: 22, depthIn: 18, tuneHz: 55, beater: "felt" }, articulation: "centre" };
const hat = (a: "closed" | "quarter-open" | "half-open" | "open"): SoundSpec => ({ family: "hi-hat", instrument: { diameterIn: 14 }, articulation: a });

/** Bessel's integral J_m(x) = (1/pi) int_0^pi cos(m t - x sin t) dt (Abramowitz & Stegun 9.1.21), Simpson's rule. */
function besselIntegral(m: number, x: number): number {
  const n = 2000;
  const h = Math.PI / n;
  let s = 0;
  for (let i = 0; i <= n; i++) {
    const t = i * h;
    const w = i === 0 || i === n ? 1 : i % 2 ? 4 : 2;
    s += w * Math.cos(m * t - x * Math.sin(t));
  }
  return (s * h) / 3 / Math.PI;
}

function zeroOf(m: number, near: number): number {
  let a = near - 0.3, b = near + 0.3;
  for (let i = 0; i < 60; i++) {
    const c = (a + b) / 2;
    if (Math.sign(besselIntegral(m, a)) === Math.sign(besselIntegral(m, c))) a = c; else b = c;
  }
  return (a + b) / 2;
}

describe("membrane acoustics", () => {
  it("besselJ matches tabulated values (Abramowitz & Stegun table 9.1; from memory)", () => {
    expect(besselJ(0, 1)).toBeCloseTo(0.7651976866, 9);
    expect(besselJ(1, 1)).toBeCloseTo(0.4400505857, 9);
    expect(besselJ(0, 5)).toBeCloseTo(-0.1775967713, 9);
  });

  it("mode table: Bessel zeros re-derived from Bessel's integral, ratios as published for the ideal membrane (Fletcher & Rossing ch. 3; from memory)", () => {
    for (const mode of MEMBRANE_MODES) expect(zeroOf(mode.m, mode.j)).toBeCloseTo(mode.j, 4);
    const r = membraneRatios();
    const published = [1, 1.59, 2.14, 2.30, 2.65, 2.92, 3.16, 3.50, 3.60, 3.65];
    published.forEach((p, i) => expect(Math.abs(r[i] - p)).toBeLessThan(0.006));
  });
});

describe("drums", () => {
  it("is deterministic for a seed and differs between round robins", () => {
    const a = renderSound(TOM12, { sampleRate: SR, velocity: 90, seed: "rr1", seconds: 0.5 });
    const b = renderSound(TOM12, { sampleRate: SR, velocity: 90, seed: "rr1", seconds: 0.5 });
    const c = renderSound(TOM12, { sampleRate: SR, velocity: 90, seed: "rr2", seconds: 0.5 });
    expect(Buffer.from(a[0].buffer).equals(Buffer.from(b[0].buffer))).toBe(true);
    expect(Buffer.from(a[1].buffer).equals(Buffer.from(b[1].buffer))).toBe(true);
    expect(Buffer.from(a[0].buffer).equals(Buffer.from(c[0].buffer))).toBe(false);
  });

  it("tom fundamentals fall in 70-300 Hz (tom range, from memory / common tuning practice), floor below rack", () => {
    const peaks = [TOM10, TOM12, TOM16].map((s) => {
      const x = renderSound(s, { sampleRate: SR, velocity: 80, seed: 1, channels: 1, seconds: 1 })[0];
      // body, after the glide has settled: 0.2-0.7 s
      return strongestPeakHz(x, SR, 50, 400, 0.2 * SR, 0.7 * SR, 1);
    });
    for (const p of peaks) {
      expect(p).toBeGreaterThanOrEqual(70);
      expect(p).toBeLessThanOrEqual(300);
    }
    // the tuning we asked for (within the 2 Hz analysis resolution and the take's random detune)
    expect(Math.abs(peaks[1] - 136) / 136).toBeLessThan(0.03);
    // toms are ordered from high to low pitch (common practice, no published source)
    expect(peaks[0]).toBeGreaterThan(peaks[1]);
    expect(peaks[1]).toBeGreaterThan(peaks[2]);
  });

  it("kick fundamental falls in 40-80 Hz (bass drum range, from memory: Fletcher & Rossing ch. 18)", () => {
    const x = renderSound(KICK, { sampleRate: SR, velocity: 100, seed: 1, channels: 1, seconds: 0.8 })[0];
    const p = strongestPeakHz(x, SR, 25, 200, 0.1 * SR, 0.6 * SR, 1);
    expect(p).toBeGreaterThanOrEqual(40);
    expect(p).toBeLessThanOrEqual(80);
  });

  it("a hard tom strike starts sharp and glides down (tension modulation, Fletcher & Rossing ch. 18; from memory)", () => {
    const x = renderSound(TOM16, { sampleRate: SR, velocity: 127, seed: 3, channels: 1, seconds: 1 })[0];
    const early = strongestPeakHz(x, SR, 70, 110, 0.002 * SR, 0.062 * SR, 0.25);
    const late = strongestPeakHz(x, SR, 70, 110, 0.4 * SR, 0.9 * SR, 0.25);
    expect(early).toBeGreaterThan(late * 1.02);
    const soft = renderSound(TOM16, { sampleRate: SR, velocity: 25, seed: 3, channels: 1, seconds: 1 })[0];
    const softEarly = strongestPeakHz(soft, SR, 70, 110, 0.002 * SR, 0.062 * SR, 0.25);
    expect(softEarly).toBeLessThan(early); // the glide grows with strike amplitude
  });

  it("harder strikes are brighter, not only louder: the spectral centroid rises with velocity (contact time, F&R ch. 18)", () => {
    // noise floor off, so that the instrument's own spectrum is compared (a -80 dBFS hiss lifts a quiet take's centroid)
    for (const s of [TOM12, SNARE, { family: "crash", instrument: { diameterIn: 18 }, articulation: "crash-hit" } as SoundSpec]) {
      const soft = renderSound(s, { sampleRate: SR, velocity: 30, seed: 5, channels: 1, seconds: 0.5, noiseFloorDbfs: null })[0];
      const hard = renderSound(s, { sampleRate: SR, velocity: 120, seed: 5, channels: 1, seconds: 0.5, noiseFloorDbfs: null })[0];
      const cs = centroidHz(soft, SR, 0, 4096);
      const ch = centroidHz(hard, SR, 0, 4096);
      expect(ch).toBeGreaterThan(cs * 1.15);
      expect(rmsDb(hard)).toBeGreaterThan(rmsDb(soft) + 10);
    }
  });

  it("a rim shot is louder and brighter than a centre hit at the same strength (common practice)", () => {
    const o = { sampleRate: SR, velocity: 100, seed: 8, channels: 1 as const, seconds: 0.5, noiseFloorDbfs: null };
    const centre = renderSound(SNARE, o)[0];
    const rim = renderSound({ ...SNARE, articulation: "rim-shot" } as SoundSpec, o)[0];
    const peakDb = (x: Float32Array) => 20 * Math.log10(x.reduce((m, v) => Math.max(m, Math.abs(v)), 0));
    expect(peakDb(rim)).toBeGreaterThan(peakDb(centre) + 1);
    // more high partials relative to the head's low modes: energy above 1 kHz over energy below
    const hiLo = (x: Float32Array) => {
      const mag = magnitudeSpectrum(x, 0, 8192);
      const k1 = Math.round((1000 * 8192) / SR);
      let lo = 0, hi = 0;
      mag.forEach((m, k) => { if (k < k1) lo += m * m; else hi += m * m; });
      return hi / lo;
    };
    expect(hiLo(rim)).toBeGreaterThan(hiLo(centre));
  });

  it("harder strikes rise faster (shorter contact): time from onset to half the early peak", () => {
    const rise = (velocity: number, seed: number) => {
      const cb: SoundSpec = { family: "cowbell", instrument: { lowHz: 560, highHz: 845 }, articulation: "hit" };
      const x = renderSound(cb, { sampleRate: SR, velocity, seed, channels: 1, seconds: 0.3, noiseFloorDbfs: null })[0];
      const head = Array.from(x.subarray(0, Math.round(0.02 * SR)), Math.abs);
      const max = Math.max(...head);
      const on = head.findIndex((v) => v > 0.01 * max);
      const half = head.findIndex((v) => v >= 0.5 * max);
      return ((half - on) / SR) * 1000;
    };
    const soft = [1, 2, 3].map((seed) => rise(20, seed));
    const hard = [1, 2, 3].map((seed) => rise(127, seed));
    expect(Math.min(...soft)).toBeGreaterThan(Math.max(...hard));
  });

  it("an edge strike excites the (1,1) mode more than a centre strike (J_1(0) = 0; F&R ch. 18)", () => {
    const ratio = (art: "centre" | "edge") => {
      const spec = { ...TOM12, articulation: art } as SoundSpec;
      const x = renderSound(spec, { sampleRate: SR, velocity: 40, seed: 9, channels: 1, seconds: 0.6 })[0];
      const f01 = strongestPeakHz(x, SR, 120, 150, 0.05 * SR, 0.5 * SR, 0.5);
      // (1,1) with our air loading: between the ideal 1.59 and about 1.8 times f01
      const f11 = strongestPeakHz(x, SR, f01 * 1.55, f01 * 1.85, 0.05 * SR, 0.5 * SR, 0.5);
      return dftMag(x, SR, f11, 0.05 * SR, 0.5 * SR) / dftMag(x, SR, f01, 0.05 * SR, 0.5 * SR);
    };
    expect(ratio("edge")).toBeGreaterThan(2 * ratio("centre"));
  });

  it("a crash rings for seconds; a closed hi-hat dies within 0.3 s; openness lengthens the hi-hat (common practice)", () => {
    const crash = renderSound({ family: "crash", instrument: { diameterIn: 18 }, articulation: "crash-hit" }, { sampleRate: SR, velocity: 110, seed: 1 });
    const decays = (["closed", "quarter-open", "half-open", "open"] as const).map((a) =>
      decaySeconds(renderSound(hat(a), { sampleRate: SR, velocity: 100, seed: 1 }), SR, 40));
    const crashDecay = decaySeconds(crash, SR, 40);
    expect(crashDecay).toBeGreaterThan(1.5);
    expect(decays[0]).toBeLessThan(0.3);
    expect(crashDecay).toBeGreaterThan(5 * decays[0]);
    for (let i = 1; i < decays.length; i++) expect(decays[i]).toBeGreaterThan(decays[i - 1]);
  });

  it("cymbal partials spread from hundreds of Hz to beyond 10 kHz; a closed hi-hat is bright (F&R ch. 20)", () => {
    const ride = renderSound({ family: "ride", instrument: { diameterIn: 21 }, articulation: "bow" }, { sampleRate: SR, velocity: 100, seed: 2, channels: 1, seconds: 1 })[0];
    const mag = magnitudeSpectrum(ride, 0, 8192);
    const band = (lo: number, hi: number) => {
      let e = 0;
      for (let k = Math.round((lo * 8192) / SR); k < Math.round((hi * 8192) / SR); k++) e += mag[k] * mag[k];
      return e;
    };
    const total = band(20, 20000);
    expect(band(300, 1000) / total).toBeGreaterThan(0.01); // low partials present
    expect(band(10000, 16000) / total).toBeGreaterThan(0.01); // and high ones
    expect(band(20, 200) / total).toBeLessThan(0.05); // little below the lowest radiating modes
    const closed = renderSound(hat("closed"), { sampleRate: SR, velocity: 100, seed: 2, channels: 1 })[0];
    expect(centroidHz(closed, SR, 0, 4096)).toBeGreaterThan(5000);
    const snare = renderSound(SNARE, { sampleRate: SR, velocity: 100, seed: 2, channels: 1 })[0];
    expect(centroidHz(closed, SR, 0, 4096)).toBeGreaterThan(centroidHz(snare, SR, 0, 4096));
  });

  it("cowbell: two strong inharmonic partials near 560 and 845 Hz, short decay", () => {
    const x = renderSound({ family: "cowbell", instrument: { lowHz: 560, highHz: 845 }, articulation: "hit" }, { sampleRate: SR, velocity: 100, seed: 1, channels: 1 })[0];
    expect(Math.abs(strongestPeakHz(x, SR, 450, 700, 0.01 * SR, 0.2 * SR, 1) - 560)).toBeLessThan(8);
    expect(Math.abs(strongestPeakHz(x, SR, 750, 1000, 0.01 * SR, 0.2 * SR, 1) - 845)).toBeLessThan(8);
    expect(decaySeconds([x], SR, 40)).toBeLessThan(0.8);
  });

  it("microphones: the overhead arrives later (d / 343 m/s) with less high-frequency energy; the room later still", () => {
    const opts = { sampleRate: SR, velocity: 110, seed: 4, channels: 1 as const, seconds: 0.6 };
    const onset = (x: Float32Array) => {
      let p = 0;
      for (const v of x) p = Math.max(p, Math.abs(v));
      return x.findIndex((v) => Math.abs(v) > p * 0.1);
    };
    const close = renderSound(SNARE, { ...opts, mic: "close" })[0];
    const oh = renderSound(SNARE, { ...opts, mic: "overhead" })[0];
    const room = renderSound(SNARE, { ...opts, mic: "room" })[0];
    const dOh = (onset(oh) - onset(close)) / SR;
    expect(dOh).toBeGreaterThan(0.002); // about 1 m more path: 2.9 ms
    expect(dOh).toBeLessThan(0.004);
    expect(onset(room)).toBeGreaterThan(onset(oh));
    expect(rmsDb(oh)).toBeLessThan(rmsDb(close));
    // more reverberant: the tail stands higher relative to the strike
    const tailRel = (x: Float32Array) => rmsDb(x, onset(x) + Math.round(0.35 * SR)) - rmsDb(x, onset(x), onset(x) + Math.round(0.05 * SR));
    expect(tailRel(room)).toBeGreaterThan(tailRel(close) + 3);
    expect(centroidHz(oh, SR, onset(oh), 4096)).toBeLessThan(centroidHz(close, SR, onset(close), 4096));
    expect(centroidHz(room, SR, onset(room), 4096)).toBeLessThan(centroidHz(oh, SR, onset(oh), 4096));
  });

  it("round robins differ in level by a natural spread (about +-1 dB), not by a fixed step", () => {
    const peaks = [1, 2, 3, 4, 5, 6].map((seed) => {
      const x = renderSound(SNARE, { sampleRate: SR, velocity: 90, seed, channels: 1, seconds: 0.3 })[0];
      return rmsDb(x, 0, 0.1 * SR);
    });
    const spread = Math.max(...peaks) - Math.min(...peaks);
    expect(spread).toBeGreaterThan(0.2);
    expect(spread).toBeLessThan(6);
  });

  it("rejects a velocity outside 1-127 and an absurd sample rate", () => {
    expect(() => renderSound(SNARE, { sampleRate: SR, velocity: 0, seed: 1 })).toThrow(RangeError);
    expect(() => renderSound(SNARE, { sampleRate: SR, velocity: 128, seed: 1 })).toThrow(RangeError);
    expect(() => renderSound(SNARE, { sampleRate: 10, velocity: 64, seed: 1 })).toThrow(RangeError);
  });
});
