import { describe, expect, it } from "vitest";
import { fnv1a32, mulberry32, rngFromKey, xor128 } from "./rng";

describe("seeded random numbers", () => {
  it("xor128 from the paper's initial state gives its first output (Marsaglia, Xorshift RNGs, 2003; from memory)", () => {
    // x=123456789, y=362436069, z=521288629, w=88675123: first value 3701687786 (from memory)
    expect(xor128().nextU32()).toBe(3701687786);
  });

  it("FNV-1a 32-bit matches the published test vectors (FNV draft test suite; from memory)", () => {
    expect(fnv1a32("")).toBe(0x811c9dc5);
    expect(fnv1a32("a")).toBe(0xe40c292c);
    expect(fnv1a32("foobar")).toBe(0xbf9cf968);
  });

  it("same key gives the same stream; another key another stream", () => {
    const a = rngFromKey("snare|v3|rr2");
    const b = rngFromKey("snare|v3|rr2");
    const c = rngFromKey("snare|v3|rr3");
    const sa = Array.from({ length: 16 }, () => a.nextU32());
    const sb = Array.from({ length: 16 }, () => b.nextU32());
    const sc = Array.from({ length: 16 }, () => c.nextU32());
    expect(sa).toEqual(sb);
    expect(sa).not.toEqual(sc);
  });

  it("uniform has mean 1/2 and variance 1/12; gauss has mean 0 and variance 1 (textbook moments)", () => {
    const r = rngFromKey("moments");
    const n = 200_000;
    let s = 0, s2 = 0, g = 0, g2 = 0, lo = 1, hi = 0;
    for (let i = 0; i < n; i++) {
      const u = r.next();
      lo = Math.min(lo, u);
      hi = Math.max(hi, u);
      s += u; s2 += u * u;
      const z = r.gauss();
      g += z; g2 += z * z;
    }
    expect(lo).toBeGreaterThanOrEqual(0);
    expect(hi).toBeLessThan(1);
    expect(s / n).toBeCloseTo(0.5, 2);
    expect(s2 / n - (s / n) ** 2).toBeCloseTo(1 / 12, 3);
    expect(g / n).toBeCloseTo(0, 1);
    expect(g2 / n).toBeGreaterThan(0.98);
    expect(g2 / n).toBeLessThan(1.02);
  });

  it("forks are independent of how much of the parent was used", () => {
    const a = rngFromKey("k");
    const b = rngFromKey("k");
    for (let i = 0; i < 10; i++) b.next();
    expect(a.fork("x").next()).toBe(b.fork("x").next());
  });
});

describe("mulberry32", () => {
  it("is repeatable for a seed, stays in [0, 1) and is uniform on average (textbook moments: mean 1/2, variance 1/12)", () => {
    const a = mulberry32(42);
    const b = mulberry32(42);
    const xs = Array.from({ length: 20_000 }, () => a());
    expect(Array.from({ length: 5 }, () => b())).toEqual(xs.slice(0, 5));
    expect(xs.every((x) => x >= 0 && x < 1)).toBe(true);
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    const variance = xs.reduce((s, x) => s + (x - mean) ** 2, 0) / xs.length;
    expect(mean).toBeCloseTo(0.5, 2);
    expect(variance).toBeCloseTo(1 / 12, 2);
    expect(mulberry32(43)()).not.toBe(mulberry32(42)());
  });
});
