// Other learners than the forest, on the same grouped 5-fold cross-validation (scripts/sound-model/README.md,
// "What was tried"): k-nearest neighbours (distance-weighted, on features scaled with the training fold's
// statistics), a multinomial logistic regression (softmax, L2), a Gaussian naive Bayes, and averages of the
// forest's vote shares with their class probabilities. Every learner is trained on the same training rows of each fold as the forest
// (corpus with its augmented copies, and the generator); only un-augmented held-out files are judged.
// Anything containing the forest is judged by its mean over forest seeds 7-12.
//
//   npx tsx scripts/sound-model/learners.ts [part of a variant's name ...] [--three]
//
// The SVM rows of the README were made with ml-svm 2.1.2 (RBF kernel, sigma 0.7 x the square root of the feature
// count on z-scored features, its own scaling off, its simplified SMO with a seeded random pick, one machine per
// class against the rest, a softmax of twice the margins as probabilities) installed outside the project and
// passed to compare() as one more Maker; the package was not added, since nothing here was kept. The gradient-boosting
// rows were made the same way with ml-xgboost 1.1.2 (multi:softprob, 150 rounds, depth 4, eta 0.1, subsample 0.8,
// colsample_bytree 0.5, rare classes repeated to 30 rows); not added either.

import { forestVotes, STROKE_DOMAINS, trainSoundModel, type ForestJson } from "../../lib/catalogue/sound-model";
import type { Family } from "../../lib/catalogue/taxonomy";
import type { Row } from "./dataset";
import { ARTICULATION_KEYS, foldOf, report, type Prediction } from "./evaluate";
import { FOREST, loadRows } from "./run";

export type Probs = Record<string, number>;
interface Out { family: Probs; stroke: Record<string, Probs> }
interface Learner { family(x: number[]): Probs; stroke(domain: string, x: number[]): Probs | null }
export interface Sample { x: number[]; y: string; group?: string }

// ---- scaling (statistics of the training fold only) ----

export type Scaling = "z" | "robust";

export function fitScaler(X: number[][], kind: Scaling): (x: number[]) => number[] {
  const d = X[0]!.length;
  const centre = new Array<number>(d).fill(0);
  const scale = new Array<number>(d).fill(1);
  for (let j = 0; j < d; j++) {
    const col = X.map((r) => r[j]!);
    if (kind === "z") {
      const m = col.reduce((a, b) => a + b, 0) / col.length;
      const sd = Math.sqrt(col.reduce((a, b) => a + (b - m) ** 2, 0) / col.length);
      centre[j] = m;
      scale[j] = sd > 1e-12 ? sd : 1;
    } else {
      const s = [...col].sort((a, b) => a - b);
      const q = (p: number) => s[Math.min(s.length - 1, Math.floor(p * (s.length - 1)))]!;
      const iqr = q(0.75) - q(0.25);
      const sd = Math.sqrt(col.reduce((a, b) => a + (b - q(0.5)) ** 2, 0) / col.length);
      centre[j] = q(0.5);
      scale[j] = iqr > 1e-12 ? iqr / 1.349 : sd > 1e-12 ? sd : 1;
    }
  }
  const clip = kind === "robust" ? 5 : Infinity;
  return (x) => x.map((v, j) => Math.max(-clip, Math.min(clip, (v - centre[j]!) / scale[j]!)));
}

// ---- k nearest neighbours ----

export function knn(samples: Sample[], o: { k: number; scaling: Scaling; balanced: boolean; uniform?: boolean; perGroup?: boolean }): (x: number[]) => Probs {
  const scale = fitScaler(samples.map((s) => s.x), o.scaling);
  const Z = samples.map((s) => scale(s.x));
  const count: Record<string, number> = {};
  for (const s of samples) count[s.y] = (count[s.y] ?? 0) + 1;
  const classes = Object.keys(count);
  const classWeight = (y: string) => (o.balanced ? samples.length / (classes.length * count[y]!) : 1);
  return (x) => {
    const z = scale(x);
    const d = Z.map((r, i) => {
      let s = 0;
      for (let j = 0; j < r.length; j++) s += (r[j]! - z[j]!) ** 2;
      return [Math.sqrt(s), i] as const;
    }).sort((a, b) => a[0] - b[0]);
    // perGroup: the k nearest recordings (each by its nearest row), not rows: a recording's augmented copies
    // would otherwise fill the neighbourhood
    const seen = new Set<string>();
    const near = o.perGroup ? d.filter(([, i]) => { const g = samples[i]!.group ?? String(i); if (seen.has(g)) return false; seen.add(g); return true; }) : d;
    const top = near.slice(0, o.k);
    const p: Probs = {};
    let total = 0;
    for (const [dist, i] of top) {
      const y = samples[i]!.y;
      const w = classWeight(y) / (o.uniform ? 1 : dist + 1e-6);
      p[y] = (p[y] ?? 0) + w;
      total += w;
    }
    for (const c of Object.keys(p)) p[c]! /= total;
    return p;
  };
}

// ---- multinomial logistic regression (softmax, L2, full-batch Adam from zero weights: deterministic) ----

export function logistic(samples: Sample[], o: { lambda: number; scaling: Scaling; balanced: boolean; iterations?: number }): (x: number[]) => Probs {
  const classes = [...new Set(samples.map((s) => s.y))].sort();
  if (classes.length === 1) return () => ({ [classes[0]!]: 1 });
  const scale = fitScaler(samples.map((s) => s.x), o.scaling);
  const Z = samples.map((s) => [...scale(s.x), 1]);
  const Y = samples.map((s) => classes.indexOf(s.y));
  const d = Z[0]!.length, C = classes.length, n = Z.length;
  const count = classes.map((_, c) => Y.filter((y) => y === c).length);
  const sw = Y.map((y) => (o.balanced ? n / (C * count[y]!) : 1));
  const swSum = sw.reduce((a, b) => a + b, 0);
  const W = Array.from({ length: C }, () => new Float64Array(d));
  const m = Array.from({ length: C }, () => new Float64Array(d));
  const v = Array.from({ length: C }, () => new Float64Array(d));
  const lr = 0.05, b1 = 0.9, b2 = 0.999;
  const softmax = (z: number[]) => {
    const s = W.map((w) => w.reduce((a, wj, j) => a + wj * z[j]!, 0));
    const mx = Math.max(...s);
    const e = s.map((x) => Math.exp(x - mx));
    const t = e.reduce((a, b) => a + b, 0);
    return e.map((x) => x / t);
  };
  for (let it = 1; it <= (o.iterations ?? 300); it++) {
    const G = Array.from({ length: C }, () => new Float64Array(d));
    for (let i = 0; i < n; i++) {
      const p = softmax(Z[i]!);
      for (let c = 0; c < C; c++) {
        const g = (sw[i]! * (p[c]! - (Y[i] === c ? 1 : 0))) / swSum;
        if (g === 0) continue;
        const z = Z[i]!, Gc = G[c]!;
        for (let j = 0; j < d; j++) Gc[j]! += g * z[j]!;
      }
    }
    for (let c = 0; c < C; c++) for (let j = 0; j < d; j++) {
      const g = G[c]![j]! + (j < d - 1 ? o.lambda * W[c]![j]! : 0);
      m[c]![j] = b1 * m[c]![j]! + (1 - b1) * g;
      v[c]![j] = b2 * v[c]![j]! + (1 - b2) * g * g;
      W[c]![j]! -= (lr * (m[c]![j]! / (1 - b1 ** it))) / (Math.sqrt(v[c]![j]! / (1 - b2 ** it)) + 1e-8);
    }
  }
  return (x) => {
    const p = softmax([...scale(x), 1]);
    return Object.fromEntries(classes.map((c, i) => [c, p[i]!]));
  };
}

// ---- Gaussian naive Bayes (per class mean and variance of each feature; variances floored) ----

export function naiveBayes(samples: Sample[]): (x: number[]) => Probs {
  const classes = [...new Set(samples.map((s) => s.y))].sort();
  const d = samples[0]!.x.length;
  const allVar = Array.from({ length: d }, (_, j) => {
    const col = samples.map((s) => s.x[j]!);
    const m = col.reduce((a, b) => a + b, 0) / col.length;
    return col.reduce((a, b) => a + (b - m) ** 2, 0) / col.length;
  });
  const stats = classes.map((c) => {
    const mine = samples.filter((s) => s.y === c);
    const mean = Array.from({ length: d }, (_, j) => mine.reduce((a, s) => a + s.x[j]!, 0) / mine.length);
    // a variance floor of 1e-2 of the feature's overall variance (binary flags and constant columns)
    const vr = Array.from({ length: d }, (_, j) => mine.reduce((a, s) => a + (s.x[j]! - mean[j]!) ** 2, 0) / mine.length + 1e-2 * allVar[j]! + 1e-9);
    return { prior: Math.log(mine.length / samples.length), mean, vr };
  });
  return (x) => {
    const ll = stats.map((st) => st.prior + x.reduce((a, v, j) => a - 0.5 * Math.log(2 * Math.PI * st.vr[j]!) - (v - st.mean[j]!) ** 2 / (2 * st.vr[j]!), 0));
    const mx = Math.max(...ll);
    const e = ll.map((l) => Math.exp(l - mx));
    const t = e.reduce((a, b) => a + b, 0);
    return Object.fromEntries(classes.map((c, i) => [c, e[i]! / t]));
  };
}

function learnerFrom(train: Row[], make: (s: Sample[]) => (x: number[]) => Probs): Learner {
  const fam = make(train.map((r) => ({ x: r.features, y: r.family, group: r.group })));
  const strokes: Record<string, (x: number[]) => Probs> = {};
  for (const [d, fams] of Object.entries(STROKE_DOMAINS)) {
    const rs = train.filter((r) => r.articulation && fams.includes(r.family));
    if (rs.length) strokes[d] = make(rs.map((r) => ({ x: r.features, y: r.articulation!, group: r.group })));
  }
  return { family: fam, stroke: (d, x) => strokes[d]?.(x) ?? null };
}

function forestLearner(train: Row[], seed: number): Learner {
  const model = trainSoundModel(train, { ...FOREST, seed });
  return {
    family: (x) => forestVotes(model.family, x),
    stroke: (d, x) => (model.articulation[d] ? forestVotes(model.articulation[d] as ForestJson, x) : null),
  };
}

function outputs(l: Learner, x: number[]): Out {
  const stroke: Record<string, Probs> = {};
  for (const d of Object.keys(STROKE_DOMAINS)) {
    const p = l.stroke(d, x);
    if (p) stroke[d] = p;
  }
  return { family: l.family(x), stroke };
}

// ties go to the first class listed, as in predictSound (so the forest's figures are the harness's)
const argmax = (p: Probs): [string, number] => Object.entries(p).sort((a, b) => b[1] - a[1])[0]!;

function average(outs: { out: Out; w: number }[]): Out {
  const mix = (ps: { p: Probs | undefined; w: number }[]) => {
    const r: Probs = {};
    const total = ps.filter((q) => q.p).reduce((a, q) => a + q.w, 0);
    for (const { p, w } of ps) if (p) for (const [c, v] of Object.entries(p)) r[c] = (r[c] ?? 0) + (w * v) / total;
    return r;
  };
  const stroke: Record<string, Probs> = {};
  for (const d of Object.keys(STROKE_DOMAINS)) {
    const s = mix(outs.map((o) => ({ p: o.out.stroke[d], w: o.w })));
    if (Object.keys(s).length) stroke[d] = s;
  }
  return { family: mix(outs.map((o) => ({ p: o.out.family, w: o.w }))), stroke };
}

function predictionOf(row: Row, fold: number, o: Out): Prediction {
  const [family, familyShare] = argmax(o.family);
  const d = Object.entries(STROKE_DOMAINS).find(([, fams]) => fams.includes(family as Family))?.[0];
  const sp = d ? o.stroke[d] : undefined;
  const [articulation, share] = sp ? argmax(sp) : [null, 0];
  return { row, fold, family, familyShare, articulation, articulationShare: familyShare * share };
}

export type Maker = (s: Sample[]) => (x: number[]) => Probs;

/** Held-out figures of the forest (seeds 7-12), of each other learner, and of their averages. */
export function compare(others: Record<string, Maker>, opts: { three?: boolean; corpusOnly?: string[] } = {}) {
  const rows = loadRows({ generator: true });
  const all = [...rows.corpus, ...rows.generator];
  const SEEDS = [7, 8, 9, 10, 11, 12];
  const names = Object.keys(others);
  // per judged file: the forest's outputs per seed, each other learner's outputs
  const judged: { row: Row; fold: number; forest: Out[]; other: Record<string, Out> }[] = [];
  const t0 = Date.now();
  for (let k = 0; k < 5; k++) {
    const train = all.filter((r) => foldOf(r.group, 5) !== k);
    const test = rows.corpus.filter((r) => r.augmentation === "" && foldOf(r.group, 5) === k);
    const forests = SEEDS.map((s) => forestLearner(train, s));
    // a learner named in corpusOnly trains on the fold's corpus rows alone (no generator rows)
    const ls = Object.fromEntries(names.map((n) => [n, learnerFrom(opts.corpusOnly?.includes(n) ? train.filter((r) => r.source === "corpus") : train, others[n]!)]));
    for (const r of test) judged.push({ row: r, fold: k, forest: forests.map((f) => outputs(f, r.features)), other: Object.fromEntries(names.map((n) => [n, outputs(ls[n]!, r.features)])) });
    process.stderr.write(`fold ${k + 1}/5 (${Math.round((Date.now() - t0) / 1000)} s)\n`);
  }
  const judgedArt = (p: Prediction) => ARTICULATION_KEYS.has(p.row.key ?? 0);
  const figures = (make: (j: (typeof judged)[number]) => Out) => {
    const r = report(judged.map((j) => predictionOf(j.row, j.fold, make(j))), judgedArt);
    return [r.familyAccuracy, r.articulationAccuracy] as const;
  };
  const pct = (x: number) => (100 * x).toFixed(1);
  const line = (name: string, fs: (readonly [number, number])[]) => {
    const mf = fs.reduce((a, f) => a + f[0], 0) / fs.length, ma = fs.reduce((a, f) => a + f[1], 0) / fs.length;
    const per = fs.length > 1 ? `   seeds: ${fs.map((f) => `${pct(f[0])}/${pct(f[1])}`).join(" ")}` : "";
    console.log(`${name.padEnd(52)} family ${pct(mf)} %  articulation ${pct(ma)} %${per}`);
  };
  line("forest (committed setting)", SEEDS.map((_, s) => figures((j) => j.forest[s]!)));
  for (const n of names) {
    line(n, [figures((j) => j.other[n]!)]);
    for (const w of [0.5, 0.33]) line(`forest + ${n} (other weight ${w})`, SEEDS.map((_, s) => figures((j) => average([{ out: j.forest[s]!, w: 1 - w }, { out: j.other[n]!, w }]))));
  }
  if (opts.three) {
    const kn = names.find((n) => n.startsWith("kNN")), lo = names.find((n) => n.startsWith("logistic"));
    if (kn && lo) line(`forest + ${kn} + ${lo} (thirds)`, SEEDS.map((_, s) => figures((j) => average([{ out: j.forest[s]!, w: 1 }, { out: j.other[kn]!, w: 1 }, { out: j.other[lo]!, w: 1 }]))));
  }
}

function main() {
  const others: Record<string, Maker> = {
    "kNN k=10 z": (s) => knn(s, { k: 10, scaling: "z", balanced: false }),
    "kNN k=10 robust": (s) => knn(s, { k: 10, scaling: "robust", balanced: false }),
    "kNN k=10 robust balanced": (s) => knn(s, { k: 10, scaling: "robust", balanced: true }),
    "kNN k=25 robust": (s) => knn(s, { k: 25, scaling: "robust", balanced: false }),
    "logistic z l2=1e-3": (s) => logistic(s, { lambda: 1e-3, scaling: "z", balanced: false }),
    "logistic robust l2=1e-3": (s) => logistic(s, { lambda: 1e-3, scaling: "robust", balanced: false }),
    "logistic robust l2=1e-3 balanced": (s) => logistic(s, { lambda: 1e-3, scaling: "robust", balanced: true }),
    "logistic robust l2=1e-2": (s) => logistic(s, { lambda: 1e-2, scaling: "robust", balanced: false }),
    "kNN k=10 z, corpus only": (s) => knn(s, { k: 10, scaling: "z", balanced: false }),
    "kNN k=10 z balanced": (s) => knn(s, { k: 10, scaling: "z", balanced: true }),
    "kNN k=10 z uniform votes": (s) => knn(s, { k: 10, scaling: "z", balanced: false, uniform: true }),
    "kNN 5 nearest recordings z": (s) => knn(s, { k: 5, scaling: "z", balanced: false, perGroup: true }),
    "kNN 5 nearest recordings z balanced": (s) => knn(s, { k: 5, scaling: "z", balanced: true, perGroup: true }),
    "naive Bayes (Gaussian)": (s) => naiveBayes(s),
    "kNN k=5 z": (s) => knn(s, { k: 5, scaling: "z", balanced: false }),
    "logistic z l2=1e-3, corpus only": (s) => logistic(s, { lambda: 1e-3, scaling: "z", balanced: false }),
  };
  const only = process.argv.slice(2).filter((a) => !a.startsWith("--"));
  const chosen = Object.fromEntries(Object.entries(others).filter(([n]) => !only.length || only.some((o) => n.includes(o))));
  compare(chosen, { three: process.argv.includes("--three"), corpusOnly: Object.keys(chosen).filter((n) => n.includes("corpus only")) });
}

if (require.main === module) main();
