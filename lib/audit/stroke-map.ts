// A slot's stroke map: when a kit slot holds an instrument of another family (a conga in the snare slot, a usual
// trick to play it from the snare pads), which of the instrument's strokes answers each stroke the slot's family
// offers. Kitwright proposes one; the user edits it; the audit plays through it (fallback.ts overrides) and says so.
//
// The proposal matches strokes by the part they play in a groove (our judgement, common practice of drummers, no
// published source): the main stroke (snare centre, conga open tone, ride bow), the accent (rim shot, slap), the
// click (cross-stick, a hand drum's rim stroke), the damped stroke (mute, choke), the edge stroke (edge, shank,
// finger), the low stroke (bass, heel), the sustained one (roll, buzz, sweep). A slot stroke takes the first
// recorded stroke of the instrument's family with the same part; failing that (or for a studio stroke, which has
// no part), the nearest recorded stroke in the instrument's own graph (with the studio's edges).
// Pure.

import { familyStrokes, type StrokeList } from "../catalogue/strokes";
import type { Family, Stroke } from "../catalogue/taxonomy";
import { resolveArticulation, type StandInOverrides } from "./fallback";

export type StrokePart = "main" | "accent" | "click" | "damped" | "edge" | "low" | "sustain" | "ornament";

/** The part each built-in stroke plays (see the top comment). */
export const STROKE_PART: Readonly<Record<string, StrokePart>> = {
  centre: "main", closed: "main", bow: "main", "crash-hit": "main", hit: "main", "open-tone": "main", brush: "main",
  "rim-shot": "accent", slap: "accent", bell: "accent", open: "accent",
  "cross-stick": "click", "rim-click": "click", rim: "click", tip: "click",
  mute: "damped", choke: "damped", pedal: "damped",
  edge: "edge", "half-edge": "edge", shank: "edge", finger: "edge", "quarter-open": "edge", "half-open": "edge",
  bass: "low", heel: "low", toe: "low",
  roll: "sustain", buzz: "sustain", sweep: "sustain", "foot-splash": "sustain",
  flam: "ornament", drag: "ornament",
};

const PART_WORDS: Record<StrokePart, string> = {
  main: "the main stroke",
  accent: "the accent",
  click: "the click",
  damped: "the damped stroke",
  edge: "the edge stroke",
  low: "the low stroke",
  sustain: "the sustained stroke",
  ornament: "the ornament",
};

export interface StrokeMapEntry {
  /** A stroke the slot's family offers. */
  requested: Stroke;
  /** The instrument's stroke that answers it; null when nothing recorded comes close. */
  plays: Stroke | null;
  /** "recorded": the instrument has the stroke itself; "part": same part in a groove; "graph": nearest recorded. */
  how: "recorded" | "part" | "graph" | "none";
  why: string;
}

/**
 * Propose a stroke map for a slot of `slotFamily` holding an instrument of `instrumentFamily` that recorded
 * `recorded`. One entry per stroke of the slot's family (built-in, then the studio's own), in that order.
 */
export function proposeStrokeMap(
  slotFamily: Family,
  instrumentFamily: Family,
  recorded: Iterable<Stroke>,
  strokes?: StrokeList | null,
): StrokeMapEntry[] {
  const rec = new Set(recorded);
  const theirs = familyStrokes(instrumentFamily, strokes);
  return familyStrokes(slotFamily, strokes).map((requested): StrokeMapEntry => {
    if (rec.has(requested)) return { requested, plays: requested, how: "recorded", why: `the ${instrumentFamily} has a ${requested} of its own` };
    const part = STROKE_PART[requested];
    if (part) {
      const same = theirs.find((s) => STROKE_PART[s] === part && rec.has(s));
      if (same) return { requested, plays: same, how: "part", why: `${same} is ${PART_WORDS[part]} of a ${instrumentFamily}, as ${requested} is of a ${slotFamily}` };
    }
    const r = resolveArticulation(instrumentFamily, requested, rec, null, strokes);
    if (r.plays === null) return { requested, plays: null, how: "none", why: `nothing recorded on the ${instrumentFamily} comes close` };
    return { requested, plays: r.plays, how: "graph", why: `${r.plays} is the nearest recorded ${instrumentFamily} stroke` };
  });
}

/** The overrides a proposal stands for: the entries that play another stroke than the one asked. */
export function strokeMapOverrides(entries: readonly StrokeMapEntry[]): StandInOverrides {
  const out: StandInOverrides = {};
  for (const e of entries) if (e.plays !== null && e.plays !== e.requested) out[e.requested] = e.plays;
  return out;
}
