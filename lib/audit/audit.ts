// The coverage audit: what every pad (and every hi-hat pedal zone) of a layout will really play with a kit.
// Pure: layout + kit + catalogue in, findings out. See SCHEMA.md for the meaning of every field.

import { resolveArticulation } from "./fallback";
import type {
  Articulation,
  AuditResult,
  AuditScore,
  Catalogue,
  CatalogueArticulation,
  CatalogueInstrument,
  Conflict,
  ConflictKind,
  Kit,
  KitSlot,
  LayerFinding,
  Layout,
  Pad,
  PadFinding,
  PedalFinding,
  PedalZoneFinding,
  PlayFinding,
  VelocityRange,
} from "./types";

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

const CONFLICT_ORDER: ConflictKind[] = [
  "note-shared",
  "note-out-of-range",
  "channel-out-of-range",
  "controller-out-of-range",
  "duplicate-pad-id",
  "unknown-slot",
  "empty-slot",
  "unknown-instrument",
  "no-target",
  "outside-grid",
  "pedal-zone-out-of-range",
  "pedal-zone-overlap",
];

function isInt(x: unknown, lo: number, hi: number): boolean {
  return typeof x === "number" && Number.isInteger(x) && x >= lo && x <= hi;
}

function recordedEntries(inst: CatalogueInstrument): Map<Articulation, CatalogueArticulation[]> {
  const m = new Map<Articulation, CatalogueArticulation[]>();
  for (const a of inst.articulations) {
    if (!a.layers.some((l) => l.sampleIds.length > 0)) continue;
    const list = m.get(a.articulation);
    if (list) list.push(a);
    else m.set(a.articulation, [a]);
  }
  return m;
}

/** Index a catalogue by instrument id (reuse it across audits of the same catalogue). */
export function indexCatalogue(catalogue: Catalogue | ReadonlyMap<string, CatalogueInstrument>): ReadonlyMap<string, CatalogueInstrument> {
  if (catalogue instanceof Map) return catalogue;
  const m = new Map<string, CatalogueInstrument>();
  for (const inst of catalogue as Catalogue) if (!m.has(inst.id)) m.set(inst.id, inst);
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

/**
 * Audit a layout against a kit and a catalogue.
 * A slot holding an instrument of another family is answered by that instrument's own family graph.
 */
export function runAudit(
  layout: Layout,
  kit: Kit,
  catalogue: Catalogue | ReadonlyMap<string, CatalogueInstrument>,
): AuditResult {
  const instruments = indexCatalogue(catalogue);
  const slots = new Map<string, KitSlot>();
  for (const s of kit.slots) if (!slots.has(s.id)) slots.set(s.id, s);
  const recordedCache = new Map<string, Map<Articulation, CatalogueArticulation[]>>();
  const playCache = new Map<string, PlayFinding>();

  const conflicts: Conflict[] = [];
  const addConflict = (kind: ConflictKind, message: string, padIds: string[], note: number | null = null, channel: number | null = null) =>
    conflicts.push({ kind, message, padIds, note, channel });

  const slotProblems = new Map<string, { kind: ConflictKind; message: string; padIds: string[] }>();
  const noteSlotProblem = (kind: ConflictKind, slotId: string, message: string, padId: string) => {
    const key = `${kind}|${slotId}`;
    const p = slotProblems.get(key);
    if (p) p.padIds.push(padId);
    else slotProblems.set(key, { kind, message, padIds: [padId] });
  };

  function play(slotId: string, requested: Articulation, askerId: string): PlayFinding {
    const slot = slots.get(slotId);
    if (!slot) {
      const reason = `no slot "${slotId}" in kit "${kit.name}"`;
      noteSlotProblem("unknown-slot", slotId, reason, askerId);
      return emptyPlay({ requested, slotId, reason });
    }
    const base = { requested, slotId, slotName: slot.name };
    if (slot.instrumentId === null) {
      const reason = `slot "${slot.name}" is empty`;
      noteSlotProblem("empty-slot", slotId, reason, askerId);
      return emptyPlay(Object.assign({ reason }, base));
    }
    const inst = instruments.get(slot.instrumentId);
    if (!inst) {
      const reason = `slot "${slot.name}" holds instrument "${slot.instrumentId}", which is not in the catalogue`;
      noteSlotProblem("unknown-instrument", slotId, reason, askerId);
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
    if (inst.family !== slot.family) {
      notes.push(`slot "${slot.name}" expects ${slot.family} and holds a ${inst.family}: the ${inst.family}'s own articulations answer`);
    }
    const r = resolveArticulation(inst.family, requested, rec.keys(), slot.standIns);
    if (r.overrideIgnored) notes.push(`override to ${r.overrideIgnored} ignored: ${r.overrideIgnored} is not recorded`);
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
        standIn: r.outcome === "stand-in" ? { path: r.path, cost: r.cost, source: r.source === "override" ? "override" : "graph" } : null,
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
  }

  const clonePlay = (p: PlayFinding): PlayFinding => Object.assign({}, p, { notes: p.notes.slice() });

  function auditPad(pad: Pad): PadFinding {
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
      addConflict("no-target", `pad "${pad.label}" is not aimed at any kit slot`, [pad.id], pad.note, pad.channel);
      return Object.assign(where, emptyPlay({ reason: "the pad has no target" }));
    }
    return Object.assign(where, clonePlay(play(pad.target.slotId, pad.target.articulation, pad.id)));
  }

  // ---- pads
  const seenIds = new Set<string>();
  for (const pad of layout.pads) {
    if (seenIds.has(pad.id)) addConflict("duplicate-pad-id", `two pads share the id "${pad.id}"`, [pad.id]);
    seenIds.add(pad.id);
    if (layout.surface.kind === "grid") {
      const { rows, cols } = layout.surface;
      if (!isInt(pad.row, 1, rows) || !isInt(pad.col, 1, cols)) {
        addConflict("outside-grid", `pad "${pad.label}" is outside the ${rows} x ${cols} grid`, [pad.id], pad.note, pad.channel);
      }
    }
  }
  const pads = layout.pads.map(auditPad);

  // ---- pedal
  let pedal: PedalFinding | null = null;
  const hh = layout.hiHatPedal;
  if (hh) {
    if (!isInt(hh.controller, 0, 119)) {
      addConflict("controller-out-of-range", `pedal controller ${hh.controller} is not a control change number 0-119`, [], null, hh.channel);
    }
    const zones: PedalZoneFinding[] = hh.zones.map((z, i) => {
      if (!isInt(z.low, 0, 127) || !isInt(z.high, 0, 127) || z.low > z.high) {
        addConflict("pedal-zone-out-of-range", `pedal zone ${i + 1} (${z.low}-${z.high}) is not a range inside 0-127`, [`pedal-zone-${i + 1}`]);
      }
      const p = clonePlay(play(hh.slotId, z.articulation, `pedal-zone-${i + 1}`));
      return Object.assign({ zoneIndex: i, low: z.low, high: z.high, recorded: p.outcome === "direct" }, p);
    });
    for (let i = 0; i < hh.zones.length; i++) {
      for (let j = i + 1; j < hh.zones.length; j++) {
        const a = hh.zones[i]!;
        const b = hh.zones[j]!;
        if (a.low <= b.high && b.low <= a.high) {
          addConflict("pedal-zone-overlap", `pedal zones ${i + 1} and ${j + 1} overlap`, [`pedal-zone-${i + 1}`, `pedal-zone-${j + 1}`]);
        }
      }
    }
    let chick: PadFinding | null = null;
    if (hh.chickNote !== null) {
      chick = auditPad({
        id: "pedal-chick",
        label: "Hi-hat pedal chick",
        note: hh.chickNote,
        channel: hh.channel,
        target: { slotId: hh.slotId, articulation: "pedal" },
      });
    }
    pedal = {
      controller: hh.controller,
      channel: hh.channel,
      closedAt: hh.closedAt,
      zones,
      uncovered: uncoveredRanges(hh.zones, 0, 127),
      chick,
    };
  }

  // ---- notes and channels
  const noteOwners = [...pads, ...(pedal?.chick ? [pedal.chick] : [])];
  const byNote = new Map<string, PadFinding[]>();
  for (const p of noteOwners) {
    if (!isInt(p.note, 0, 127)) addConflict("note-out-of-range", `pad "${p.label}" sends note ${p.note}, outside 0-127`, [p.padId], p.note, p.channel);
    if (!isInt(p.channel, 1, 16)) addConflict("channel-out-of-range", `pad "${p.label}" sends on channel ${p.channel}, outside 1-16`, [p.padId], p.note, p.channel);
    if (p.requested === null || p.slotId === null) continue;
    const k = `${p.channel}|${p.note}`;
    const list = byNote.get(k);
    if (list) list.push(p);
    else byNote.set(k, [p]);
  }
  for (const list of byNote.values()) {
    const targets = new Set(list.map((p) => `${p.slotId}|${p.requested}`));
    if (targets.size > 1) {
      const first = list[0]!;
      addConflict(
        "note-shared",
        `note ${first.note} on channel ${first.channel} is aimed at ${targets.size} different targets: ` +
          list.map((p) => `"${p.label}" -> ${p.slotName ?? p.slotId} ${p.requested}`).join(", "),
        list.map((p) => p.padId),
        first.note,
        first.channel,
      );
    }
  }
  for (const p of slotProblems.values()) addConflict(p.kind, p.message, p.padIds);
  const conflictRank = (k: ConflictKind) => CONFLICT_ORDER.indexOf(k);
  const sorted = conflicts.map((c, i) => ({ c, i })).sort((a, b) => conflictRank(a.c.kind) - conflictRank(b.c.kind) || a.i - b.i).map((x) => x.c);

  // ---- summary and score
  const items: PlayFinding[] = [...pads, ...(pedal ? pedal.zones : []), ...(pedal?.chick ? [pedal.chick] : [])];
  const itemSum = items.reduce((s, f) => s + itemScore(f), 0);
  const penalty = CONFLICT_PENALTY * sorted.length;
  const raw = items.length ? (100 * itemSum) / items.length - penalty : 0;
  const score: AuditScore = {
    value: Math.round(Math.min(100, Math.max(0, raw)) * 10) / 10,
    formula: SCORE_FORMULA,
    items: items.length,
    itemSum: Math.round(itemSum * 1e6) / 1e6,
    conflictPenalty: penalty,
  };
  const count = (o: string) => pads.filter((p) => p.outcome === o).length;
  return {
    layoutId: layout.id,
    layoutName: layout.name,
    kitId: kit.id,
    kitName: kit.name,
    conflicts: sorted,
    summary: {
      pads: pads.length,
      direct: count("direct"),
      standIn: count("stand-in"),
      silent: count("silent"),
      pedalZones: pedal?.zones.length ?? 0,
      pedalZonesRecorded: pedal?.zones.filter((z) => z.recorded).length ?? 0,
      conflicts: sorted.length,
    },
    score,
    pads,
    pedal,
  };
}

/** True when any pad (or the pedal chick note, or a pedal zone) would play nothing. */
export function hasSilentPads(result: AuditResult): boolean {
  return result.pads.some((p) => p.outcome === "silent") || !!result.pedal?.zones.some((z) => z.outcome === "silent") || result.pedal?.chick?.outcome === "silent";
}
