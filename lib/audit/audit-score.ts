// Scoring and the summary of an audit. The score is the share of what a layout asks for (its pads, its pedal
// zones, the pedal's chick note) that will really play, weighted by how well, on a scale of 100:
//
//   score = round(100 × Σ vᵢ / N)          N: the pads, pedal zones and chick note of the layout
//   vᵢ    = wᵢ × cᵢ × kᵢ
//   wᵢ    = 1 played as recorded; max(½, 1 − d/10) played by a stand-in d steps away; 0 silent
//   cᵢ    = velocities 1-127 that one of its layers covers, divided by 127
//   kᵢ    = 0 when another pad sends the same note on the same channel for a different sound (or its note or
//           channel cannot be sent), else 1
//
// d is the stand-in's distance in the family's closeness weights (fallback.ts: one neighbouring stroke is 1,
// a half-open hat played by the open hat 1.5, a rim shot played by the centre 2). An empty slot is a silent
// pad (w = 0), counted once, never also as a conflict; other conflicts (a pad outside the grid, a duplicate pad
// id) change nothing that plays and do not enter the score. The weights are Kitwright's own choice (common
// practice of drum libraries for the closeness weights, no published source). Pure.

import type { AuditResult, AuditScore, Conflict, EmptySlotGroup, PadFinding, PedalFinding, PlayFinding } from "./types";

/** Score formula in words, stated once for code, docs and exports (SCHEMA.md "Score" has it in maths). */
export const SCORE_FORMULA =
  "score = round(100 × sum of item values / items), out of 100; items are the pads, the pedal zones and the pedal chick note; " +
  "item value = weight × coverage × clash; weight = 1 played as recorded, max(0.5, 1 − 0.1 × steps) played by a stand-in " +
  "that many steps away, 0 silent (an empty slot is silent); coverage = velocities 1-127 covered by a layer / 127; " +
  "clash = 0 when another pad sends the same note and channel for a different sound or the note or channel cannot be sent, else 1";

/** Lowest weight of a stand-in, however far it is. */
export const STAND_IN_FLOOR = 0.5;
/** Weight a stand-in loses per step of distance. */
export const STAND_IN_STEP = 0.1;

/** Conflict kinds that stop a pad from playing what it asks for: its value counts 0. */
export const CLASH_KINDS: ReadonlySet<Conflict["kind"]> = new Set(["note-shared", "note-out-of-range", "channel-out-of-range"]);

/** How much a way of playing is worth: 1 as recorded, a stand-in by its distance, 0 silent. */
export function playWeight(f: Pick<PlayFinding, "outcome" | "standIn">): number {
  if (f.outcome === "direct") return 1;
  if (f.outcome === "silent") return 0;
  return Math.max(STAND_IN_FLOOR, 1 - STAND_IN_STEP * (f.standIn?.cost ?? 0));
}

/** Share of velocities 1-127 that a layer covers. */
export function velocityCoverage(f: Pick<PlayFinding, "velocityGaps">): number {
  const gap = f.velocityGaps.reduce((s, g) => s + (g.high - g.low + 1), 0);
  return (127 - gap) / 127;
}

/** Value of one finding in the score, before any note clash (weight × coverage). */
export function itemScore(f: Pick<PlayFinding, "outcome" | "standIn" | "velocityGaps">): number {
  const w = playWeight(f);
  return w === 0 ? 0 : w * velocityCoverage(f);
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The score of the pads and the pedal (its zones and chick note), the conflicts and the empty slots found. */
export function scoreAudit(
  pads: readonly PadFinding[],
  pedal: PedalFinding | null,
  conflicts: readonly Conflict[],
  emptySlots: readonly EmptySlotGroup[],
): AuditScore {
  const clashed = new Set<string>();
  for (const c of conflicts) if (CLASH_KINDS.has(c.kind)) for (const id of c.padIds) clashed.add(id);
  type Item = { f: PlayFinding; id: string };
  const items: Item[] = [
    ...pads.map((p) => ({ f: p as PlayFinding, id: p.padId })),
    ...(pedal ? pedal.zones.map((z) => ({ f: z as PlayFinding, id: `pedal-zone-${z.zoneIndex + 1}` })) : []),
    ...(pedal?.chick ? [{ f: pedal.chick as PlayFinding, id: pedal.chick.padId }] : []),
  ];
  let itemSum = 0;
  let direct = 0;
  let standIn = 0;
  let silent = 0;
  let noteClashes = 0;
  let withGaps = 0;
  for (const { f, id } of items) {
    if (f.outcome === "silent") { silent++; continue; }
    if (clashed.has(id)) { noteClashes++; continue; }
    itemSum += itemScore(f);
    if (f.outcome === "direct") direct++;
    else standIn++;
    if (f.velocityGaps.length) withGaps++;
  }
  const n = items.length;
  const value = n ? Math.round((100 * itemSum) / n) : 0;
  const sounding = direct + standIn;
  const onEmpty = emptySlots.reduce((s, g) => s + g.padIds.length, 0);
  return {
    value,
    outOf: 100,
    sentence: scoreSentence({ items: n, direct, standIn, silent, onEmpty, noteClashes, withGaps, pedal: !!pedal }),
    formula: SCORE_FORMULA,
    items: n,
    itemSum: Math.round(itemSum * 1e6) / 1e6,
    sounding,
    noteClashes,
    withGaps,
  };
}

/** One sentence of plain words for the counts behind a score. */
export function scoreSentence(c: { items: number; direct: number; standIn: number; silent: number; onEmpty: number; noteClashes: number; withGaps: number; pedal: boolean }): string {
  const noun = c.pedal ? "pads and pedal positions" : "pads";
  if (c.items === 0) return "The layout has no pads, so nothing will play.";
  const sounding = c.direct + c.standIn;
  if (sounding === c.items && c.standIn === 0 && c.withGaps === 0) {
    return c.items === 1 ? "The one pad plays what you asked, as recorded, at every velocity." : `All ${c.items} ${noun} play what you asked, as recorded, at every velocity.`;
  }
  let head = sounding === c.items ? `All ${c.items} ${noun} will sound` : sounding === 0 ? `None of the ${c.items} ${noun} will sound` : `${sounding} of ${c.items} ${noun} will sound`;
  if (sounding > 0) head += c.standIn === 0 ? " as recorded" : c.direct === 0 ? ` through ${c.standIn === 1 ? "a stand-in" : "stand-ins"}` : ` (${c.direct} as recorded, ${c.standIn} through ${c.standIn === 1 ? "a stand-in" : "stand-ins"})`;
  const tails: string[] = [];
  if (c.silent > 0) {
    let t = `${c.silent} ${c.silent === 1 ? "stays" : "stay"} silent`;
    if (c.onEmpty === c.silent) t += c.silent === 1 ? ", on a slot the kit leaves empty" : ", all on slots the kit leaves empty";
    else if (c.onEmpty > 0) t += `, ${c.onEmpty} of them on slots the kit leaves empty`;
    tails.push(t);
  }
  if (c.noteClashes > 0) tails.push(`${plural(c.noteClashes, "pad shares its note", "pads share their note")} with another sound`);
  if (c.withGaps > 0) tails.push(`${c.withGaps} ${c.withGaps === 1 ? "misses" : "miss"} some velocities`);
  return `${head}${tails.length ? `; ${tails.join("; ")}` : ""}.`;
}

/** Counts of the findings: pads by outcome, pedal zones recorded, conflicts, empty slots. */
export function summarizeAudit(pads: readonly PadFinding[], pedal: PedalFinding | null, conflicts: number): AuditResult["summary"] {
  const count = (o: string) => pads.filter((p) => p.outcome === o).length;
  return {
    pads: pads.length,
    direct: count("direct"),
    standIn: count("stand-in"),
    silent: count("silent"),
    pedalZones: pedal?.zones.length ?? 0,
    pedalZonesRecorded: pedal?.zones.filter((z) => z.recorded).length ?? 0,
    conflicts,
  };
}
