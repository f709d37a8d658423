// Pad resolution: what a kit slot really plays for a requested articulation (recorded, a stand-in found in
// the fallback graph or a slot's override, or nothing), with the layers, velocity gaps and round robins of
// what plays, and the finding of each pad of a layout. Pure.

import { isKnownStroke, type StrokeList } from "../catalogue/strokes";
import { resolveArticulation } from "./fallback";
import { isInt, type ConflictLog } from "./audit-conflicts";
import type {
  Stroke,
  Catalogue,
  CatalogueArticulation,
  CatalogueInstrument,
  Kit,
  KitSlot,
  LayerFinding,
  Layout,
  Pad,
  PadFinding,
  PlayFinding,
  VelocityRange,
} from "./types";

/** Ranges of [lo, hi] that none of `ranges` covers (inclusive integers). */
export function uncoveredRanges(ranges: readonly VelocityRange[], lo: number, hi: number): VelocityRange[] {
  const covered = new Uint8Array(hi - lo + 1);
  for (const r of ranges) {
    const a = Math.max(lo, Math.ceil(r.low));
    const b = Math.min(hi, Math.floor(r.high));
    for (let v = a; v <= b; v++) covered[v - lo] = 1;
  }
  const out: VelocityRange[] = [];
  let start = -1;
  for (let v = lo; v <= hi + 1; v++) {
    const c = v <= hi ? covered[v - lo] : 1;
    if (!c && start < 0) start = v;
    if (c && start >= 0) {
      out.push({ low: start, high: v - 1 });
      start = -1;
    }
  }
  return out;
}

/** Index a catalogue by instrument id (reuse it across audits of the same catalogue). */
export function indexCatalogue(catalogue: Catalogue | ReadonlyMap<string, CatalogueInstrument>): ReadonlyMap<string, CatalogueInstrument> {
  if (catalogue instanceof Map) return catalogue;
  const m = new Map<string, CatalogueInstrument>();
  for (const inst of catalogue as Catalogue) if (!m.has(inst.id)) m.set(inst.id, inst);
  return m;
}

function recordedEntries(inst: CatalogueInstrument): Map<Stroke, CatalogueArticulation[]> {
  const m = new Map<Stroke, CatalogueArticulation[]>();
  for (const a of inst.articulations) {
    if (!a.layers.some((l) => l.sampleIds.length > 0)) continue;
    const list = m.get(a.articulation);
    if (list) list.push(a);
    else m.set(a.articulation, [a]);
  }
  return m;
}

// Objects are built with Object.assign rather than object spread: some TypeScript transforms turn spreads
// into helper calls that cost tens of microseconds each, which matters for 128-pad audits.
function emptyPlay(partial: Partial<PlayFinding>): PlayFinding {
  return Object.assign({
    outcome: "silent",
    requested: null,
    plays: null,
    standIn: null,
    reason: null,
    slotId: null,
    slotName: null,
    instrumentId: null,
    instrumentName: null,
    family: null,
    mic: null,
    layers: [],
    velocityGaps: [{ low: 1, high: 127 }],
    minRoundRobins: 0,
    notes: [],
  }, partial);
}

/** A copy of a (cached, shared) finding that its asker may own. */
export const clonePlay = (p: PlayFinding): PlayFinding => Object.assign({}, p, { notes: p.notes.slice() });

/** What `slotId` plays when asked for `requested` by `askerId` (a pad id or a pedal zone, named `askerLabel`). */
export type Play = (slotId: string, requested: Stroke, askerId: string, askerLabel: string) => PlayFinding;

/**
 * The resolver of one audit: answers are cached per slot and articulation, problems of a slot go to the log
 * (once per slot, naming every asker), and so does an empty slot (a silent pad, reported once per slot). A slot holding an instrument of another family is answered by that
 * instrument's own family graph.
 */
export function slotResolver(kit: Kit, instruments: ReadonlyMap<string, CatalogueInstrument>, log: ConflictLog, strokes?: StrokeList | null): Play {
  const slots = new Map<string, KitSlot>();
  for (const s of kit.slots) if (!slots.has(s.id)) slots.set(s.id, s);
  const recordedCache = new Map<string, Map<Stroke, CatalogueArticulation[]>>();
  const playCache = new Map<string, PlayFinding>();

  return function play(slotId: string, requested: Stroke, askerId: string, askerLabel: string): PlayFinding {
    const slot = slots.get(slotId);
    if (!slot) {
      const reason = `no slot "${slotId}" in kit "${kit.name}"`;
      log.slotProblem("unknown-slot", slotId, reason, askerId);
      return emptyPlay({ requested, slotId, reason });
    }
    const base = { requested, slotId, slotName: slot.name };
    if (slot.instrumentId === null) {
      const reason = `slot "${slot.name}" is empty`;
      log.emptySlot(slotId, slot.name, askerId, askerLabel);
      return emptyPlay(Object.assign({ reason }, base));
    }
    const inst = instruments.get(slot.instrumentId);
    if (!inst) {
      const reason = `slot "${slot.name}" holds instrument "${slot.instrumentId}", which is not in the catalogue`;
      log.slotProblem("unknown-instrument", slotId, reason, askerId);
      return emptyPlay(Object.assign({ instrumentId: slot.instrumentId, reason }, base));
    }
    const key = `${slotId}|${requested}`;
    const cached = playCache.get(key);
    if (cached) return cached;
    let rec = recordedCache.get(inst.id);
    if (!rec) {
      rec = recordedEntries(inst);
      recordedCache.set(inst.id, rec);
    }
    const notes: string[] = [];
    const mapped = slot.standIns !== undefined && Object.keys(slot.standIns).length > 0;
    if (inst.family !== slot.family) {
      notes.push(
        mapped
          ? `slot "${slot.name}" expects ${slot.family} and holds a ${inst.family}: the kit's stroke map says which ${inst.family} stroke answers each ${slot.family} stroke`
          : `slot "${slot.name}" expects ${slot.family} and holds a ${inst.family}: the ${inst.family}'s own articulations answer`,
      );
    }
    if (!isKnownStroke(requested, strokes)) notes.push(`"${requested}" is neither a built-in stroke nor one of the studio's`);
    const r = resolveArticulation(inst.family, requested, rec.keys(), slot.standIns, strokes);
    if (r.source === "override") notes.push(`played through the kit's stroke map: ${requested} → ${r.plays}`);
    if (r.overrideIgnored) notes.push(`stroke map to ${r.overrideIgnored} ignored: ${r.overrideIgnored} is not recorded`);
    if (r.edges.some((e) => e.owner === "studio")) notes.push(`the stand-in uses the studio's own edge${r.edges.filter((e) => e.owner === "studio").length > 1 ? "s" : ""} ${r.edges.filter((e) => e.owner === "studio").map((e) => `${e.from}–${e.to}`).join(", ")}`);
    const common = Object.assign({ instrumentId: inst.id, instrumentName: inst.name, family: inst.family, notes }, base);
    let f: PlayFinding;
    if (r.plays === null) {
      f = emptyPlay(Object.assign({}, common, { reason: rec.size === 0 ? `"${inst.name}" has no recorded samples` : `nothing recorded on "${inst.name}" can stand in for ${requested}` }));
    } else {
      // Of several microphones, report the one with the most layers (first listed on a tie).
      const entries = rec.get(r.plays)!;
      let entry = entries[0]!;
      for (const e of entries) if (e.layers.length > entry.layers.length) entry = e;
      const layers: LayerFinding[] = entry.layers
        .filter((l) => l.sampleIds.length > 0)
        .map((l) => ({
          index: l.index,
          velocityLow: l.velocityLow,
          velocityHigh: l.velocityHigh,
          meanStrikeLufs: l.meanStrikeLufs,
          roundRobins: l.sampleIds.length,
        }))
        .sort((a, b) => a.velocityLow - b.velocityLow || a.index - b.index);
      f = emptyPlay(Object.assign({}, common, {
        outcome: r.outcome,
        plays: r.plays,
        standIn: r.outcome === "stand-in" ? { path: r.path, cost: r.cost, source: r.source === "override" ? "override" : "graph", edges: r.edges } : null,
        mic: entry.mic ?? null,
        layers,
        velocityGaps: uncoveredRanges(
          layers.map((l) => ({ low: l.velocityLow, high: l.velocityHigh })),
          1,
          127,
        ),
        minRoundRobins: layers.reduce((m, l) => Math.min(m, l.roundRobins), Infinity),
      } as Partial<PlayFinding>));
      if (layers.length === 0) f.minRoundRobins = 0;
    }
    playCache.set(key, f);
    return f;
  };
}

/** The finding of one pad (a pad aimed at nothing is silent and a conflict). */
export function auditPad(pad: Pad, play: Play, log: ConflictLog): PadFinding {
  const where = {
    padId: pad.id,
    label: pad.label,
    note: pad.note,
    channel: pad.channel,
    row: pad.row ?? null,
    col: pad.col ?? null,
    zone: pad.zone ?? null,
  };
  if (!pad.target) {
    log.add("no-target", `pad "${pad.label}" is not aimed at any kit slot`, [pad.id], pad.note, pad.channel);
    return Object.assign(where, emptyPlay({ reason: "the pad has no target" }));
  }
  return Object.assign(where, clonePlay(play(pad.target.slotId, pad.target.articulation, pad.id, pad.label)));
}

/** Every pad of a layout, in order; pad ids must be unique and grid pads inside the grid. */
export function auditPads(layout: Layout, play: Play, log: ConflictLog): PadFinding[] {
  const seenIds = new Set<string>();
  for (const pad of layout.pads) {
    if (seenIds.has(pad.id)) log.add("duplicate-pad-id", `two pads share the id "${pad.id}"`, [pad.id]);
    seenIds.add(pad.id);
    if (layout.surface.kind === "grid") {
      const { rows, cols } = layout.surface;
      if (!isInt(pad.row, 1, rows) || !isInt(pad.col, 1, cols)) {
        log.add("outside-grid", `pad "${pad.label}" is outside the ${rows} x ${cols} grid`, [pad.id], pad.note, pad.channel);
      }
    }
  }
  return layout.pads.map((pad) => auditPad(pad, play, log));
}
