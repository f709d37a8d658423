// Suggest a layout for a pad surface and a kit: which stroke of which slot each pad plays, with its reason.
//
// A grid is filled in two assignment rounds, each solved as a minimum-cost assignment with the Hungarian
// method (munkres-js): first the main strikes (snare, kick, the hi-hat twice, toms, cymbals, percussion), with
// target cells set around the snare; then every other recorded stroke, next to its own main strike. A surface
// of named trigger zones ("snare rim", "tom 2 head", "ride bell") is matched drum by drum, zone names read
// with the file-name reader. The placement rules are common practice of finger drummers and kit players, not a
// published standard: main strikes central and reachable by either hand, the hi-hat on both sides of the snare
// so neither hand crosses, toms high to low from left to right, cymbals in the top row and the outer columns,
// a bell next to its bow, secondary strokes next to their main strike.
//
// Only recorded strokes are placed; with `standIns: true` a family's main strike that was never recorded is
// placed too, marked as a stand-in for the recording that plays instead (the fallback graph's choice).

import munkres from "munkres-js";
import type { StrokeList } from "../catalogue/strokes";
import type { Stroke } from "../catalogue/taxonomy";
import { resolveArticulation } from "./fallback";
import { orderTomsByPitch } from "./kits";
import { mainStrike, noteFor, padLabel, reasonFor, strokeRank } from "./suggest-rules";
import { suggestForZones } from "./suggest-zones";
import type { CatalogueInstrument, Catalogue, HiHatPedal, Kit, KitSlot, Layout, Pad, PedalZone } from "./types";

export type SuggestSurface = { kind: "grid"; rows: number; cols: number } | { kind: "zones"; zones: string[] };

export interface SuggestOptions {
  /** Also place a family's main strike that was never recorded, marked as a stand-in. Default false. */
  standIns?: boolean;
  /** MIDI channel of every pad (1-16). Default 10, the General MIDI percussion channel. */
  channel?: number;
  /** Name of the layout. */
  name?: string;
  /** The studio's own strokes: zone names may name them, and their edges give stand-ins. */
  strokes?: StrokeList | null;
}

/** One stroke the suggestion places, or could not place. */
export interface OfferedStroke {
  slot: KitSlot;
  instrument: CatalogueInstrument;
  /** What the pad asks the slot for. */
  articulation: Stroke;
  /** The recording that plays when `articulation` was never recorded (a stand-in), else null. */
  standInFor: Stroke | null;
  role: Role;
  /** Lower is placed first; strokes that do not fit are dropped from the highest number down. */
  priority: number;
  /** 0 for the first copy; the hi-hat's closed stroke is placed twice (both sides of the snare). */
  copy: number;
  /** The slot's place among the kit's slots of its family (toms: from the highest pitch), and their number. */
  ordinal: number;
  ofFamily: number;
}

export type Role = "snare" | "kick" | "hat" | "tom" | "cymbal" | "second-snare" | "percussion" | "secondary";

export interface Placement {
  padId: string;
  slotId: string;
  articulation: Stroke;
  standIn: boolean;
  reason: string;
}

export interface Suggestion {
  layout: Layout;
  placements: Placement[];
  /** Strokes that did not fit, with why. */
  leftOut: { slotId: string; articulation: Stroke; reason: string }[];
}

/** The strokes a kit offers: per filled slot, every recorded articulation, main strike first. */
export function kitStrokes(kit: Kit, catalogue: Catalogue, opts: SuggestOptions = {}): OfferedStroke[] {
  const byId = new Map(catalogue.map((i) => [i.id, i] as const));
  const filled = kit.slots.flatMap((slot) => {
    const instrument = slot.instrumentId ? byId.get(slot.instrumentId) : undefined;
    return instrument ? [{ slot, instrument }] : [];
  });
  const toms = orderTomsByPitch(filled.filter((f) => f.slot.family === "tom").map((f) => ({ ...f.instrument, slotRef: f.slot })));
  const tomOrder = new Map(toms.map((t, i) => [t.slotRef.id, i] as const));
  let snares = 0;
  let cymbals = 0;
  const seen = new Map<string, number>();
  const count = (f: string) => filled.filter((x) => x.slot.family === f).length;
  const out: OfferedStroke[] = [];
  for (const { slot, instrument } of filled) {
    const ordinal = slot.family === "tom" ? (tomOrder.get(slot.id) ?? 0) : (seen.get(slot.family) ?? 0);
    seen.set(slot.family, (seen.get(slot.family) ?? 0) + 1);
    const recorded = [...new Set(instrument.articulations.map((a) => a.articulation))].sort(
      (a, b) => strokeRank(slot.family, a) - strokeRank(slot.family, b),
    );
    const main = mainStrike(slot.family);
    const strokes: { articulation: Stroke; standInFor: Stroke | null }[] = recorded.map((a) => ({ articulation: a, standInFor: null }));
    if (!recorded.includes(main) && opts.standIns) {
      const r = resolveArticulation(instrument.family, main, recorded, slot.standIns, opts.strokes);
      if (r.plays) strokes.unshift({ articulation: main, standInFor: r.plays });
    }
    // the slot's main strike when recorded (or stood in for), else its first recorded stroke
    const mainIndex = Math.max(0, strokes.findIndex((s) => s.articulation === main));
    const family = slot.family;
    const isSecondSnare = family === "snare" && snares++ > 0;
    const cymbalIndex = ["crash", "ride", "china", "splash", "stack"].includes(family) ? cymbals++ : -1;
    strokes.forEach((s, i) => {
      const base = { slot, instrument, articulation: s.articulation, standInFor: s.standInFor, copy: 0, ordinal, ofFamily: count(family) };
      if (i !== mainIndex) {
        const near = ["rim-shot", "cross-stick", "open", "bell", "pedal"].includes(s.articulation) ? 4 : 6;
        out.push({ ...base, role: "secondary", priority: family === "tom" ? 7 : near + (isSecondSnare ? 2 : 0) });
      } else if (family === "snare") out.push({ ...base, role: isSecondSnare ? "second-snare" : "snare", priority: isSecondSnare ? 4 : 0 });
      else if (family === "kick") out.push({ ...base, role: "kick", priority: 0 });
      else if (family === "hi-hat") {
        out.push({ ...base, role: "hat", priority: 1 });
        out.push({ ...base, role: "hat", priority: 3, copy: 1 });
      } else if (family === "tom") out.push({ ...base, role: "tom", priority: 3 + (tomOrder.get(slot.id) ?? 0) * 0.01 });
      else if (cymbalIndex >= 0) out.push({ ...base, role: "cymbal", priority: 2 + Math.min(cymbalIndex, 2) + cymbalIndex * 0.01 });
      else out.push({ ...base, role: "percussion", priority: 5 });
    });
  }
  return out;
}

interface Cell {
  row: number;
  col: number;
}

const dist = (a: Cell, b: Cell, rowWeight = 1) => Math.abs(a.row - b.row) * rowWeight + Math.abs(a.col - b.col);
const chebyshev = (a: Cell, b: Cell) => Math.max(Math.abs(a.row - b.row), Math.abs(a.col - b.col));

/** Solve one round: each stroke to one free cell, minimum total cost. Returns the cell index per stroke. */
function assign(costs: number[][]): number[] {
  if (costs.length === 0) return [];
  const pairs = munkres(costs) as [number, number][];
  const out = new Array<number>(costs.length).fill(-1);
  for (const [r, c] of pairs) out[r] = c;
  return out;
}

/** Where each main strike wants to be on a rows x cols grid (row 1 is the top), given the snare's cell. */
function mainTargetCost(s: OfferedStroke, cell: Cell, g: { rows: number; cols: number; snare: Cell; tomRank: number; tomCount: number }): number {
  const { rows, cols, snare } = g;
  switch (s.role) {
    case "snare":
      return dist(cell, snare) * 10;
    case "kick": {
      const target = rows >= 3 ? { row: rows, col: snare.col + 1 } : { row: rows, col: snare.col + 2 };
      return dist(cell, target) * 8;
    }
    case "hat": {
      const target = { row: snare.row, col: snare.col + (s.copy === 0 ? -1 : 1) };
      return dist(cell, target, 2) * 9;
    }
    case "tom": {
      const row = rows >= 3 ? snare.row - 1 : 1;
      const target = { row, col: snare.col + 0.5 - (g.tomCount - 1) / 2 + g.tomRank };
      return dist(cell, target, 2) * 5;
    }
    case "cymbal": {
      // the ride on the right, the first crash on the left (as on most kits for a right-handed player), others outside
      const outer = Math.min(cell.col - 1, cols - cell.col);
      const side = s.slot.family === "ride" ? cols - cell.col : s.slot.family === "crash" && s.ordinal === 0 ? cell.col - 1 : outer;
      return ((cell.row - 1) * 3 + side) * 4;
    }
    case "second-snare":
      return dist(cell, { row: Math.max(1, snare.row - 1), col: snare.col + 1 }) * 3;
    default:
      // percussion: the outer columns, away from the kit's centre
      return (cols / 2 - Math.abs(cell.col - (cols + 1) / 2)) * 2 + Math.abs(cell.row - rows) * 0.5;
  }
}

function suggestForGrid(rows: number, cols: number, strokes: OfferedStroke[], opts: SuggestOptions): { pads: Pad[]; placements: Placement[]; leftOut: Suggestion["leftOut"] } {
  const cells: Cell[] = [];
  for (let r = 1; r <= rows; r++) for (let c = 1; c <= cols; c++) cells.push({ row: r, col: c });
  const sorted = [...strokes].sort((a, b) => a.priority - b.priority);
  const leftOut: Suggestion["leftOut"] = [];
  // the hi-hat's second copy only when the snare has a neighbour on each side
  const placeable = sorted.filter((s) => !(s.role === "hat" && s.copy === 1 && cols < 3));
  const fit = placeable.slice(0, cells.length);
  for (const s of placeable.slice(cells.length)) {
    if (s.copy === 0) leftOut.push({ slotId: s.slot.id, articulation: s.articulation, reason: `no room: ${cells.length} pads for ${placeable.length} strokes, less used strokes left out first` });
  }
  const snare: Cell = { row: rows >= 3 ? rows - 1 : rows, col: Math.ceil(cols / 2) };
  const mains = fit.filter((s) => s.role !== "secondary");
  const seconds = fit.filter((s) => s.role === "secondary");
  const toms = mains.filter((s) => s.role === "tom");
  const tomRank = new Map(toms.map((t, i) => [t, i] as const));
  const costs1 = mains.map((s) => cells.map((cell) => mainTargetCost(s, cell, { rows, cols, snare, tomRank: tomRank.get(s) ?? 0, tomCount: toms.length })));
  const at = new Map<OfferedStroke, Cell>();
  assign(costs1).forEach((ci, i) => at.set(mains[i]!, cells[ci]!));
  // toms high to low from left to right, whatever cells the round gave them
  const tomCells = toms.map((t) => at.get(t)!).sort((a, b) => a.col - b.col || a.row - b.row);
  toms.forEach((t, i) => at.set(t, tomCells[i]!));
  // round two: secondary strokes next to their own main strike, in the cells left
  const used = new Set([...at.values()].map((c) => `${c.row}:${c.col}`));
  const free = cells.filter((c) => !used.has(`${c.row}:${c.col}`));
  const mainOf = (s: OfferedStroke) => mains.find((m) => m.slot.id === s.slot.id && m.copy === 0);
  const anchors = seconds.map((s) => {
    const m = mainOf(s);
    // the open hat and the pedal sit beside the right-hand copy of the closed hat
    const hatRight = s.slot.family === "hi-hat" ? mains.find((x) => x.slot.id === s.slot.id && x.copy === 1) : undefined;
    return hatRight ? at.get(hatRight)! : m ? at.get(m)! : snare;
  });
  const costs2 = seconds.map((s, i) => free.map((cell) => dist(cell, anchors[i]!, 1.5) * (10 - s.priority)));
  const far = new Set<OfferedStroke>();
  assign(costs2).forEach((ci, i) => {
    if (ci < 0) return;
    at.set(seconds[i]!, free[ci]!);
    if (chebyshev(free[ci]!, anchors[i]!) > 1) far.add(seconds[i]!);
  });
  // a second kick pad for the other hand, in the free cell nearest the snare's other side (same note)
  const kick = mains.find((m) => m.role === "kick");
  const left = cells.filter((c) => ![...at.values()].some((x) => x.row === c.row && x.col === c.col));
  if (kick && left.length) {
    const target = { row: rows, col: snare.col - 1 };
    const cell = left.reduce((b, c) => (dist(c, target) < dist(b, target) ? c : b));
    const copy: OfferedStroke = { ...kick, copy: 1 };
    fit.push(copy);
    at.set(copy, cell);
  }

  const notes = new Map<string, number>();
  const pads: Pad[] = [];
  const placements: Placement[] = [];
  for (const s of fit) {
    const cell = at.get(s);
    if (!cell) continue;
    const key = `${s.slot.id}|${s.articulation}`;
    if (!notes.has(key)) notes.set(key, noteFor(s, new Set(notes.values())));
    const id = `r${cell.row}c${cell.col}`;
    const twin = s.role === "hat" ? (s.copy === 0 ? " (left)" : " (right)") : s.copy === 1 ? " (second)" : "";
    pads.push({ id, label: padLabel(s) + twin, row: cell.row, col: cell.col, note: notes.get(key)!, channel: opts.channel ?? 10, target: { slotId: s.slot.id, articulation: s.articulation } });
    placements.push({ padId: id, slotId: s.slot.id, articulation: s.articulation, standIn: s.standInFor !== null, reason: reasonFor(s, rows, !far.has(s)) });
  }
  pads.sort((a, b) => a.row! - b.row! || a.col! - b.col!);
  return { pads, placements, leftOut };
}

/** The hi-hat pedal for the kit's hi-hat: its recorded openness strokes spread over the controller, and its chick. */
export function suggestPedal(strokes: OfferedStroke[], pads: Pad[], channel: number): HiHatPedal | null {
  const hat = strokes.find((s) => s.slot.family === "hi-hat");
  if (!hat) return null;
  const recorded = new Set(hat.instrument.articulations.map((a) => a.articulation));
  const openness = (["closed", "quarter-open", "half-open", "open"] as const).filter((a) => recorded.has(a));
  if (openness.length === 0) return null;
  // closed at the high end of the range (common practice of many pedal controllers; the user can flip it)
  const width = 128 / openness.length;
  const zones: PedalZone[] = openness.map((articulation, i) => ({
    low: Math.round(128 - (i + 1) * width),
    high: Math.round(128 - i * width) - 1,
    articulation,
  }));
  zones.sort((a, b) => a.low - b.low);
  const chick = pads.find((p) => p.target?.slotId === hat.slot.id && p.target.articulation === "pedal");
  return {
    controller: 4,
    channel,
    slotId: hat.slot.id,
    closedAt: "high",
    zones,
    chickNote: recorded.has("pedal") ? (chick?.note ?? 44) : null,
  };
}

/** Suggest a layout for `surface` and `kit`: every placement with its reason, and what did not fit. */
export function suggestLayout(surface: SuggestSurface, kit: Kit, catalogue: Catalogue, opts: SuggestOptions = {}): Suggestion {
  const channel = opts.channel ?? 10;
  const strokes = kitStrokes(kit, catalogue, opts);
  const { pads, placements, leftOut } =
    surface.kind === "grid" ? suggestForGrid(surface.rows, surface.cols, strokes, opts) : suggestForZones(surface.zones, kit, catalogue, strokes, channel, opts.strokes);
  const usedSlots = new Set(pads.map((p) => p.target?.slotId));
  const hiHatPedal = suggestPedal(strokes, pads, channel);
  if (hiHatPedal) usedSlots.add(hiHatPedal.slotId);
  const layout: Layout = {
    id: "suggested",
    name: opts.name ?? `Suggested for ${kit.name}`,
    surface: surface.kind === "grid" ? { kind: "grid", rows: surface.rows, cols: surface.cols } : { kind: "zones" },
    pads,
    hiHatPedal,
    slots: kit.slots.filter((s) => usedSlots.has(s.id)).map((s) => ({ id: s.id, name: s.name, family: s.family })),
  };
  return { layout, placements, leftOut };
}
