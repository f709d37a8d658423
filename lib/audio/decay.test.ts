import { describe, expect, it } from "vitest";
import { analyseDecay } from "./decay";
import { onsetIndex } from "./onset";
import { hit, lcg } from "./signals";

const fs = 48000;

describe("decay by Schroeder backward integration (ISO 3382-1 ranges)", () => {
  // Handbook: amplitude e^(-t/tau) falls 8.6859 dB per tau, so T60 = 6.9078 tau.
  for (const tau of [0.05, 0.2, 0.6]) {
    it(`exponential decay tau = ${tau} s: EDT and T20 give T60 = 6.9078 tau within 2 %`, () => {
      const x = hit(fs, Math.min(12 * tau + 0.05, 8), { tau, f: 2000, noiseMix: 0.3, leadSec: 0.01 });
      const d = analyseDecay([x], fs, onsetIndex([x], fs));
      const t60 = 6.9078 * tau;
      expect(Math.abs(d.edtSec! / t60 - 1)).toBeLessThanOrEqual(0.02);
      expect(Math.abs(d.t20Sec! / t60 - 1)).toBeLessThanOrEqual(0.02);
    });
  }
  it("with a -80 dBFS noise floor T20 stays within 2 % (integration truncated above the floor)", () => {
    const tau = 0.15;
    const x = hit(fs, 2, { tau, f: 700, leadSec: 0.02, noiseDb: -80 });
    const d = analyseDecay([x], fs, onsetIndex([x], fs));
    expect(Math.abs(d.t20Sec! / (6.9078 * tau) - 1)).toBeLessThanOrEqual(0.02);
  });
  it("a file too short to fall 25 dB has no T20", () => {
    const x = hit(fs, 0.3, { tau: 1, f: 500 });
    expect(analyseDecay([x], fs, 0).t20Sec).toBeNull();
  });
});

describe("tail state and noise floor (our rule, see decay.ts; no published source)", () => {
  it("a hit decaying into a -75 dBFS noise floor is 'decayed' and the floor is measured near -75 dB", () => {
    const x = hit(fs, 1.5, { tau: 0.08, leadSec: 0.01, noiseDb: -75 });
    const d = analyseDecay([x], fs, onsetIndex([x], fs));
    expect(d.tail).toBe("decayed");
    expect(Math.abs(d.noiseFloorDbfs + 75)).toBeLessThan(1.5);
  });
  it("a hit decaying into digital silence is 'decayed'", () => {
    const x = hit(fs, 1.5, { tau: 0.05 });
    x.fill(0, Math.round(1.2 * fs));
    expect(analyseDecay([x], fs, 0).tail).toBe("decayed");
  });
  it("the same hit cut at 250 ms while still sounding is 'cut' (with a noisy lead-in)", () => {
    const x = hit(fs, 0.25, { tau: 0.3, leadSec: 0.01, noiseDb: -75 });
    expect(analyseDecay([x], fs, onsetIndex([x], fs)).tail).toBe("cut");
  });
  it("a hit cut while still sounding is 'cut' without any lead-in to learn the floor from", () => {
    const x = hit(fs, 0.6, { tau: 0.5, noiseDb: -80 });
    expect(analyseDecay([x], fs, 0).tail).toBe("cut");
  });
  it("a sustained tone cut off (no decay at all, no lead-in) is 'cut', not mistaken for a noise floor", () => {
    const x = Float32Array.from({ length: Math.round(0.8 * fs) }, (_, i) => 0.5 * Math.sin((2 * Math.PI * 440 * i) / fs));
    expect(analyseDecay([x], fs, 0).tail).toBe("cut");
  });
  it("a long cymbal-like tail (T60 about 4 s) cut at 1.2 s is 'cut'", () => {
    const rnd = lcg(7);
    const x = Float32Array.from({ length: Math.round(1.2 * fs) }, (_, i) => 0.5 * Math.exp(-i / fs / 0.6) * rnd());
    expect(analyseDecay([x], fs, 0).tail).toBe("cut");
  });
});

describe("tail: cut or faded out (our rule, see decay.ts; no published source)", () => {
  // Envelopes built here: amplitude e^(-t/tau) falls 8.6859 dB per tau (handbook), so a hit stopped
  // `db / 8.6859` taus after its strike stops `db` dB under it.
  const stopAt = (tau: number, db: number, lead = 0.01) => lead + (db / 8.6859) * tau;
  const fadeOut = (x: Float32Array, ms: number, shape: "linear" | "raised-cosine"): Float32Array => {
    const F = Math.round((ms / 1000) * fs);
    for (let k = 0; k < F; k++) {
      const u = (k + 1) / F; // the last sample reaches zero
      x[x.length - F + k] *= shape === "linear" ? 1 - u : 0.5 + 0.5 * Math.cos(Math.PI * u);
    }
    return x;
  };
  const decay = (x: Float32Array, opts = {}) => analyseDecay([x], fs, onsetIndex([x], fs), opts);
  /** a decaying tone of f Hz, amplitude 0.8 e^(-t/tau), `n` samples from its strike */
  const tone = (n: number, f: number, tau: number) => Float32Array.from({ length: n }, (_, i) => 0.8 * Math.exp(-i / fs / tau) * Math.sin((2 * Math.PI * f * i) / fs));

  for (const tau of [0.3, 1]) {
    it(`a tom-like hit (tau ${tau} s) stopped hard 20 dB under its peak is 'cut', and tailEndDb reads -20 dB (+-1)`, () => {
      const d = decay(hit(fs, stopAt(tau, 20), { tau, f: 180, leadSec: 0.01, noiseDb: -90 }));
      expect(d.tail).toBe("cut");
      expect(d.tailFaded).toBe(false);
      expect(Math.abs(d.tailEndDb + 20)).toBeLessThanOrEqual(1);
      // the floor is measured on the -90 dBFS lead-in; the hit peaks near -2 dBFS: about 68 dB above it
      expect(d.tailEndAboveFloorDb).toBeGreaterThan(60);
    });
  }
  for (const ms of [5, 10, 20, 50]) {
    for (const shape of ["linear", "raised-cosine"] as const) {
      it(`the same hit still ringing 20 dB under its peak, with a ${ms} ms ${shape} fade at the end, is 'decayed' (a deliberate fade)`, () => {
        const d = decay(fadeOut(hit(fs, stopAt(0.3, 20), { tau: 0.3, f: 180, leadSec: 0.01, noiseDb: -90 }), ms, shape));
        expect(d.tailFaded).toBe(true);
        expect(d.tail).toBe("decayed");
        // after a fade the level at the stop is the last millisecond's: far under the -20 dB it was ringing at
        expect(d.tailEndDb).toBeLessThan(-32);
      });
    }
  }
  it("a fade of under a millisecond is no fade: the hit is still 'cut'", () => {
    const d = decay(fadeOut(hit(fs, stopAt(0.3, 20), { tau: 0.3, f: 180, leadSec: 0.01, noiseDb: -90 }), 0.5, "linear"));
    expect(d.tail).toBe("cut");
  });
  it("a stop 70 dB under the peak is 'decayed' (inaudible), 50 dB under it is 'cut' (digital silence around, no noise)", () => {
    const deep = decay(hit(fs, stopAt(0.05, 70), { tau: 0.05, f: 180, leadSec: 0.01 }));
    expect(deep.tail).toBe("decayed");
    expect(deep.tailEndDb).toBeLessThan(-65);
    expect(decay(hit(fs, stopAt(0.05, 50), { tau: 0.05, f: 180, leadSec: 0.01 })).tail).toBe("cut");
  });
  it("a hit decaying into stationary noise 52 dB under its peak (closer than 60 dB) is 'decayed': it ends at its floor", () => {
    const d = decay(hit(fs, 1.5, { tau: 0.05, f: 180, leadSec: 0.01, noiseDb: -50 }));
    expect(d.tail).toBe("decayed");
    expect(d.tailEndDb).toBeGreaterThan(-60); // the 60 dB range alone would call it cut
    expect(Math.abs(d.tailEndAboveFloorDb!)).toBeLessThan(2);
  });
  it("a hit stopped 25 dB under its peak, 38 dB above a -70 dBFS floor, is 'cut' with both levels reported", () => {
    const d = decay(hit(fs, stopAt(0.3, 25), { tau: 0.3, f: 180, leadSec: 0.01, noiseDb: -70 }));
    expect(d.tail).toBe("cut");
    expect(Math.abs(d.tailEndDb + 25)).toBeLessThanOrEqual(1);
    // the hit (0.8 x (0.8 sine + 0.2 uniform noise)) starts at 10 log10(0.64 (0.8^2 / 2 + 0.2^2 / 3)) = -6.7 dBFS mean
    // square: the stop at -31.7 dBFS is 38.3 dB above the -70 dBFS floor
    expect(Math.abs(d.tailEndAboveFloorDb! - 38.3)).toBeLessThanOrEqual(1.5);
  });
  it("a 50 Hz kick tone stopped 25 dB down is 'cut' at -25 dB (+-1.5) whatever its phase, zero crossings included", () => {
    const tau = 0.3, f = 50;
    const n0 = Math.round((Math.round(((25 / 8.6859) * tau) * f) / f) * fs); // a whole number of periods: ends on a zero crossing
    for (let k = 0; k < 8; k++) {
      const d = decay(tone(n0 + Math.round((k / 8) * (fs / f)), f, tau));
      expect(d.tail, `phase ${k}/8`).toBe("cut");
      expect(d.tailFaded).toBe(false);
      expect(Math.abs(d.tailEndDb + 25), `phase ${k}/8`).toBeLessThanOrEqual(1.5);
    }
  });
  it("the same kick tone faded out over its last 20 or 50 ms (one or more periods) is 'decayed'", () => {
    const n = Math.round((25 / 8.6859) * 0.3 * fs);
    for (const ms of [20, 50]) expect(decay(fadeOut(tone(n, 50, 0.3), ms, "linear")).tail).toBe("decayed");
  });
  it("an 80 ms hi-hat chick faded out and ending in exact zeros is 'decayed'; the zeros are not read as the end", () => {
    const rnd = lcg(3);
    const n = Math.round(0.08 * fs);
    const chick = Float32Array.from({ length: n }, (_, i) => 0.7 * Math.exp(-i / fs / 0.015) * rnd());
    const faded = new Float32Array(n);
    faded.set(fadeOut(chick.slice(0, n - Math.round(0.005 * fs)), 10, "linear")); // 5 ms of digital silence after the fade
    const d = decay(faded);
    expect(d.tail).toBe("decayed");
    expect(d.tailFaded).toBe(true);
    // an 80 ms chick that simply dies away (tau 8 ms: 87 dB down at the end) is 'decayed' too
    expect(decay(Float32Array.from({ length: n }, (_, i) => 0.7 * Math.exp(-i / fs / 0.008) * rnd())).tail).toBe("decayed");
  });
  it("a chick stopped hard 23 dB down and then padded with 40 ms of exact zeros is 'cut': the silence after does not hide the stop", () => {
    const rnd = lcg(3);
    const n = Math.round(0.08 * fs);
    const x = new Float32Array(n);
    for (let i = 0; i < Math.round(0.04 * fs); i++) x[i] = 0.7 * Math.exp(-i / fs / 0.015) * rnd(); // 40 ms / 15 ms x 8.6859 = 23 dB
    const d = decay(x);
    expect(d.tail).toBe("cut");
    expect(d.tailEndDb).toBeGreaterThan(-25);
  });
  it("an integer PCM file: a stop within 10 dB of 1 LSB is digital silence (8-bit: 1 LSB is -42.1 dBFS)", () => {
    const x = hit(fs, 0.25, { tau: 0.05, f: 300 }).map((v) => Math.round(v * 128) / 128); // quantised to 8 bits
    expect(decay(x, { pcmBits: 8 }).tail).toBe("decayed");
    // the same samples read as 16-bit are 48 dB above its 1 LSB: the stop is the sound's
    expect(decay(x, { pcmBits: 16 }).tail).toBe("cut");
  });
});
