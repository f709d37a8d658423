// Scoring and the summary of an audit: each pad, pedal zone and the pedal chick note weighs by how it plays
// (direct, a stand-in by its cost, silent) and by the velocities its layers cover; each conflict costs a fixed
// penalty. The formula is stated once (SCORE_FORMULA) for code, docs and exports. Pure.

import type { AuditResult, AuditScore, PadFinding, PedalFinding, PlayFinding } from "./types";

/** Score formula, stated once for code, docs and exports. */
export const SCORE_FORMULA =
  "score = clamp(100 * sum(item) / items - 5 * conflicts, 0, 100), rounded to 0.1; " +
  "items are the pads, the pedal zones and the pedal chick note; " +
  "item = weight * (velocities 1-127 covered by a layer) / 127; " +
  "weight = 1 for direct, max(0.5, 1 - 0.1 * cost) for a stand-in, 0 for silent";

export const CONFLICT_PENALTY = 5;

/** Weight of one finding in the score (see SCORE_FORMULA). */
export function itemScore(f: Pick<PlayFinding, "outcome" | "standIn" | "velocityGaps">): number {
  const weight = f.outcome === "direct" ? 1 : f.outcome === "stand-in" ? Math.max(0.5, 1 - 0.1 * (f.standIn?.cost ?? 0)) : 0;
  if (weight === 0) return 0;
  const gapCount = f.velocityGaps.reduce((s, g) => s + (g.high - g.low + 1), 0);
  return (weight * (127 - gapCount)) / 127;
}

/** The score of the pads and the pedal (its zones and chick note) with `conflicts` conflicts. */
export function scoreAudit(pads: readonly PadFinding[], pedal: PedalFinding | null, conflicts: number): AuditScore {
  const items: PlayFinding[] = [...pads, ...(pedal ? pedal.zones : []), ...(pedal?.chick ? [pedal.chick] : [])];
  const itemSum = items.reduce((s, f) => s + itemScore(f), 0);
  const penalty = CONFLICT_PENALTY * conflicts;
  const raw = items.length ? (100 * itemSum) / items.length - penalty : 0;
  return {
    value: Math.round(Math.min(100, Math.max(0, raw)) * 10) / 10,
    formula: SCORE_FORMULA,
    items: items.length,
    itemSum: Math.round(itemSum * 1e6) / 1e6,
    conflictPenalty: penalty,
  };
}

/** Counts of the findings: pads by outcome, pedal zones recorded, conflicts. */
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
