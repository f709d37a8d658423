// The trained sound model: random forests (ml-random-forest, a general-purpose CART forest) over the level-free
// features of sound-features.ts, each split choosing among a fresh random subset of the features (Breiman's
// forest; forest-split.ts, `nodeFeatures`). One forest says the family; one forest per stroke domain (snare strokes,
// hi-hat openness, cymbal strokes, tom strokes, hand-drum strokes) says the articulation within the family.
// A forest's vote share is not a probability: the confidence shown is the share mapped through a calibration
// table measured on held-out folds (see scripts/sound-model/README.md), so "0.9" means about nine in ten right.
// Training and prediction are pure; the model is a JSON document (lib/catalogue/sound-model.json) made by
// `npm run train:sound`.

import { RandomForestClassifier } from "ml-random-forest";
import { setNodeSampling, useSweepSplits } from "./forest-split";
import type { Articulation, Family } from "./taxonomy";

export const SOUND_MODEL_FORMAT = 1;

/** Families whose strokes one articulation forest tells apart (cymbals share one: their strokes sound alike). */
export const STROKE_DOMAINS: Record<string, readonly Family[]> = {
  snare: ["snare"],
  "hi-hat": ["hi-hat"],
  cymbal: ["crash", "ride", "china", "splash"],
  tom: ["tom"],
  "hand-drum": ["hand-drum"],
};

export function domainOf(family: Family): string | null {
  for (const [d, fams] of Object.entries(STROKE_DOMAINS)) if (fams.includes(family)) return d;
  return null;
}

export interface TrainingRow {
  features: number[];
  family: Family;
  /** null when the row's stroke is not known (it then trains the family forest only). */
  articulation: Articulation | null;
  /** Rows of one recording (its copies and augmentations) share a group. */
  group: string;
  /** How much the row counts (rows of rare classes are repeated to reach this weight). */
  weight?: number;
}

export interface ForestJson {
  classes: string[];
  forest: unknown;
}

export interface SoundModel {
  format: number;
  version: string;
  featureCount: number;
  family: ForestJson;
  articulation: Record<string, ForestJson>;
  /** Calibration: vote share bins (upper edges) and the share of held-out predictions right in each bin. */
  calibration: { family: CalibrationTable; articulation: CalibrationTable } | null;
  meta: Record<string, unknown>;
}

export interface CalibrationTable {
  edges: number[];
  accuracy: number[];
  counts: number[];
}

export interface ForestOptions {
  trees?: number;
  maxFeatures?: number;
  maxDepth?: number;
  seed?: number;
  /** Rows per class are repeated up to at least this many (so a rare family is not outvoted). */
  minPerClass?: number;
  /** fraction of the tree's features tried at each node (1: all of them) */
  nodeFeatures?: number;
}

const DEFAULTS: Required<ForestOptions> = { trees: 150, maxFeatures: 0.35, maxDepth: 14, seed: 7, minPerClass: 40, nodeFeatures: 1 };

function trainForest(rows: { x: number[]; y: string }[], o: Required<ForestOptions>): ForestJson {
  const classes = [...new Set(rows.map((r) => r.y))].sort();
  if (classes.length === 1) return { classes, forest: null };
  useSweepSplits();
  setNodeSampling(o.nodeFeatures, o.seed);
  // repeat the rows of rare classes so every class has at least minPerClass rows
  const byClass = new Map<string, { x: number[]; y: string }[]>();
  for (const r of rows) (byClass.get(r.y) ?? byClass.set(r.y, []).get(r.y)!).push(r);
  const X: number[][] = [];
  const Y: number[] = [];
  for (const [y, rs] of byClass) {
    const reps = Math.max(1, Math.ceil(o.minPerClass / rs.length));
    for (let k = 0; k < reps; k++) for (const r of rs) { X.push(r.x); Y.push(classes.indexOf(y)); }
  }
  const rf = new RandomForestClassifier({
    nEstimators: o.trees,
    maxFeatures: o.maxFeatures,
    replacement: false,
    useSampleBagging: true,
    noOOB: true,
    seed: o.seed,
    treeOptions: { maxDepth: o.maxDepth, minNumSamples: 2 },
  } as never);
  rf.train(X, Y);
  return { classes, forest: compactForest(rf.toJSON()) };
}

/** Fields ml-cart writes on every tree node that its loader does not read back (TreeNode.setNodeParameters reads
 * splitValue, splitColumn, gain, left, right and distribution; a node takes kind, gain function, split function
 * and limits from its parent), and the gain and sample count, which predicting never reads. */
const NODE_ONLY_FIELDS = new Set(["kind", "gainFunction", "splitFunction", "minNumSamples", "maxDepth", "gainThreshold", "numberSamples", "gain"]);

/** The forest's JSON without what loading and predicting never read (about a quarter of the size). */
export function compactForest(json: unknown): unknown {
  return JSON.parse(JSON.stringify(json, function (this: Record<string, unknown>, key: string, value: unknown) {
    const isNode = this && typeof this === "object" && ("splitColumn" in this || "distribution" in this);
    return isNode && NODE_ONLY_FIELDS.has(key) ? undefined : value;
  }));
}

const forestCache = new WeakMap<ForestJson, RandomForestClassifier>();

/** Vote shares of each class for one feature vector. */
export function forestVotes(f: ForestJson, x: number[]): Record<string, number> {
  if (!f.forest) return { [f.classes[0]!]: 1 };
  let rf = forestCache.get(f);
  if (!rf) {
    rf = RandomForestClassifier.load(f.forest as never);
    forestCache.set(f, rf);
  }
  const row = (rf.predictionValues([x]) as unknown as { getRow(i: number): number[] }).getRow(0);
  const votes: Record<string, number> = {};
  for (const v of row) {
    const c = f.classes[Math.round(v)]!;
    votes[c] = (votes[c] ?? 0) + 1 / row.length;
  }
  return votes;
}

export function trainSoundModel(rows: TrainingRow[], opts: ForestOptions = {}, meta: Record<string, unknown> = {}): SoundModel {
  const o = { ...DEFAULTS, ...opts };
  const family = trainForest(rows.map((r) => ({ x: r.features, y: r.family })), o);
  const articulation: Record<string, ForestJson> = {};
  for (const [d, fams] of Object.entries(STROKE_DOMAINS)) {
    const rs = rows.filter((r) => r.articulation && fams.includes(r.family));
    if (rs.length === 0) continue;
    articulation[d] = trainForest(rs.map((r) => ({ x: r.features, y: r.articulation! })), o);
  }
  return {
    format: SOUND_MODEL_FORMAT,
    version: String(meta.version ?? "dev"),
    featureCount: rows[0]?.features.length ?? 0,
    family,
    articulation,
    calibration: null,
    meta,
  };
}

export interface ModelPrediction {
  family: Family;
  /** Raw vote share of the family (uncalibrated). */
  familyShare: number;
  familyVotes: Partial<Record<Family, number>>;
  articulation: Articulation | null;
  articulationShare: number;
  /** Calibrated confidence of the family, 0..1. */
  confidence: number;
  articulationConfidence: number;
}

/** Accuracy measured on held-out data for a raw vote share (interpolated in the calibration table). */
export function calibrate(t: CalibrationTable | undefined, share: number): number {
  if (!t || t.edges.length === 0) return share;
  for (let i = 0; i < t.edges.length; i++) if (share <= t.edges[i]! + 1e-9) return t.accuracy[i]!;
  return t.accuracy[t.accuracy.length - 1]!;
}

/** Articulation votes within a family's stroke domain, or null when the model has no forest for it. */
export function articulationVotes(model: SoundModel, family: Family, x: number[]): Record<string, number> | null {
  const d = domainOf(family);
  const f = d ? model.articulation[d] : undefined;
  return f ? forestVotes(f, x) : null;
}

export function predictSound(model: SoundModel, x: number[], allowed?: (family: Family, a: Articulation) => boolean): ModelPrediction {
  if (x.length !== model.featureCount) throw new Error(`the sound model reads ${model.featureCount} features, got ${x.length}`);
  const fv = forestVotes(model.family, x) as Partial<Record<Family, number>>;
  const [family, familyShare] = (Object.entries(fv) as [Family, number][]).sort((a, b) => b[1] - a[1])[0]!;
  const av = articulationVotes(model, family, x);
  let articulation: Articulation | null = null;
  let articulationShare = 0;
  if (av) {
    const ranked = (Object.entries(av) as [Articulation, number][])
      .filter(([a]) => !allowed || allowed(family, a))
      .sort((a, b) => b[1] - a[1]);
    if (ranked.length) [articulation, articulationShare] = ranked[0]!;
  }
  return {
    family,
    familyShare,
    familyVotes: fv,
    articulation,
    articulationShare,
    confidence: Math.round(calibrate(model.calibration?.family, familyShare) * 100) / 100,
    articulationConfidence: Math.round(calibrate(model.calibration?.articulation, articulationShare) * 100) / 100,
  };
}

/** A calibration table from held-out (share, right) pairs: equal-width bins of the vote share. */
export function calibrationTable(pairs: { share: number; right: boolean }[], edges = [0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95, 1]): CalibrationTable {
  const counts = edges.map(() => 0);
  const rights = edges.map(() => 0);
  for (const p of pairs) {
    const i = edges.findIndex((e) => p.share <= e + 1e-9);
    const k = i < 0 ? edges.length - 1 : i;
    counts[k]!++;
    if (p.right) rights[k]!++;
  }
  // bins with few predictions borrow from their neighbours (pooled until at least 10), then accuracy is made
  // non-decreasing (a higher share never means a lower confidence)
  const acc = edges.map((_, i) => {
    let n = counts[i]!, r = rights[i]!, lo = i, hi = i;
    while (n < 10 && (lo > 0 || hi < edges.length - 1)) {
      if (lo > 0) { lo--; n += counts[lo]!; r += rights[lo]!; }
      if (n < 10 && hi < edges.length - 1) { hi++; n += counts[hi]!; r += rights[hi]!; }
    }
    return n ? r / n : edges[i]!;
  });
  for (let i = 1; i < acc.length; i++) acc[i] = Math.max(acc[i]!, acc[i - 1]!);
  return { edges, accuracy: acc.map((a) => Math.round(a * 1000) / 1000), counts };
}
