// Seeded, deterministic pseudo-random numbers for the drum synthesizer.
// Generator: Marsaglia's xor128 ("Xorshift RNGs", Journal of Statistical Software 8(14), 2003; from memory),
// seeded from a 32-bit FNV-1a hash of a text key (Fowler/Noll/Vo, as published in the IETF FNV draft; from memory)
// so that every take of every file gets its own reproducible stream, independent of generation order.

/** 32-bit FNV-1a over the UTF-16 code units of a string (ASCII keys hash as in the published test vectors). */
export function fnv1a32(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i) & 0xff;
    h = Math.imul(h, 0x01000193) >>> 0;
    const hi = text.charCodeAt(i) >>> 8;
    if (hi) {
      h ^= hi;
      h = Math.imul(h, 0x01000193) >>> 0;
    }
  }
  return h >>> 0;
}

export interface Rng {
  /** next raw 32-bit unsigned integer */
  nextU32(): number;
  /** uniform in [0, 1) */
  next(): number;
  /** uniform in [lo, hi) */
  range(lo: number, hi: number): number;
  /** standard normal (Box-Muller, one value per call, the pair's second half cached) */
  gauss(): number;
  /** integer in [0, n) */
  int(n: number): number;
  /** a child generator for a named sub-stream (independent of how much of this one was used) */
  fork(label: string): Rng;
}

const MARSAGLIA_STATE: readonly [number, number, number, number] = [123456789, 362436069, 521288629, 88675123];

/** Marsaglia's xor128 exactly as in the paper, from an explicit 4-word state (at least one word non-zero). */
export function xor128(state: readonly [number, number, number, number] = MARSAGLIA_STATE, key = "xor128"): Rng {
  let x = state[0] >>> 0;
  let y = state[1] >>> 0;
  let z = state[2] >>> 0;
  let w = state[3] >>> 0;
  if ((x | y | z | w) === 0) w = 0x9e3779b9;
  let spare: number | null = null;
  const rng: Rng = {
    nextU32() {
      const t = (x ^ (x << 11)) >>> 0;
      x = y;
      y = z;
      z = w;
      w = (w ^ (w >>> 19) ^ (t ^ (t >>> 8))) >>> 0;
      return w;
    },
    next() {
      return rng.nextU32() / 4294967296;
    },
    range(lo, hi) {
      return lo + (hi - lo) * rng.next();
    },
    gauss() {
      if (spare !== null) {
        const s = spare;
        spare = null;
        return s;
      }
      let u = rng.next();
      while (u <= 1e-12) u = rng.next();
      const v = rng.next();
      const r = Math.sqrt(-2 * Math.log(u));
      spare = r * Math.sin(2 * Math.PI * v);
      return r * Math.cos(2 * Math.PI * v);
    },
    int(n) {
      return Math.floor(rng.next() * n);
    },
    fork(label) {
      return rngFromKey(`${key}/${label}`);
    },
  };
  return rng;
}

/** Spread one 32-bit hash into four state words (a splitmix-style integer mixer; common practice). */
function mix32(a: number): number {
  a = (a + 0x9e3779b9) >>> 0;
  let z = a;
  z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
  z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
  return (z ^ (z >>> 16)) >>> 0;
}

/** A generator for a text key: the same key always gives the same stream. */
export function rngFromKey(key: string): Rng {
  const h = fnv1a32(key);
  const s0 = mix32(h);
  const s1 = mix32(s0 ^ 0x68e31da4);
  const s2 = mix32(s1 ^ 0xb5297a4d);
  const s3 = mix32(s2 ^ 0x1b56c4e9);
  const r = xor128([s0, s1, s2, s3], key);
  // discard a few outputs so that nearby keys decorrelate fully
  for (let i = 0; i < 8; i++) r.nextU32();
  return r;
}

/**
 * mulberry32: a tiny seeded generator with output in [0, 1), for repeatable test and benchmark data where the
 * stream need not be split (common practice; from memory: Tommy Ettinger's public-domain 32-bit generator).
 */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
