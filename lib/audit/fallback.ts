// Over 300 lines: the articulation graphs of every family (data) and the one search over them.
// Articulation fallback: which recorded articulation plays when the one a pad asks for was never recorded.
//
// Per family, a weighted, undirected graph of how close articulations sound (common practice of drum
// libraries, no published source): half-edge next to centre, rim click next to cross-stick, bell two steps
// from bow, half-open between closed and open ... The stand-in is the cheapest RECORDED articulation
// reachable from the requested one (Dijkstra), inside the graph of the instrument's own family only:
// the search never leaves the instrument, so it can never cross families.
//
// A requested articulation that the family's graph does not hold at all (a "centre" pad aimed at a cowbell)
// enters the graph at the family's main strike (the first articulation of FAMILY_ARTICULATIONS[family])
// at cost FOREIGN_ENTRY_COST; the path then starts with the requested word.
//
// Ties (two recorded articulations at the same cost, within 1e-9) are broken by a fixed order: the
// position in FAMILY_ARTICULATIONS[family], then the position in ARTICULATIONS for words outside the
// family's list. The same order decides between equal-cost predecessors, so paths are deterministic.
//
// Kit overrides: a slot may name, per requested articulation, the articulation to play instead. An override
// is used when the articulation it names is recorded; its path is [requested, played] and its cost
// OVERRIDE_COST. When it names something not recorded, the graph decides and the result says so.

import { ARTICULATIONS, FAMILY_ARTICULATIONS, type Articulation, type Family } from "../catalogue/taxonomy";

/** One edge of a family graph: two articulations and how far apart they sound (lower is closer). */
export type ArticulationEdge = readonly [Articulation, Articulation, number];

export const FOREIGN_ENTRY_COST = 4;
export const OVERRIDE_COST = 0;

// Drum heads struck with sticks: snare, tom (kick shares the strike part).
const STICK_DRUM: ArticulationEdge[] = [
  ["centre", "half-edge", 1],
  ["half-edge", "edge", 1],
  ["centre", "rim-shot", 2],
  ["edge", "rim-shot", 2],
  ["rim-click", "cross-stick", 1],
  ["cross-stick", "rim-shot", 3],
  ["rim-click", "rim-shot", 3],
  ["flam", "centre", 2],
  ["drag", "flam", 1],
  ["drag", "centre", 2.5],
  ["buzz", "roll", 1],
  ["buzz", "centre", 2],
  ["roll", "centre", 3],
  ["mute", "centre", 2],
];

// Cymbals (crash, ride, china, splash, stack): every cymbal articulation is a node of every cymbal graph,
// so a crash sitting in a ride slot still answers bell and bow pads, and a china with no bell answers
// both with its hit. Bell is two steps from bow (bell-bow 2); the bow and the crash hit are neighbours.
function cymbalEdges(over: ArticulationEdge[] = []): ArticulationEdge[] {
  return [
    ["bell", "bow", 2],
    ["bell", "crash-hit", 3.5],
    ["bow", "tip", 0.5],
    ["bow", "crash-hit", 1],
    ["crash-hit", "edge", 1],
    ["bow", "edge", 1.5],
    ["shank", "edge", 1],
    ["shank", "bow", 1.5],
    ["crash-hit", "hit", 0.5],
    ["choke", "crash-hit", 2],
    ["choke", "edge", 2],
    ["roll", "bow", 2],
    ["roll", "crash-hit", 2],
    ...over,
  ];
}

/** The graph of each family, as data. Later duplicates of an edge replace earlier ones. */
export const FAMILY_GRAPHS: Record<Family, readonly ArticulationEdge[]> = {
  kick: [
    ["centre", "mute", 1],
    ["centre", "heel", 1],
    ["centre", "toe", 1],
    ["heel", "toe", 1],
    ["flam", "centre", 2],
    ["centre", "hit", 0.5],
  ],
  snare: [...STICK_DRUM, ["centre", "hit", 0.5]],
  tom: [...STICK_DRUM, ["centre", "hit", 0.5]],
  "hi-hat": [
    // openness: closed - quarter-open - half-open - open; the pedal chick and the foot splash hang off the ends.
    ["closed", "quarter-open", 1],
    ["quarter-open", "half-open", 1],
    ["half-open", "open", 1.5],
    ["closed", "half-open", 2.5],
    ["closed", "tip", 0.5],
    ["closed", "shank", 1],
    ["tip", "shank", 1],
    ["tip", "bow", 0.5],
    ["shank", "edge", 0.5],
    ["closed", "pedal", 2],
    ["foot-splash", "pedal", 2],
    ["foot-splash", "half-open", 2],
    ["bell", "tip", 2],
    ["bell", "closed", 2.5],
    ["choke", "open", 2],
    ["choke", "closed", 2],
    ["closed", "hit", 0.5],
  ],
  crash: cymbalEdges(),
  ride: cymbalEdges([
    ["crash-hit", "edge", 0.5],
    ["bow", "tip", 0.5],
  ]),
  china: cymbalEdges(),
  splash: cymbalEdges(),
  stack: cymbalEdges([
    ["hit", "closed", 1],
    ["hit", "open", 1],
    ["closed", "choke", 1.5],
    ["crash-hit", "hit", 0.5],
    ["bow", "hit", 1.5],
  ]),
  cowbell: [
    ["hit", "open-tone", 1],
    ["hit", "mute", 1],
    ["bell", "hit", 1],
    ["open-tone", "mute", 2],
  ],
  "hand-drum": [
    ["open-tone", "centre", 1.5],
    ["open-tone", "edge", 1],
    ["open-tone", "slap", 2],
    ["open-tone", "mute", 1.5],
    ["slap", "mute", 2],
    ["heel", "toe", 1],
    ["heel", "centre", 1.5],
    ["toe", "edge", 1.5],
    ["open-tone", "hit", 0.5],
  ],
  shaker: [["hit", "roll", 2]],
  other: [
    ["hit", "mute", 1],
    ["hit", "open-tone", 1],
    ["hit", "choke", 2],
    ["hit", "roll", 2],
  ],
};

/** A kit slot's overrides: for a requested articulation, the articulation to play instead. */
export type StandInOverrides = Partial<Record<Articulation, Articulation>>;

export interface Resolution {
  requested: Articulation;
  /** The articulation that plays, or null when nothing recorded is reachable. */
  plays: Articulation | null;
  outcome: "direct" | "stand-in" | "silent";
  /** Articulations from the requested one to the one that plays (both included); [requested] when direct. */
  path: Articulation[];
  cost: number;
  source: "recorded" | "graph" | "override" | "none";
  /** Set when an override was given but could not be used (the articulation it names is not recorded). */
  overrideIgnored?: Articulation;
}

interface Graph {
  nodes: Articulation[]; // in tie-break order
  rank: Map<Articulation, number>;
  adj: Map<Articulation, Array<[Articulation, number]>>;
  main: Articulation;
}

const graphs = new Map<Family, Graph>();

function buildGraph(family: Family): Graph {
  const familyList = FAMILY_ARTICULATIONS[family];
  const nodeSet = new Set<Articulation>(familyList);
  const weights = new Map<string, number>();
  for (const [a, b, w] of FAMILY_GRAPHS[family]) {
    if (!(w > 0) || !Number.isFinite(w)) throw new Error(`fallback graph of ${family}: bad weight ${w} on ${a}-${b}`);
    nodeSet.add(a);
    nodeSet.add(b);
    weights.set(a < b ? `${a}|${b}` : `${b}|${a}`, w);
  }
  const order = (x: Articulation) => {
    const i = familyList.indexOf(x);
    return i >= 0 ? i : familyList.length + ARTICULATIONS.indexOf(x);
  };
  const nodes = [...nodeSet].sort((x, y) => order(x) - order(y));
  const rank = new Map(nodes.map((n, i) => [n, i] as const));
  const adj = new Map<Articulation, Array<[Articulation, number]>>(nodes.map((n) => [n, []]));
  for (const [key, w] of weights) {
    const [a, b] = key.split("|") as [Articulation, Articulation];
    adj.get(a)!.push([b, w]);
    adj.get(b)!.push([a, w]);
  }
  return { nodes, rank, adj, main: familyList[0] ?? nodes[0]! };
}

function graphOf(family: Family): Graph {
  let g = graphs.get(family);
  if (!g) {
    g = buildGraph(family);
    graphs.set(family, g);
  }
  return g;
}

/** The articulations the graph of a family holds, in tie-break order. */
export function graphNodes(family: Family): Articulation[] {
  return [...graphOf(family).nodes];
}

/** Cheapest distance from `from` to every node of the family graph, with predecessors (deterministic). */
function dijkstra(g: Graph, from: Articulation): { dist: Map<Articulation, number>; prev: Map<Articulation, Articulation> } {
  const dist = new Map<Articulation, number>([[from, 0]]);
  const prev = new Map<Articulation, Articulation>();
  const done = new Set<Articulation>();
  // The graphs have at most ~20 nodes: a linear scan for the minimum is simplest and fast.
  for (;;) {
    let u: Articulation | null = null;
    let du = Infinity;
    for (const [n, d] of dist) {
      if (done.has(n)) continue;
      if (d < du - 1e-9 || (Math.abs(d - du) <= 1e-9 && u !== null && g.rank.get(n)! < g.rank.get(u)!)) {
        u = n;
        du = d;
      }
    }
    if (u === null) break;
    done.add(u);
    for (const [v, w] of g.adj.get(u)!) {
      if (done.has(v)) continue;
      const nd = du + w;
      const old = dist.get(v);
      if (old === undefined || nd < old - 1e-9 || (Math.abs(nd - old) <= 1e-9 && g.rank.get(u)! < g.rank.get(prev.get(v)!)!)) {
        dist.set(v, nd);
        prev.set(v, u);
      }
    }
  }
  return { dist, prev };
}

const cache = new Map<string, Resolution>();

/**
 * Resolve a requested articulation against what one instrument of `family` has recorded.
 * Pure and deterministic; results are memoised by (family, requested, recorded set, override).
 */
export function resolveArticulation(
  family: Family,
  requested: Articulation,
  recorded: Iterable<Articulation>,
  overrides?: StandInOverrides | null,
): Resolution {
  const rec = new Set(recorded);
  const override = overrides?.[requested];
  const key = `${family}|${requested}|${[...rec].sort().join(",")}|${override ?? ""}`;
  const hit = cache.get(key);
  if (hit) return cloneResolution(hit);
  const r = resolveUncached(family, requested, rec, override);
  if (cache.size > 50_000) cache.clear();
  cache.set(key, r);
  return cloneResolution(r);
}

function cloneResolution(r: Resolution): Resolution {
  return Object.assign({}, r, { path: r.path.slice() });
}

function resolveUncached(family: Family, requested: Articulation, rec: Set<Articulation>, override: Articulation | undefined): Resolution {
  if (rec.has(requested)) {
    return { requested, plays: requested, outcome: "direct", path: [requested], cost: 0, source: "recorded" };
  }
  if (override !== undefined && rec.has(override)) {
    return { requested, plays: override, outcome: "stand-in", path: [requested, override], cost: OVERRIDE_COST, source: "override" };
  }
  const g = graphOf(family);
  let start: Articulation = requested;
  let entryCost = 0;
  const prefix: Articulation[] = [];
  if (!g.rank.has(requested)) {
    start = g.main;
    entryCost = FOREIGN_ENTRY_COST;
    prefix.push(requested);
    if (rec.has(start)) {
      return withOverride({ requested, plays: start, outcome: "stand-in", path: [requested, start], cost: entryCost, source: "graph" }, override);
    }
  }
  const { dist, prev } = dijkstra(g, start);
  let best: Articulation | null = null;
  let bestD = Infinity;
  for (const n of g.nodes) {
    // g.nodes is in tie-break order, so the first of equal cost wins
    if (!rec.has(n)) continue;
    const d = dist.get(n);
    if (d === undefined) continue;
    if (d < bestD - 1e-9) {
      best = n;
      bestD = d;
    }
  }
  if (best === null) {
    return withOverride({ requested, plays: null, outcome: "silent", path: [], cost: Infinity, source: "none" }, override);
  }
  const path: Articulation[] = [best];
  for (let n = best; n !== start; ) {
    n = prev.get(n)!;
    path.unshift(n);
  }
  return withOverride(
    { requested, plays: best, outcome: "stand-in", path: [...prefix, ...path], cost: round6(bestD + entryCost), source: "graph" },
    override,
  );
}

function withOverride(r: Resolution, override: Articulation | undefined): Resolution {
  return override !== undefined ? Object.assign({}, r, { overrideIgnored: override }) : r;
}

function round6(x: number): number {
  return Math.round(x * 1e6) / 1e6;
}
