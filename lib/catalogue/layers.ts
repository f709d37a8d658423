// Velocity layers and round robins of one group (one instrument + articulation + mic).
//
// Layers are found by optimal 1-D clustering of strike loudness (ckmeans from simple-statistics, Wang & Song's
// dynamic programme). How many layers:
//   - from the names when most members carry a velocity hint (v1..v16, pp..ff, soft/medium/hard, numbers):
//     the number of distinct hints;
//   - otherwise from the gaps: for each k, the smallest gap between neighbouring clusters (dB) divided by the
//     widest cluster (dB, never taken below 0.5 dB, the usual take-to-take scatter of round robins: common
//     practice, no published source). The k with the highest ratio wins, provided its smallest gap is at least
//     `minGapDb` (default 1.5 dB: layer steps smaller than that are hard to hear, common practice) and the ratio
//     is at least 1 (the gaps are wider than the clusters). When no k qualifies the group is one layer.
// Round robins are a layer's members, ordered by their name's round-robin index, then path, then id.
// Velocity ranges come from a stated curve (velocity.ts; default DLS Level 1).

import { ckmeans } from "simple-statistics";
import type { VelocityHint } from "./names";
import { DLS, velocityRanges, type VelocityCurve } from "./velocity";

export interface LayerMember {
  id: string;
  strikeLufs: number;
  velocityHint?: VelocityHint | null;
  roundRobin?: number | null;
  path?: string;
}

export interface Layer {
  /** 0 = softest. */
  index: number;
  velocityLow: number;
  velocityHigh: number;
  /** Arithmetic mean of the members' strike loudness (LUFS). */
  meanStrikeLufs: number;
  /** Round robins, in order. */
  sampleIds: string[];
  /** Loudest minus softest member (dB). */
  spreadDb: number;
  /** The velocity at which the curve's level equals this layer's level. */
  nominalVelocity: number;
  /** Velocity hint ranks of the members that have one (sorted, unique). */
  hintRanks: number[];
}

export type LayerIssueCode = "layer-order" | "uneven-layers" | "thin-round-robins" | "missing-layer";

export interface LayerIssue {
  code: LayerIssueCode;
  sampleIds: string[];
  message: string;
}

export interface LayerSorting {
  layers: Layer[];
  countFrom: "names" | "gaps" | "single";
  /** Plain words: how the layer count was chosen. */
  criterion: string;
  issues: LayerIssue[];
}

export interface LayerOptions {
  curve?: VelocityCurve;
  /** Smallest gap (dB) between layers found from the gaps. Default 1.5. */
  minGapDb?: number;
  /** Most layers tried when counting from the gaps. Default 16. */
  maxLayers?: number;
  /** Floor (dB) under the widest cluster in the gap ratio. Default 0.5. */
  spreadFloorDb?: number;
}

const round = (x: number, d = 1) => Math.round(x * 10 ** d) / 10 ** d;

/** Splits sorted values into k contiguous clusters (sizes), via ckmeans. */
export function clusterSizes(sortedValues: number[], k: number): number[] {
  if (k <= 1 || sortedValues.length <= 1) return [sortedValues.length];
  const clusters = ckmeans(sortedValues, k);
  return clusters.map((c) => c.length);
}

export interface GapChoice {
  k: number;
  ratio: number;
  minGapDb: number;
  widestDb: number;
}

/** The layer count from the gaps (see the header of this file for the criterion). Values in dB, any order. */
export function layerCountFromGaps(values: number[], opts: LayerOptions = {}): GapChoice {
  const minGap = opts.minGapDb ?? 1.5;
  const floor = opts.spreadFloorDb ?? 0.5;
  const sorted = [...values].sort((a, b) => a - b);
  const unique = new Set(sorted).size;
  const maxK = Math.min(opts.maxLayers ?? 16, unique);
  let best: GapChoice = { k: 1, ratio: 0, minGapDb: 0, widestDb: sorted.length ? sorted[sorted.length - 1]! - sorted[0]! : 0 };
  for (let k = 2; k <= maxK; k++) {
    const clusters = ckmeans(sorted, k);
    let g = Infinity;
    let w = 0;
    for (let j = 0; j < clusters.length; j++) {
      const c = clusters[j]!;
      w = Math.max(w, c[c.length - 1]! - c[0]!);
      if (j > 0) {
        const prev = clusters[j - 1]!;
        g = Math.min(g, c[0]! - prev[prev.length - 1]!);
      }
    }
    const ratio = g / Math.max(w, floor);
    if (g >= minGap && ratio >= 1 && ratio > best.ratio) best = { k, ratio, minGapDb: g, widestDb: w };
  }
  return best;
}

function hintsInUse(members: LayerMember[]): { scheme: string; ranks: number[] } | null {
  const byScheme = new Map<string, number>();
  for (const m of members) if (m.velocityHint) byScheme.set(m.velocityHint.scheme, (byScheme.get(m.velocityHint.scheme) ?? 0) + 1);
  let scheme: string | null = null;
  let count = 0;
  for (const [s, c] of byScheme) if (c > count) [scheme, count] = [s, c];
  if (!scheme || count * 2 < members.length) return null;
  const ranks = [...new Set(members.filter((m) => m.velocityHint?.scheme === scheme).map((m) => m.velocityHint!.rank))].sort((a, b) => a - b);
  return { scheme, ranks };
}

const byRoundRobin = (a: LayerMember, b: LayerMember) =>
  (a.roundRobin ?? Infinity) - (b.roundRobin ?? Infinity) || (a.path ?? "").localeCompare(b.path ?? "") || a.id.localeCompare(b.id);

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  return n % 2 ? s[(n - 1) / 2]! : (s[n / 2 - 1]! + s[n / 2]!) / 2;
};

/** Sorts one group into velocity layers and round robins, with the issues found on the way. */
export function sortLayers(members: LayerMember[], opts: LayerOptions = {}): LayerSorting {
  const curve = opts.curve ?? DLS;
  const good = members.filter((m) => Number.isFinite(m.strikeLufs));
  if (good.length === 0) return { layers: [], countFrom: "single", criterion: "no sample with a measurable strike loudness", issues: [] };
  const sorted = [...good].sort((a, b) => a.strikeLufs - b.strikeLufs || a.id.localeCompare(b.id));
  const values = sorted.map((m) => m.strikeLufs);
  const unique = new Set(values).size;

  const hints = hintsInUse(good);
  let k: number;
  let countFrom: LayerSorting["countFrom"];
  let criterion: string;
  if (hints && hints.ranks.length > 1) {
    k = Math.min(hints.ranks.length, unique);
    countFrom = "names";
    const DYN = ["", "ppp", "pp", "p", "mp", "mf", "f", "ff", "fff"];
    const WORD = ["", "soft", "medium", "hard", "harder"];
    const label = (r: number) => (hints.scheme === "v" ? `v${r}` : hints.scheme === "dynamic" ? DYN[r] ?? String(r) : hints.scheme === "word" ? WORD[r] ?? String(r) : String(r));
    criterion = `${hints.ranks.length} velocity marks in the names (${hints.ranks.map(label).join(", ")})`;
  } else {
    const g = layerCountFromGaps(values, opts);
    k = g.k;
    countFrom = k > 1 ? "gaps" : "single";
    criterion =
      k > 1
        ? `${k} layers: smallest gap ${round(g.minGapDb)} dB against widest layer ${round(g.widestDb)} dB (best ratio ${round(g.ratio, 2)})`
        : `one layer: no split has gaps of at least ${opts.minGapDb ?? 1.5} dB wider than its layers`;
  }

  const sizes = clusterSizes(values, k);
  const groups: LayerMember[][] = [];
  let at = 0;
  for (const s of sizes) {
    groups.push(sorted.slice(at, at + s));
    at += s;
  }
  const means = groups.map((g) => g.reduce((a, m) => a + m.strikeLufs, 0) / g.length);
  const ranges = velocityRanges(means, curve);
  const layers: Layer[] = groups.map((g, i) => ({
    index: i,
    velocityLow: ranges[i]!.velocityLow,
    velocityHigh: ranges[i]!.velocityHigh,
    meanStrikeLufs: round(means[i]!, 2),
    sampleIds: [...g].sort(byRoundRobin).map((m) => m.id),
    spreadDb: round(g[g.length - 1]!.strikeLufs - g[0]!.strikeLufs, 2),
    nominalVelocity: ranges[i]!.nominalVelocity,
    hintRanks: hints ? [...new Set(g.filter((m) => m.velocityHint?.scheme === hints.scheme).map((m) => m.velocityHint!.rank))].sort((a, b) => a - b) : [],
  }));

  const issues: LayerIssue[] = [];
  if (hints) issues.push(...orderIssues(groups, hints.scheme));
  // layer numbers (v1..v16 convention) can skip; marks above 16 are MIDI velocities (v32, v64, v127), not counts
  if (hints && (hints.scheme === "v" || hints.scheme === "number") && hints.ranks[hints.ranks.length - 1]! <= 16) {
    const missing: number[] = [];
    for (let r = hints.ranks[0]!; r <= hints.ranks[hints.ranks.length - 1]!; r++) if (!hints.ranks.includes(r)) missing.push(r);
    if (missing.length) {
      const label = (r: number) => (hints.scheme === "v" ? `v${r}` : String(r));
      issues.push({
        code: "missing-layer",
        sampleIds: good.map((m) => m.id),
        message: `The names count velocity layers ${hints.ranks.map(label).join(", ")}: ${missing.map(label).join(", ")} ${missing.length > 1 ? "are" : "is"} missing.`,
      });
    }
  }
  const spacing = unevenSpacing(layers);
  if (spacing) issues.push(spacing);
  const thin = layers.filter((l) => l.sampleIds.length < 2);
  if (thin.length) {
    issues.push({
      code: "thin-round-robins",
      sampleIds: thin.flatMap((l) => l.sampleIds),
      message: `${thin.length} of ${layers.length} layer${layers.length > 1 ? "s have" : " has"} a single take; 2 or more round robins per layer avoid the repeated-sample effect (common practice).`,
    });
  }
  return { layers, countFrom, criterion, issues };
}

/**
 * Layers out of loudness order versus their names: the name hints of the loudness-sorted layers must not go
 * down, and a sample named louder than its layer's other members (or softer) is out of place.
 */
function orderIssues(groups: LayerMember[][], scheme: string): LayerIssue[] {
  const issues: LayerIssue[] = [];
  const rankOf = (m: LayerMember) => (m.velocityHint?.scheme === scheme ? m.velocityHint.rank : null);
  const medians = groups.map((g) => {
    const r = g.map(rankOf).filter((x): x is number => x !== null);
    return r.length ? median(r) : null;
  });
  const bad = new Set<string>();
  let lastMedian = -Infinity;
  let lastIdx = -1;
  for (let i = 0; i < groups.length; i++) {
    const med = medians[i];
    if (med === null || med === undefined) continue;
    if (med < lastMedian) {
      for (const m of groups[i]!) bad.add(m.id);
      for (const m of groups[lastIdx]!) bad.add(m.id);
    }
    lastMedian = Math.max(lastMedian, med);
    lastIdx = i;
  }
  if (bad.size) {
    issues.push({
      code: "layer-order",
      sampleIds: [...bad].sort(),
      message: "Layers are out of loudness order versus their names: a layer named louder measures softer than a layer named softer.",
    });
  }
  // single samples sitting in a layer whose other members carry another mark
  const misplaced: string[] = [];
  groups.forEach((g, i) => {
    const med = medians[i];
    if (med === null || med === undefined || g.length < 2) return;
    for (const m of g) {
      const r = rankOf(m);
      if (r !== null && r !== med && g.filter((o) => rankOf(o) === r).length * 2 < g.length && !bad.has(m.id)) misplaced.push(m.id);
    }
  });
  if (misplaced.length) {
    issues.push({
      code: "layer-order",
      sampleIds: misplaced.sort(),
      message: "These samples are named for another velocity layer than the one their strike loudness puts them in.",
    });
  }
  return issues;
}

/** Uneven spacing: with 3+ layers, the widest step more than twice the narrowest and at least 3 dB more (common practice, no published source). */
function unevenSpacing(layers: Layer[]): LayerIssue | null {
  if (layers.length < 3) return null;
  const steps = layers.slice(1).map((l, i) => l.meanStrikeLufs - layers[i]!.meanStrikeLufs);
  const lo = Math.min(...steps);
  const hi = Math.max(...steps);
  if (hi > 2 * lo && hi - lo >= 3) {
    const i = steps.indexOf(hi);
    return {
      code: "uneven-layers",
      sampleIds: [...layers[i]!.sampleIds, ...layers[i + 1]!.sampleIds],
      message: `Uneven layer spacing: steps between layers run from ${round(lo)} dB to ${round(hi)} dB (between layers ${i + 1} and ${i + 2}); even steps make the dynamics feel continuous (common practice).`,
    };
  }
  return null;
}

/** True when every layer is at least as loud as the one below and the velocity ranges rise and tile 1..127. */
export function isMonotonic(layers: Pick<Layer, "meanStrikeLufs" | "velocityLow" | "velocityHigh">[]): boolean {
  for (let i = 0; i < layers.length; i++) {
    const l = layers[i]!;
    if (l.velocityLow > l.velocityHigh) return false;
    if (i === 0 && l.velocityLow !== 1) return false;
    if (i > 0) {
      const p = layers[i - 1]!;
      if (l.meanStrikeLufs < p.meanStrikeLufs) return false;
      if (l.velocityLow !== p.velocityHigh + 1) return false;
    }
  }
  return layers.length === 0 || layers[layers.length - 1]!.velocityHigh === 127;
}
