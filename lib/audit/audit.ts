// The coverage audit: what every pad (and every hi-hat pedal zone) of a layout will really play with a kit.
// Pure: layout + kit + catalogue in, findings out. See SCHEMA.md for the meaning of every field.
// runAudit is the entry point; its stages live beside it: pad resolution (audit-pads.ts), pedal zones
// (audit-pedal.ts), conflicts (audit-conflicts.ts), scoring and summary (audit-score.ts).

import { checkNotesAndChannels, ConflictLog } from "./audit-conflicts";
import { auditPads, indexCatalogue, slotResolver } from "./audit-pads";
import { auditPedal } from "./audit-pedal";
import { scoreAudit, summarizeAudit } from "./audit-score";
import type { AuditResult, Catalogue, CatalogueInstrument, Kit, Layout, PedalFinding, PlayFinding, StrokeList, StudioStroke } from "./types";

export { CONFLICT_ORDER } from "./audit-conflicts";
export { indexCatalogue, uncoveredRanges } from "./audit-pads";
export { SCORE_FORMULA, itemScore, playWeight, velocityCoverage } from "./audit-score";

/**
 * Audit a layout against a kit and a catalogue.
 * A slot holding an instrument of another family is answered by that instrument's own family graph.
 */
export function runAudit(
  layout: Layout,
  kit: Kit,
  catalogue: Catalogue | ReadonlyMap<string, CatalogueInstrument>,
  opts: AuditOptions = {},
): AuditResult {
  const log = new ConflictLog();
  const strokes = opts.strokes ?? null;
  const play = slotResolver(kit, indexCatalogue(catalogue), log, strokes);
  const pads = auditPads(layout, play, log);
  const pedal = layout.hiHatPedal ? auditPedal(layout.hiHatPedal, play, log) : null;
  checkNotesAndChannels([...pads, ...(pedal?.chick ? [pedal.chick] : [])], log);
  const conflicts = log.sorted();
  const emptySlots = log.emptySlots();
  return {
    layoutId: layout.id,
    layoutName: layout.name,
    kitId: kit.id,
    kitName: kit.name,
    conflicts,
    emptySlots,
    summary: summarizeAudit(pads, pedal, conflicts.length),
    score: scoreAudit(pads, pedal, conflicts, emptySlots),
    pads,
    pedal,
    strokes: strokesMet(strokes, pads, pedal),
  };
}

export interface AuditOptions {
  /** The studio's own strokes (lib/catalogue/strokes.ts): their edges join the fallback graphs. */
  strokes?: StrokeList | null;
}

/** The studio strokes the findings name (asked for, played, or on a stand-in's path), in the studio's order. */
function strokesMet(strokes: StrokeList | null, pads: readonly PlayFinding[], pedal: PedalFinding | null): StudioStroke[] {
  if (!strokes?.length) return [];
  const named = new Set<string>();
  for (const f of [...pads, ...(pedal?.zones ?? []), ...(pedal?.chick ? [pedal.chick] : [])]) {
    if (f.requested) named.add(f.requested);
    if (f.plays) named.add(f.plays);
    for (const a of f.standIn?.path ?? []) named.add(a);
  }
  return strokes.filter((s) => named.has(s.id));
}

/** True when any pad (or the pedal chick note, or a pedal zone) would play nothing. */
export function hasSilentPads(result: AuditResult): boolean {
  return result.pads.some((p) => p.outcome === "silent") || !!result.pedal?.zones.some((z) => z.outcome === "silent") || result.pedal?.chick?.outcome === "silent";
}
