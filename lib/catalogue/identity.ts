// Over 300 lines: the hit distance, its parameters, the clustering and the split they drive: one argument.
// Instrument identity: are two measured hits the same drum, or two drums? Round robins are takes of ONE drum
// at one strength, so a folder of different drums (one hit each, names that say nothing) must not become one
// instrument with many round robins. This file holds a documented distance between two hits and an
// agglomerative clustering (average linkage) that splits a group of samples named alike into the drums its
// sound says it holds. Pure.
//
// What a hit is compared on (Measurement fields, lib/audio/types.ts):
//   - the spectral envelope of the strike (first 80 ms) and of the body, from the 24 Bark bands. Each band
//     value is a power law of the band's amplitude sum (x^0.23, as meyda's loudness feature), so
//     (20 / 0.23) log10(band) is the band level in dB plus a constant. The envelope is taken relative to its
//     loudest band and floored 40 dB below it: a change of level alone moves every band by the same amount
//     and leaves the envelope exactly as it was. (The MFCCs are not used: they take log(1 + energy), which is
//     not free of level for quiet bands, so a soft copy of a hit would differ from its loud copy.)
//   - the pitch of the body (semitones) and the decay (EDT, else T20, in octaves of time).
//
// Loudness. A harder stroke is louder AND brighter (a shorter stick or beater contact excites higher modes:
// Hertzian contact, K. L. Johnson, Contact Mechanics ch. 11, from memory), and a soft hit's quiet bands sit
// nearer the noise floor, which also reshapes its envelope. So the part of an envelope difference that a
// loudness gap can explain is discounted: the difference between the two envelopes (dB per band) loses its
// mean, its tilt and its bend across the bands (shapeResidualDb), tilt and bend each allowed up to
// tiltFreeDb plus tiltPerDb for every dB of strike-loudness gap (either sign), and only the RMS of what is left
// counts. Two hits at one loudness get little shape for free; a soft and a hard hit of one drum get the
// brightness change their gap explains, not other resonances or another click. The envelope scales also grow
// by scalePerDb per dB of gap, and pitch and decay get a small allowance per dB (tension modulation raises a
// hard hit's pitch a little; a soft hit's decay is read nearer the floor).
//
// The distance: each of the four terms (strike envelope, body envelope, pitch, decay) is divided by its
// take-to-take scale and capped (termCap; pitch at pitchCap, since a pitch reading can jump to another mode of
// the drum), and the distance is the root mean square of the terms present (pitch only when both hits have
// one). Where a group is cut (splitDistance) was set on real recordings, the open corpus built from Debian's
// fluid-soundfont-gm: its 17 distinct kick and 18 distinct snare recordings, each with copies at -6 and -18 dB,
// first join (average linkage) at 1.16 (kicks) and 1.50 (snares). Sound splits above 1.05. Our generator's
// kicks hold together below that (round robins and five layers over 30 dB: at most 0.89, except through an
// overhead microphone whose pitch reading jumps between takes: 1.40); its snare and tom takes differ more
// (1.1 to 1.9: it draws the high membrane modes afresh for every take), so they hold together through their
// names (below), not through their sound alone.
//
// Names. Sound only ever splits a group that the names (and splitByPitch) made; it never joins groups the
// names keep apart. When both hits' names mark them as one series of one drum (an explicit velocity or
// round-robin mark: v3, vel 2, pp/ff, soft/hard, rr2, take 3; or a drum size or index in the instrument's
// name: 14x6.5, 22in, tom 2) their distance is divided by seriesDiscount (3), so only a gross disagreement
// splits them. Bare numbers (kick_01 .. kick_16) mark nothing: packs of different one-shots are numbered so.
//
// Which drums: membranes and other pitched percussion (kick, snare, tom, hand drum, cowbell). Cymbals,
// hi-hats, shakers and the rest change from hit to hit with where and how they are struck and how open the
// hat is, and the corpus holds too few of them to set a threshold: for those the names decide.
//
// Clustering: average linkage (UPGMA, Sokal & Michener 1958) by the nearest-neighbour chain algorithm
// (Murtagh 1983; exact for average linkage, O(n^2) time and memory), cut at splitDistance. Only hits of one
// cell (the same microphone, and the same articulation when a name or a person gave it) are compared: a rim
// shot and a centre hit of one drum do not sound alike, nor do its close and room microphones.

import type { Measurement, SpectralSummary } from "../audio/types";
import { decaySec } from "./features";
import type { Instrument } from "./instruments";
import type { NameInfo } from "./names";
import type { Family } from "./taxonomy";

export interface IdentityParams {
  /** Envelope floor relative to the loudest band (dB): quieter bands count as this. */
  floorDb: number;
  /** Bark bands averaged into one envelope band. */
  bandWidth: number;
  /** Tilt (dB from the lowest to the highest Bark band) two hits may differ by at equal loudness. */
  tiltFreeDb: number;
  /** Further tilt allowed per dB of strike-loudness gap. */
  tiltPerDb: number;
  /** Take-to-take scales of the four terms. */
  scale: { strikeDb: number; bodyDb: number; pitchSt: number; decayOct: number };
  /** Pitch (semitones) and decay (octaves of time) allowed per dB of strike-loudness gap. */
  pitchPerDb: number;
  decayPerDb: number;
  /** Largest value one scaled term may take: no single reading splits a group on its own. */
  termCap: number;
  /** Largest value the scaled pitch term may take (a pitch reading can jump to another mode of the drum). */
  pitchCap: number;
  /** Also remove a bend (second-order shape) within the same bounds. */
  bend: boolean;
  /** Envelope scales grow by this fraction per dB of strike-loudness gap. */
  scalePerDb: number;
  /** Average-linkage height above which a group is split. */
  splitDistance: number;
  /** Distances between hits whose names mark one series are divided by this. */
  seriesDiscount: number;
}

export const IDENTITY: IdentityParams = {
  floorDb: -40,
  bandWidth: 1,
  tiltFreeDb: 2,
  tiltPerDb: 0.5,
  // take-to-take differences of one drum at one strength (our generator's kicks; common practice for pitch)
  scale: { strikeDb: 1.5, bodyDb: 1.5, pitchSt: 0.5, decayOct: 0.25 },
  pitchPerDb: 0.03,
  decayPerDb: 0.01,
  termCap: 4,
  pitchCap: 2.5,
  bend: true,
  scalePerDb: 0.01,
  splitDistance: 1.05,
  seriesDiscount: 3,
};

/** Families whose instruments the sound may split (see the top of this file). */
export const SPLIT_FAMILIES: ReadonlySet<Family> = new Set<Family>(["kick", "snare", "tom", "hand-drum", "cowbell"]);

/** Cells larger than this are not clustered (memory grows with the square); they stay as named. */
export const MAX_CELL = 2000;

const BARK_TO_DB = 20 / 0.23;

export interface IdentityFeatures {
  /** Strike envelope: 24 band levels in dB relative to the loudest band, floored. */
  strike: ArrayLike<number> | null;
  /** Body envelope (null when the body was too short to measure: the strike's is used). */
  body: ArrayLike<number> | null;
  /** Pitch in semitones re A440, or null. */
  pitchSt: number | null;
  /** log2 of the decay time in seconds, or null. */
  log2Decay: number | null;
  strikeLufs: number;
}

/** Band levels (dB re the loudest band, floored) of a spectral summary; null when it has no energy. */
export function envelopeDb(s: SpectralSummary | null | undefined, floorDb = IDENTITY.floorDb, width = IDENTITY.bandWidth): Float64Array | null {
  const raw = s?.barkLoudness;
  if (!raw || raw.length === 0) return null;
  // wider bands: the mean specific loudness of `width` neighbouring Bark bands
  const b: number[] = [];
  for (let i = 0; i < raw.length; i += width) {
    const part = raw.slice(i, i + width).filter((v) => Number.isFinite(v));
    b.push(part.length ? part.reduce((x, y) => x + y, 0) / part.length : 0);
  }
  const db = b.map((v) => (Number.isFinite(v) && v > 0 ? BARK_TO_DB * Math.log10(v) : -Infinity));
  const max = Math.max(...db);
  if (!Number.isFinite(max)) return null;
  return Float64Array.from(db, (x) => Math.max(floorDb, x - max));
}

export function identityFeatures(m: Measurement, p: IdentityParams = IDENTITY): IdentityFeatures {
  const strike = envelopeDb(m.strike, p.floorDb, p.bandWidth);
  const body = envelopeDb(m.body, p.floorDb, p.bandWidth) ?? strike;
  const d = decaySec(m);
  return {
    strike,
    body,
    pitchSt: m.pitchHz !== null && Number.isFinite(m.pitchHz) && m.pitchHz > 0 ? 12 * Math.log2(m.pitchHz / 440) : null,
    log2Decay: Number.isFinite(d) && d > 0 ? Math.log2(d) : null,
    strikeLufs: m.strikeLufs,
  };
}

/**
 * RMS (dB) of what is left of the difference between two envelopes after removing its mean, its tilt and
 * its bend across the bands, each at most `maxShape` dB. The tilt is the least-squares straight line (its
 * value is the dB difference from the lowest band to the highest); the bend is the least-squares parabola
 * orthogonal to it (its value: how much higher both ends sit than the middle). A brighter stroke lifts the
 * upper bands above a knee rather than along a straight line: tilt and bend together follow that shape.
 */
export function shapeResidualDb(a: ArrayLike<number>, b: ArrayLike<number>, maxShape: number, bend = true): { residualDb: number; tiltDb: number; bendDb: number } {
  const out = { residualDb: 0, tiltDb: 0, bendDb: 0 };
  out.residualDb = shapeResidual(a, b, maxShape, bend, out);
  return out;
}

/** shapeResidualDb without allocations (it runs once per pair of hits); fills `fit` when given. */
function shapeResidual(a: ArrayLike<number>, b: ArrayLike<number>, maxShape: number, bend: boolean, fit?: { tiltDb: number; bendDb: number }): number {
  const n = Math.min(a.length, b.length);
  if (n === 0) return 0;
  const { x, q, sxx, sqq } = basisOf(n);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += a[i]! - b[i]!;
  mean /= n;
  let sxd = 0, sqd = 0;
  for (let i = 0; i < n; i++) {
    const d = a[i]! - b[i]! - mean;
    sxd += x[i]! * d;
    sqd += q[i]! * d;
  }
  // q runs from its middle value to its end values by exactly 0.25: the bend in dB is k / 4
  const t = Math.max(-maxShape, Math.min(maxShape, sxx > 0 ? sxd / sxx : 0));
  const k = bend && sqq > 0 ? Math.max(-maxShape, Math.min(maxShape, sqd / sqq / 4)) * 4 : 0;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const r = a[i]! - b[i]! - mean - t * x[i]! - k * q[i]!;
    ss += r * r;
  }
  if (fit) {
    fit.tiltDb = t;
    fit.bendDb = k / 4;
  }
  return Math.sqrt(ss / n);
}

const bases = new Map<number, { x: Float64Array; q: Float64Array; sxx: number; sqq: number }>();
let lastBasis: { n: number; x: Float64Array; q: Float64Array; sxx: number; sqq: number } | null = null;
/** Band positions x (-0.5 .. 0.5) and the parabola q = x^2 - mean(x^2), orthogonal to the constant and to x. */
function basisOf(n: number): { x: Float64Array; q: Float64Array; sxx: number; sqq: number } {
  if (lastBasis?.n === n) return lastBasis;
  let b = bases.get(n);
  if (!b) {
    const mid = (n - 1) / 2;
    const span = Math.max(1, n - 1);
    const x = Float64Array.from({ length: n }, (_, i) => (i - mid) / span);
    const mx2 = x.reduce((s, v) => s + v * v, 0) / n;
    const q = x.map((v) => v * v - mx2);
    b = { x, q, sxx: x.reduce((s, v) => s + v * v, 0), sqq: q.reduce((s, v) => s + v * v, 0) };
    bases.set(n, b);
  }
  lastBasis = { n, ...b };
  return b;
}

export interface HitDistance {
  /** The distance (root mean square of the scaled terms present). */
  distance: number;
  strikeDb: number | null;
  bodyDb: number | null;
  /** Pitch difference beyond the loudness allowance (semitones), null when a hit has no pitch. */
  pitchSt: number | null;
  decayOct: number | null;
  loudnessGapDb: number;
}

/** The distance between two measured hits (see the top of this file). Symmetric; 0 for a hit and a copy of it at any level. */
export function hitDistance(a: IdentityFeatures, b: IdentityFeatures, p: IdentityParams = IDENTITY): HitDistance {
  const gap = Number.isFinite(a.strikeLufs) && Number.isFinite(b.strikeLufs) ? Math.abs(a.strikeLufs - b.strikeLufs) : 0;
  const maxTilt = p.tiltFreeDb + p.tiltPerDb * gap;
  const strikeDb = a.strike && b.strike ? shapeResidual(a.strike, b.strike, maxTilt, p.bend) : null;
  const bodyDb = a.body && b.body ? shapeResidual(a.body, b.body, maxTilt, p.bend) : null;
  const pitchSt = a.pitchSt !== null && b.pitchSt !== null ? Math.max(0, Math.abs(a.pitchSt - b.pitchSt) - p.pitchPerDb * gap) : null;
  const decayOct = a.log2Decay !== null && b.log2Decay !== null ? Math.max(0, Math.abs(a.log2Decay - b.log2Decay) - p.decayPerDb * gap) : null;
  return { distance: combine(p, gap, strikeDb, bodyDb, pitchSt, decayOct), strikeDb, bodyDb, pitchSt, decayOct, loudnessGapDb: gap };
}

/** The distance alone (no record): what the clustering calls once per pair. */
export function hitDistanceValue(a: IdentityFeatures, b: IdentityFeatures, p: IdentityParams = IDENTITY): number {
  const gap = Number.isFinite(a.strikeLufs) && Number.isFinite(b.strikeLufs) ? Math.abs(a.strikeLufs - b.strikeLufs) : 0;
  const maxTilt = p.tiltFreeDb + p.tiltPerDb * gap;
  return combine(
    p,
    gap,
    a.strike && b.strike ? shapeResidual(a.strike, b.strike, maxTilt, p.bend) : null,
    a.body && b.body ? shapeResidual(a.body, b.body, maxTilt, p.bend) : null,
    a.pitchSt !== null && b.pitchSt !== null ? Math.max(0, Math.abs(a.pitchSt - b.pitchSt) - p.pitchPerDb * gap) : null,
    a.log2Decay !== null && b.log2Decay !== null ? Math.max(0, Math.abs(a.log2Decay - b.log2Decay) - p.decayPerDb * gap) : null,
  );
}

/** Root mean square of the scaled, capped terms present. */
function combine(p: IdentityParams, gap: number, strikeDb: number | null, bodyDb: number | null, pitchSt: number | null, decayOct: number | null): number {
  const grow = 1 + p.scalePerDb * gap;
  let sum = 0;
  let count = 0;
  if (strikeDb !== null) {
    const v = Math.min(p.termCap, strikeDb / (p.scale.strikeDb * grow));
    sum += v * v;
    count++;
  }
  if (bodyDb !== null) {
    const v = Math.min(p.termCap, bodyDb / (p.scale.bodyDb * grow));
    sum += v * v;
    count++;
  }
  if (pitchSt !== null) {
    const v = Math.min(p.termCap, p.pitchCap, pitchSt / p.scale.pitchSt);
    sum += v * v;
    count++;
  }
  if (decayOct !== null) {
    const v = Math.min(p.termCap, decayOct / p.scale.decayOct);
    sum += v * v;
    count++;
  }
  return count ? Math.sqrt(sum / count) : 0;
}

// ---------------------------------------------------------------------------------------------------------------
// Average-linkage clustering

/** Index of pair (i, j), i != j, in a condensed upper-triangle array of n points. */
function pairIndex(n: number, i: number, j: number): number {
  if (i > j) [i, j] = [j, i];
  return i * n - (i * (i + 1)) / 2 + (j - i - 1);
}

export interface Merge {
  a: number;
  b: number;
  height: number;
}

/**
 * Average-linkage (UPGMA) dendrogram of n points by the nearest-neighbour chain algorithm; `dist(i, j)` is
 * called once per pair. Returns the n - 1 merges (cluster ids are the smallest point index of each side),
 * sorted by height. Ties are broken by the lower index, so the result does not depend on the call order.
 */
export function averageLinkage(n: number, dist: (i: number, j: number) => number): Merge[] {
  if (n < 2) return [];
  const d = new Float64Array((n * (n - 1)) / 2);
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) d[pairIndex(n, i, j)] = dist(i, j);
  const size = new Int32Array(n).fill(1);
  const active = new Uint8Array(n).fill(1);
  const merges: Merge[] = [];
  const chain: number[] = [];
  let remaining = n;
  while (remaining > 1) {
    if (chain.length === 0) {
      let first = 0;
      while (!active[first]) first++;
      chain.push(first);
    }
    const x = chain[chain.length - 1]!;
    const prev = chain.length > 1 ? chain[chain.length - 2]! : -1;
    // nearest active neighbour of x; the chain's previous element wins ties (so the chain cannot cycle)
    let best = -1;
    let bestD = Infinity;
    if (prev >= 0) {
      best = prev;
      bestD = d[pairIndex(n, x, prev)]!;
    }
    for (let y = 0; y < n; y++) {
      if (y === x || !active[y]) continue;
      const v = d[pairIndex(n, x, y)]!;
      if (v < bestD || (v === bestD && y < best && best !== prev)) {
        best = y;
        bestD = v;
      }
    }
    if (best === prev) {
      // reciprocal nearest neighbours: merge into the lower index (Lance-Williams update for average linkage)
      chain.pop();
      chain.pop();
      const keep = Math.min(x, prev);
      const gone = Math.max(x, prev);
      const sk = size[keep]!;
      const sg = size[gone]!;
      for (let y = 0; y < n; y++) {
        if (y === keep || y === gone || !active[y]) continue;
        d[pairIndex(n, keep, y)] = (sk * d[pairIndex(n, keep, y)]! + sg * d[pairIndex(n, gone, y)]!) / (sk + sg);
      }
      size[keep] = sk + sg;
      active[gone] = 0;
      remaining--;
      merges.push({ a: keep, b: gone, height: bestD });
    } else {
      chain.push(best);
    }
  }
  return merges.sort((p, q) => p.height - q.height || p.a - q.a || p.b - q.b);
}

/**
 * Flat clusters of n points: the average-linkage dendrogram cut at `threshold` (merges of height at most the
 * threshold are kept). Each cluster is a sorted list of point indices; clusters are ordered by their first index.
 */
export function clusterAtHeight(n: number, dist: (i: number, j: number) => number, threshold: number): number[][] {
  const parent = Array.from({ length: n }, (_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]!]!;
      i = parent[i]!;
    }
    return i;
  };
  for (const m of averageLinkage(n, dist)) {
    if (m.height > threshold) break;
    const ra = find(m.a);
    const rb = find(m.b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  }
  const groups = new Map<number, number[]>();
  for (let i = 0; i < n; i++) {
    const r = find(i);
    const g = groups.get(r) ?? [];
    g.push(i);
    groups.set(r, g);
  }
  return [...groups.values()].sort((a, b) => a[0]! - b[0]!);
}

// ---------------------------------------------------------------------------------------------------------------
// Names as evidence

/** Round-robin marks a name spells out (the bare trailing number of "kick_03" is not one). */
const RR_MARKS = new Set(["rr", "rob", "robin", "roundrobin", "alt", "alternate", "take", "tk", "var", "variation", "seq"]);
const SIZE = /^\d+(\.\d+)?(x\d+(\.\d+)?|in)$/;

/**
 * True when a name marks its file as one of a series of one drum: an explicit velocity mark (v3, vel 2, pp,
 * soft ...; not a bare number), an explicit round-robin mark (rr2, take 3, alt), or a drum size or index in
 * the instrument's name (14x6.5, 22in, "tom 2").
 */
export function namesMarkSeries(n: Pick<NameInfo, "tokens" | "folderTokens" | "velocity" | "stem">): boolean {
  if (n.velocity && n.velocity.scheme !== "number") return true;
  for (const toks of [n.tokens, ...n.folderTokens]) {
    for (let i = 0; i < toks.length; i++) {
      const t = toks[i]!;
      if (t === "alt" || t === "alternate") return true;
      if (RR_MARKS.has(t) && /^\d+$/.test(toks[i + 1] ?? "")) return true;
    }
  }
  return n.stem.some((w) => SIZE.test(w) || /^\d+$/.test(w));
}

// ---------------------------------------------------------------------------------------------------------------
// Splitting one named instrument by sound

/** An instrument as the sound left it: parts split from one named group carry that group's key. */
export interface SoundInstrument extends Instrument {
  /** Key of the group the names made, when the sound split it into several drums (for showing them together). */
  splitFrom?: string;
}

export interface IdentityMember {
  id: string;
  path: string;
  measurement: Measurement;
  /** Hits are only compared within one cell: the same microphone, and the same articulation when a name or a person gave it. */
  cell: string;
  /** The name marks the file as one of a series of one drum (namesMarkSeries). */
  series: boolean;
}

/** 32-bit FNV-1a of a string (Fowler, Noll, Vo), as 8 hex digits. */
function fnv1a(text: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, "0");
}

const fileStem = (path: string) => (path.split(/[\\/]/).pop() ?? path).replace(/\.[a-z0-9]{2,5}$/i, "").slice(0, 48);

export interface SoundSplitOptions {
  params?: IdentityParams;
  maxCell?: number;
}

/**
 * Splits one instrument (made from the names) into the drums its sound says it holds. `members` are the
 * samples the sound may move (those a person placed stay where they are); members of the instrument missing
 * from `members` stay in the main part. Within each cell the hits are clustered (average linkage, cut at
 * IDENTITY.splitDistance); the largest cluster of every cell stays the instrument with its key unchanged (ties: the
 * cluster holding the first path), each other cluster becomes an instrument of its own, keyed
 * `<key>-s<hash of its first path>` so its key does not depend on the other files of the folder.
 * Returns [inst] itself when nothing splits.
 */
export function splitBySound(inst: Instrument, members: IdentityMember[], opts: SoundSplitOptions = {}): SoundInstrument[] {
  if (!SPLIT_FAMILIES.has(inst.family)) return [inst];
  const p = opts.params ?? IDENTITY;
  const maxCell = opts.maxCell ?? MAX_CELL;
  const inInst = new Set(inst.sampleIds);
  const cells = new Map<string, IdentityMember[]>();
  for (const m of [...members].sort((a, b) => a.path.localeCompare(b.path) || a.id.localeCompare(b.id))) {
    if (!inInst.has(m.id)) continue;
    const c = cells.get(m.cell) ?? [];
    c.push(m);
    cells.set(m.cell, c);
  }
  const away: IdentityMember[][] = [];
  for (const [, cell] of [...cells.entries()].sort((a, b) => a[0].localeCompare(b[0]))) {
    if (cell.length < 2 || cell.length > maxCell) continue;
    const f = cell.map((m) => identityFeatures(m.measurement, p));
    const clusters = clusterAtHeight(cell.length, (i, j) => hitDistanceValue(f[i]!, f[j]!, p) / (cell[i]!.series && cell[j]!.series ? p.seriesDiscount : 1), p.splitDistance);
    if (clusters.length < 2) continue;
    // the largest cluster stays; on a tie the one holding the first path (clusters are ordered by first index)
    let main = 0;
    clusters.forEach((c, i) => {
      if (c.length > clusters[main]!.length) main = i;
    });
    clusters.forEach((c, i) => {
      if (i !== main) away.push(c.map((k) => cell[k]!));
    });
  }
  if (away.length === 0) return [inst];
  const moved = new Set(away.flat().map((m) => m.id));
  const baseIds = inst.sampleIds.filter((id) => !moved.has(id));
  const firstPath = (ms: IdentityMember[]) => ms.map((m) => m.path).sort()[0]!;
  const baseMembers = members.filter((m) => inInst.has(m.id) && !moved.has(m.id));
  const used = new Set<string>([inst.key]);
  const parts: SoundInstrument[] = [];
  if (baseIds.length) {
    parts.push({
      ...inst,
      // the main part keeps its name when it is the largest; among equals each part is named by its first file
      displayName: baseMembers.length && away.some((g) => g.length >= baseIds.length) ? `${inst.displayName} (${fileStem(firstPath(baseMembers))})` : inst.displayName,
      descriptors: [...inst.descriptors],
      sampleIds: [...baseIds].sort(),
      mergedFrom: [...inst.mergedFrom],
      splitFrom: inst.key,
    });
  }
  for (const group of away.sort((a, b) => firstPath(a).localeCompare(firstPath(b)))) {
    const anchor = firstPath(group);
    const tag = `s${fnv1a(anchor).slice(0, 6)}`;
    let key = `${inst.key}-${tag}`;
    for (let k = 2; used.has(key); k++) key = `${inst.key}-${tag}-${k}`;
    used.add(key);
    parts.push({
      key,
      family: inst.family,
      displayName: `${inst.displayName} (${fileStem(anchor)})`,
      descriptors: [...inst.descriptors, tag],
      sampleIds: group.map((m) => m.id).sort(),
      mergedFrom: [],
      splitFrom: inst.key,
    });
  }
  return parts;
}
