// A faster split search for ml-cart's decision trees (the trees of ml-random-forest), same answer.
// ml-cart's TreeNode.bestSplit tries every candidate threshold of a feature (the midpoints between sorted
// neighbours whose classes differ) by splitting the rows anew and counting both halves: O(n^2) per feature and
// node, minutes per forest on a few thousand rows. The sweep here sorts once and walks the candidates in order,
// keeping the class counts of the rows below the threshold, so each candidate costs O(classes). Candidates,
// their order, the rule "x < threshold goes left", the Gini gain and the strict "first best wins" are ml-cart's
// (ml-cart 2.1.1, src/TreeNode.js bestSplit and featureSplit, src/utils.js giniGain); regression trees and
// other gain functions keep ml-cart's own search. forest-split.test.ts checks it against ml-cart's search.
// The trees also grow on row indices (trainOnIndices) instead of ml-cart's copied matrices: the same trees, checked
// against ml-cart's own TreeNode.train in the same test file.

import { RandomForestClassifier } from "ml-random-forest";

interface SplitMatrix { rows: number; getRow(i: number): number[] }
interface NodeLike { kind: string; gainFunction: string; splitFunction: string }
export interface SplitResult { maxGain: number; maxColumn: number | undefined; maxValue: number | undefined; numberSamples: number | undefined }
type BestSplit = (this: NodeLike, XT: SplitMatrix, y: number[]) => SplitResult;

/** Gini impurity 1 - sum p^2 of class counts over m rows. */
function gini(counts: Float64Array, m: number): number {
  if (m === 0) return 0;
  let s = 0;
  for (let k = 0; k < counts.length; k++) { const p = counts[k]! / m; s += p * p; }
  return 1 - s;
}

/**
 * Features tried at each node: Breiman's random forest draws a fresh random subset of the features at every
 * split (L. Breiman, "Random Forests", Machine Learning 45(1), 2001, section 4), where ml-random-forest draws one
 * subset per tree. With a subset per tree a strong cue (the pitch, say) sits in few of the trees; drawn per node,
 * every tree can reach it. `fraction` 1 tries every feature (ml-cart's own search). Set by sound-model.ts before
 * each forest is trained (the trees are grown one after the other, so one seeded sequence makes a forest
 * reproducible).
 */
let nodeFraction = 1;
let nodeRng = 1;
export function setNodeSampling(fraction: number, seed: number): void {
  nodeFraction = fraction;
  nodeRng = (seed >>> 0) || 1;
}
function nextRand(): number {
  nodeRng ^= nodeRng << 13; nodeRng >>>= 0;
  nodeRng ^= nodeRng >>> 17;
  nodeRng ^= nodeRng << 5; nodeRng >>>= 0;
  return nodeRng / 4294967296;
}

/** The features one node tries: all of them, or a random `fraction` of them (at least one), in column order. */
export function nodeFeatures(count: number): number[] {
  const idx = Array.from({ length: count }, (_, i) => i);
  if (nodeFraction >= 1) return idx;
  const k = Math.max(1, Math.round(nodeFraction * count));
  for (let i = 0; i < k; i++) {
    const j = i + Math.floor(nextRand() * (count - i));
    [idx[i], idx[j]] = [idx[j]!, idx[i]!];
  }
  return idx.slice(0, k).sort((a, b) => a - b);
}

/** The sorted sweep: ml-cart's candidates and gain, counted incrementally. */
export function sweepBestSplit(XT: SplitMatrix, y: number[], features?: number[]): SplitResult {
  const n = y.length;
  let K = 0;
  for (const v of y) if (v + 1 > K) K = v + 1;
  const total = new Float64Array(K);
  for (const v of y) total[v]!++;
  const parent = gini(total, n);
  const left = new Float64Array(K);
  const right = new Float64Array(K);
  const order = Array.from({ length: n }, (_, i) => i);
  let best = -Infinity;
  let maxColumn: number | undefined, maxValue: number | undefined, numberSamples: number | undefined;
  for (const f of features ?? Array.from({ length: XT.rows }, (_, i) => i)) {
    const x = XT.getRow(f);
    for (let i = 0; i < n; i++) order[i] = i;
    order.sort((a, b) => x[a]! - x[b]!); // stable, as ml-cart's sort of (x, y) pairs
    left.fill(0);
    let p = 0; // rows with x < threshold (thresholds only grow along the sweep)
    for (let j = 1; j < n; j++) {
      const a = order[j - 1]!, b = order[j]!;
      if (y[a] === y[b]) continue;
      const v = (x[a]! + x[b]!) / 2;
      while (p < n && x[order[p]!]! < v) { left[y[order[p]!]!]!++; p++; }
      for (let k = 0; k < K; k++) right[k] = total[k]! - left[k]!;
      const gain = parent - ((gini(right, n - p) * (n - p)) / n + (gini(left, p) * p) / n);
      if (gain > best) { best = gain; maxColumn = f; maxValue = v; numberSamples = n; }
    }
  }
  return { maxGain: best, maxColumn, maxValue, numberSamples };
}

let original: BestSplit | null = null;
let nodeProto: object | null = null;

/** ml-cart's own search on a Gini classification node (for the test that compares the two). */
export function mlCartBestSplit(XT: SplitMatrix, y: number[]): SplitResult {
  useSweepSplits();
  const node = Object.assign(Object.create(nodeProto!), { kind: "classifier", gainFunction: "gini", splitFunction: "mean" }) as NodeLike;
  return original!.call(node, XT, y);
}

/** Installs the sweep on the TreeNode class ml-random-forest's trees use (once). */
export function useSweepSplits(): void {
  if (original) return;
  // TreeNode is not exported by ml-cart: reach it through a one-tree forest of the module ml-random-forest loads
  const rf = new RandomForestClassifier({ nEstimators: 1, seed: 1, noOOB: true } as never);
  rf.train([[0], [1], [2], [3]], [0, 1, 0, 1]);
  const proto = (rf as unknown as { estimators: { root: object }[] }).estimators[0]!.root.constructor.prototype as { bestSplit: BestSplit };
  nodeProto = proto;
  original = proto.bestSplit;
  const orig = original;
  proto.bestSplit = function (this: NodeLike, XT: SplitMatrix, y: number[]) {
    if (this.kind !== "classifier" || this.gainFunction !== "gini" || this.splitFunction !== "mean") return orig.call(this, XT, y);
    const tried = nodeFeatures(XT.rows);
    const best = sweepBestSplit(XT, y, tried);
    // no split among the drawn features (all constant on this node's rows): try the others before making a leaf
    return best.maxColumn === undefined && tried.length < XT.rows && y.some((v) => v !== y[0]) ? sweepBestSplit(XT, y) : best;
  };
  // ml-cart's TreeNode.train copies the node's rows into two new ml-matrix Matrices and transposes them at every
  // node (half the time of a forest went there). The same recursion over row indices into the columns, made
  // once per tree: the rows reach each node, and the search sees them, in the same order, so the trees are the
  // same (forest-split.test.ts compares whole trees).
  const trainProto = proto as unknown as { train: TrainFn };
  const origTrain = (mlCartTrain = trainProto.train);
  fastTrain = function (this: TreeNodeLike, X: MatrixLike, y: number[], depth: number, parentGain: number | null | undefined) {
    if (this.kind !== "classifier" || this.gainFunction !== "gini" || this.splitFunction !== "mean") return origTrain.call(this, X, y, depth, parentGain);
    const rows = X.rows, features = X.columns;
    const cols = Array.from({ length: features }, () => new Float64Array(rows));
    for (let i = 0; i < rows; i++) {
      const r = X.getRow(i);
      for (let f = 0; f < features; f++) cols[f]![i] = r[f]!;
    }
    trainOnIndices(this, cols, Array.from({ length: rows }, (_, i) => i), y, depth, parentGain);
  };
  trainProto.train = fastTrain;
}

let mlCartTrain: TrainFn | null = null;
let fastTrain: TrainFn | null = null;

/** Runs `fn` with ml-cart's own TreeNode.train (the split search stays the sweep), for the test that compares trees. */
export function withMlCartTraining<T>(fn: () => T): T {
  useSweepSplits();
  const proto = nodeProto as { train: TrainFn };
  proto.train = mlCartTrain!;
  try {
    return fn();
  } finally {
    proto.train = fastTrain!;
  }
}

interface MatrixLike { rows: number; columns: number; getRow(i: number): number[] }
type TrainFn = (this: TreeNodeLike, X: MatrixLike, y: number[], depth: number, parentGain: number | null | undefined) => void;
interface TreeNodeLike extends NodeLike {
  minNumSamples: number; maxDepth: number; gainThreshold: number;
  splitValue: number | undefined; splitColumn: number | undefined; gain: number; numberSamples: number | undefined;
  left?: TreeNodeLike; right?: TreeNodeLike;
  bestSplit: BestSplit; calculatePrediction(y: number[]): void;
}

/** ml-cart 2.1.1's TreeNode.train (src/TreeNode.js), step for step, on row indices instead of copied matrices. */
function trainOnIndices(node: TreeNodeLike, cols: Float64Array[], idx: number[], y: number[], depth: number, parentGain: number | null | undefined): void {
  if (idx.length <= node.minNumSamples) { node.calculatePrediction(y); return; }
  if (parentGain === undefined) parentGain = 0;
  const XT: SplitMatrix = {
    rows: cols.length,
    getRow(f: number) {
      const c = cols[f]!, out = new Array<number>(idx.length);
      for (let i = 0; i < idx.length; i++) out[i] = c[idx[i]!]!;
      return out;
    },
  };
  const split = node.bestSplit(XT, y);
  node.splitValue = split.maxValue;
  node.splitColumn = split.maxColumn;
  node.gain = split.maxGain;
  node.numberSamples = split.numberSamples;
  const lesser: number[] = [], greater: number[] = [], lesserY: number[] = [], greaterY: number[] = [];
  const c = split.maxColumn === undefined ? undefined : cols[split.maxColumn]!;
  for (let i = 0; i < idx.length; i++) {
    // ml-cart: X.get(i, column) < value, which is false when no column was found (every row goes right)
    if (c && c[idx[i]!]! < split.maxValue!) { lesser.push(idx[i]!); lesserY.push(y[i]!); }
    else { greater.push(idx[i]!); greaterY.push(y[i]!); }
  }
  if (depth < node.maxDepth && node.gain > node.gainThreshold && node.gain !== parentGain && lesser.length > 0 && greater.length > 0) {
    const Node = node.constructor as new (parent: TreeNodeLike) => TreeNodeLike;
    node.left = new Node(node);
    node.right = new Node(node);
    trainOnIndices(node.left, cols, lesser, lesserY, depth + 1, node.gain);
    trainOnIndices(node.right, cols, greater, greaterY, depth + 1, node.gain);
  } else {
    node.calculatePrediction(y);
  }
}
