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
// Kit overrides (a slot's stroke map): a slot may name, per requested stroke, the stroke to play instead. An
// override is used when the stroke it names is recorded; its path is [requested, played] and its cost
// OVERRIDE_COST. When it names something not recorded, the graph decides and the result says so.
//
// A studio's own strokes (lib/catalogue/strokes.ts) join the graphs of their families with the edges the studio
// gave them (on top of the built-in edges; a studio edge between two built-ins replaces the built-in one). Every
// stand-in names the edges its path used and whose they are (built-in or the studio's). Studio strokes come after
// the built-ins in the tie-break order, in the order of the studio's list.

import { ARTICULATIONS, FAMILY_ARTICULATIONS, type Articulation, type Family, type Stroke } from "../catalogue/taxonomy";
import { studioEdges, strokeListSignature, type StrokeList } from "../catalogue/strokes";

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
  // brushes: a brush tap is nearest a soft centre hit; a sweep is a sustained sound, nearest a roll
  ["brush", "centre", 2],
  ["sweep", "brush", 2],
  ["sweep", "roll", 2.5],
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
    // the tip strikes the open end (bright, ringing), the shank the closed neck (dry, lower)
    ["tip", "hit", 1],
    ["tip", "open-tone", 1],
    ["shank", "hit", 1],
    ["shank", "mute", 1.5],
    ["tip", "shank", 2],
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
    // the bass stroke (palm in the middle) is the low, open sound; finger strokes are soft open tones; a rim stroke
    // is a sharp, high click at the edge
    ["bass", "open-tone", 2],
    ["bass", "heel", 1.5],
    ["bass", "centre", 1],
    ["finger", "open-tone", 1.5],
    ["finger", "edge", 1],
    ["rim", "edge", 1],
    ["rim", "slap", 2],
    ["rim", "finger", 2],
  ],
  shaker: [["hit", "roll", 2]],
  other: [
    ["hit", "mute", 1],
    ["hit", "open-tone", 1],
    ["hit", "choke", 2],
    ["hit", "roll", 2],
  ],
};

/** A kit slot's overrides (its stroke map): for a requested stroke, the stroke to play instead. */
export type StandInOverrides = Partial<Record<Stroke, Stroke>>;

/** One step of a stand-in's path: the edge it used, its cost and whose edge it is. */
export interface StrokeEdgeUsed {
  from: Stroke;
  to: Stroke;
  cost: number;
  owner: "built-in" | "studio";
}

export interface Resolution {
  requested: Stroke;
  /** The stroke that plays, or null when nothing recorded is reachable. */
  plays: Stroke | null;
  outcome: "direct" | "stand-in" | "silent";
  /** Strokes from the requested one to the one that plays (both included); [requested] when direct. */
  path: Stroke[];
  /** The edges the path used, in order (empty when direct or played through the stroke map). */
  edges: StrokeEdgeUsed[];
  cost: number;
  source: "recorded" | "graph" | "override" | "none";
  /** Set when an override was given but could not be used (the stroke it names is not recorded). */
  overrideIgnored?: Stroke;
}

interface Graph {
  nodes: Stroke[]; // in tie-break order
  rank: Map<Stroke, number>;
  adj: Map<Stroke, Array<[Stroke, number]>>;
  /** Whose each edge is, by the key edgeKey(a, b). */
  owner: Map<string, "built-in" | "studio">;
  main: Stroke;
}

const graphs = new Map<string, Graph>();
const edgeKey = (a: Stroke, b: Stroke) => (a < b ? `${a}|${b}` : `${b}|${a}`);

function buildGraph(family: Family, strokes: StrokeList | null | undefined): Graph {
  const familyList: readonly Stroke[] = FAMILY_ARTICULATIONS[family];
  const nodeSet = new Set<Stroke>(familyList);
  const weights = new Map<string, number>();
  const owner = new Map<string, "built-in" | "studio">();
  const add = (a: Stroke, b: Stroke, w: number, who: "built-in" | "studio") => {
    if (!(w > 0) || !Number.isFinite(w)) throw new Error(`fallback graph of ${family}: bad weight ${w} on ${a}-${b}`);
    nodeSet.add(a);
    nodeSet.add(b);
    weights.set(edgeKey(a, b), w);
    owner.set(edgeKey(a, b), who);
  };
  for (const [a, b, w] of FAMILY_GRAPHS[family]) add(a, b, w, "built-in");
  const builtInNodes = new Set(nodeSet);
  const own = (strokes ?? []).filter((s) => s.families.includes(family)).map((s) => s.id);
  for (const id of own) nodeSet.add(id);
  for (const [a, b, w] of studioEdges(family, strokes, (x) => builtInNodes.has(x))) add(a, b, w, "studio");
  const order = (x: Stroke) => {
    const i = familyList.indexOf(x);
    if (i >= 0) return i;
    const j = (ARTICULATIONS as readonly string[]).indexOf(x);
    return j >= 0 ? familyList.length + j : familyList.length + ARTICULATIONS.length + own.indexOf(x);
  };
  const nodes = [...nodeSet].sort((x, y) => order(x) - order(y));
  const rank = new Map(nodes.map((n, i) => [n, i] as const));
  const adj = new Map<Stroke, Array<[Stroke, number]>>(nodes.map((n) => [n, []]));
  for (const [key, w] of weights) {
    const [a, b] = key.split("|") as [Stroke, Stroke];
    adj.get(a)!.push([b, w]);
    adj.get(b)!.push([a, w]);
  }
  return { nodes, rank, adj, owner, main: familyList[0] ?? nodes[0]! };
}

function graphOf(family: Family, strokes?: StrokeList | null): Graph {
  const key = `${family}\u0000${strokeListSignature(strokes)}`;
  let g = graphs.get(key);
  if (!g) {
    if (graphs.size > 500) graphs.clear();
    g = buildGraph(family, strokes);
    graphs.set(key, g);
  }
  return g;
}

/** The strokes the graph of a family holds (with the studio's own), in tie-break order. */
export function graphNodes(family: Family, strokes?: StrokeList | null): Stroke[] {
  return [...graphOf(family, strokes).nodes];
}

/** The edges of a family's graph (with the studio's), each once, with its owner. */
export function graphEdges(family: Family, strokes?: StrokeList | null): StrokeEdgeUsed[] {
  const g = graphOf(family, strokes);
  const out: StrokeEdgeUsed[] = [];
  for (const [a, list] of g.adj) for (const [b, w] of list) if (a < b) out.push({ from: a, to: b, cost: w, owner: g.owner.get(edgeKey(a, b))! });
  return out;
}

/** Cheapest distance from `from` to every node of the family graph, with predecessors (deterministic). */
function dijkstra(g: Graph, from: Stroke): { dist: Map<Stroke, number>; prev: Map<Stroke, Stroke> } {
  const dist = new Map<Stroke, number>([[from, 0]]);
  const prev = new Map<Stroke, Stroke>();
  const done = new Set<Stroke>();
  // The graphs have a few dozen nodes at most: a linear scan for the minimum is simplest and fast.
  for (;;) {
    let u: Stroke | null = null;
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
 * Resolve a requested stroke against what one instrument of `family` has recorded, in the family's graph with
 * the studio's own strokes and edges (`strokes`). Pure and deterministic; results are memoised by (family,
 * requested, recorded set, override, stroke list).
 */
export function resolveArticulation(
  family: Family,
  requested: Stroke,
  recorded: Iterable<Stroke>,
  overrides?: StandInOverrides | null,
  strokes?: StrokeList | null,
): Resolution {
  const rec = new Set(recorded);
  const override = overrides?.[requested];
  const key = `${family}|${requested}|${[...rec].sort().join(",")}|${override ?? ""}|${strokeListSignature(strokes)}`;
  const hit = cache.get(key);
  if (hit) return cloneResolution(hit);
  const r = resolveUncached(graphOf(family, strokes), requested, rec, override);
  if (cache.size > 50_000) cache.clear();
  cache.set(key, r);
  return cloneResolution(r);
}

function cloneResolution(r: Resolution): Resolution {
  return Object.assign({}, r, { path: r.path.slice(), edges: r.edges.map((e) => Object.assign({}, e)) });
}

function resolveUncached(g: Graph, requested: Stroke, rec: Set<Stroke>, override: Stroke | undefined): Resolution {
  if (rec.has(requested)) {
    return { requested, plays: requested, outcome: "direct", path: [requested], edges: [], cost: 0, source: "recorded" };
  }
  if (override !== undefined && rec.has(override)) {
    return { requested, plays: override, outcome: "stand-in", path: [requested, override], edges: [], cost: OVERRIDE_COST, source: "override" };
  }
  let start: Stroke = requested;
  let entryCost = 0;
  const prefix: Stroke[] = [];
  if (!g.rank.has(requested)) {
    start = g.main;
    entryCost = FOREIGN_ENTRY_COST;
    prefix.push(requested);
    if (rec.has(start)) {
      return withOverride({ requested, plays: start, outcome: "stand-in", path: [requested, start], edges: [], cost: entryCost, source: "graph" }, override);
    }
  }
  const { dist, prev } = dijkstra(g, start);
  let best: Stroke | null = null;
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
    return withOverride({ requested, plays: null, outcome: "silent", path: [], edges: [], cost: Infinity, source: "none" }, override);
  }
  const path: Stroke[] = [best];
  for (let n = best; n !== start; ) {
    n = prev.get(n)!;
    path.unshift(n);
  }
  const edges: StrokeEdgeUsed[] = [];
  for (let i = 1; i < path.length; i++) {
    const a = path[i - 1]!, b = path[i]!;
    const w = g.adj.get(a)!.find(([x]) => x === b)![1];
    edges.push({ from: a, to: b, cost: w, owner: g.owner.get(edgeKey(a, b))! });
  }
  return withOverride(
    { requested, plays: best, outcome: "stand-in", path: [...prefix, ...path], edges, cost: round6(bestD + entryCost), source: "graph" },
    override,
  );
}

function withOverride(r: Resolution, override: Stroke | undefined): Resolution {
  return override !== undefined ? Object.assign({}, r, { overrideIgnored: override }) : r;
}

function round6(x: number): number {
  return Math.round(x * 1e6) / 1e6;
}
