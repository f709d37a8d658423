// The data the auditor reads (layouts, kits, the catalogue) and the findings it writes.
// Plain objects only; the JSON schemas in schema.ts describe the same shapes for import/export.

import type { Articulation, Family, Stroke } from "../catalogue/taxonomy";
import type { StudioStroke, StrokeList } from "../catalogue/strokes";
import type { StandInOverrides, StrokeEdgeUsed } from "./fallback";

export type { Articulation, Family, StandInOverrides, Stroke, StudioStroke, StrokeList, StrokeEdgeUsed };

// ---------------------------------------------------------------- layout

/** What a pad plays: a kit slot and an articulation of the instrument in it. */
export interface PadTarget {
  slotId: string;
  articulation: Stroke;
}

export interface Pad {
  id: string;
  label: string;
  /** Grid position, 1-based (grid layouts). */
  row?: number;
  col?: number;
  /** Trigger-zone name ("snare head", "snare rim") for zone layouts. */
  zone?: string;
  /** MIDI note 0-127. */
  note: number;
  /** MIDI channel 1-16. */
  channel: number;
  /** null while the pad is not yet aimed at anything (it then stays silent). */
  target: PadTarget | null;
}

export type LayoutSurface = { kind: "grid"; rows: number; cols: number } | { kind: "zones" };

/** One zone of the hi-hat pedal's controller range (inclusive, 0-127), aimed at an openness articulation. */
export interface PedalZone {
  low: number;
  high: number;
  articulation: Stroke;
}

export interface HiHatPedal {
  /** Control change number; 4 (Foot Controller) by default. */
  controller: number;
  channel: number;
  /** The kit slot the pedal opens and closes (the hi-hat). */
  slotId: string;
  /** Which end of the controller range is the closed pedal (varies by maker: common practice). */
  closedAt: "low" | "high";
  zones: PedalZone[];
  /** Note the pedal sends when closed with the foot ("chick"); plays the slot's 'pedal' articulation. null: none. */
  chickNote: number | null;
}

/** A kit slot a layout expects (used to build a default kit when none is given). */
export interface LayoutSlot {
  id: string;
  name: string;
  family: Family;
}

export interface Layout {
  id: string;
  name: string;
  surface: LayoutSurface;
  pads: Pad[];
  hiHatPedal: HiHatPedal | null;
  /** The slots the pads aim at, in kit order; optional (inferred from slot ids when absent). */
  slots?: LayoutSlot[];
  /** Files only (kitwright.layout/v2): the studio's own strokes the layout aims at, so another studio can read it. */
  strokes?: StudioStroke[];
}

// ---------------------------------------------------------------- kit

export interface KitSlot {
  id: string;
  name: string;
  /** The family the slot expects ("Ride" expects ride); the instrument in it may be of another family. */
  family: Family;
  /** Catalogue instrument id, or null for an empty slot. */
  instrumentId: string | null;
  /** Per requested articulation, the articulation to play instead (kit override of the fallback graph). */
  standIns?: StandInOverrides;
}

export interface Kit {
  id: string;
  name: string;
  slots: KitSlot[];
  /** Files only (kitwright.kit/v2): the studio's own strokes its stroke maps name. */
  strokes?: StudioStroke[];
}

// ---------------------------------------------------------------- catalogue

export interface CatalogueLayer {
  index: number;
  velocityLow: number;
  velocityHigh: number;
  meanStrikeLufs: number;
  /** The samples of the layer: its round robins. */
  sampleIds: string[];
}

export interface CatalogueArticulation {
  articulation: Stroke;
  mic?: string | null;
  layers: CatalogueLayer[];
}

export interface CatalogueInstrument {
  id: string;
  name: string;
  family: Family;
  pitchHz?: number | null;
  articulations: CatalogueArticulation[];
}

export type Catalogue = readonly CatalogueInstrument[];

// ---------------------------------------------------------------- findings

export type Outcome = "direct" | "stand-in" | "silent";

export interface LayerFinding {
  index: number;
  velocityLow: number;
  velocityHigh: number;
  meanStrikeLufs: number;
  /** Round-robin depth: how many takes the layer holds. */
  roundRobins: number;
}

export interface VelocityRange {
  low: number;
  high: number;
}

export interface StandInFinding {
  path: Stroke[];
  cost: number;
  /** "override": played through the kit's stroke map for the slot; "graph": the nearest recorded stroke. */
  source: "graph" | "override";
  /** The graph edges the path used, each with its owner (built-in or the studio's); empty for the stroke map. */
  edges: StrokeEdgeUsed[];
}

/** What one request (a pad, a pedal zone, the chick note) will play. */
export interface PlayFinding {
  outcome: Outcome;
  requested: Stroke | null;
  plays: Stroke | null;
  standIn: StandInFinding | null;
  /** Why nothing plays (silent only). */
  reason: string | null;
  slotId: string | null;
  slotName: string | null;
  instrumentId: string | null;
  instrumentName: string | null;
  /** The family whose graph decided (the instrument's own family). */
  family: Family | null;
  /** The microphone whose layers are reported, when the catalogue names one. */
  mic: string | null;
  layers: LayerFinding[];
  /** Velocities 1-127 no layer covers. */
  velocityGaps: VelocityRange[];
  /** Fewest round robins over the layers (0 when silent). */
  minRoundRobins: number;
  /** Notes for the reader (ignored override, slot holding another family ...). */
  notes: string[];
}

export interface PadFinding extends PlayFinding {
  padId: string;
  label: string;
  note: number;
  channel: number;
  row: number | null;
  col: number | null;
  zone: string | null;
}

export interface PedalZoneFinding extends PlayFinding {
  zoneIndex: number;
  low: number;
  high: number;
  /** Whether the openness the zone asks for is recorded (outcome 'direct'). */
  recorded: boolean;
}

export interface PedalFinding {
  controller: number;
  channel: number;
  closedAt: "low" | "high";
  zones: PedalZoneFinding[];
  /** Controller values 0-127 no zone covers. */
  uncovered: VelocityRange[];
  chick: PadFinding | null;
}

export type ConflictKind =
  | "note-shared" // one note + channel aimed at two different targets
  | "note-out-of-range"
  | "channel-out-of-range"
  | "controller-out-of-range"
  | "unknown-slot"
  | "unknown-instrument"
  | "no-target"
  | "duplicate-pad-id"
  | "outside-grid"
  | "pedal-zone-overlap"
  | "pedal-zone-out-of-range";

export interface Conflict {
  kind: ConflictKind;
  message: string;
  padIds: string[];
  note: number | null;
  channel: number | null;
}

/** The score of an audit (formula in audit-score.ts SCORE_FORMULA and SCHEMA.md "Score"). */
export interface AuditScore {
  /** Whole points 0-100: the share of what the layout asks for that will really play, weighted by how well. */
  value: number;
  /** The scale: the score reads `value/100`. */
  outOf: 100;
  /** The score in one sentence of plain words. */
  sentence: string;
  /** The formula in words. */
  formula: string;
  /** What the layout asks for: its pads, its pedal zones and the pedal's chick note. */
  items: number;
  /** Sum of the item values (each 0-1), to 6 decimals. */
  itemSum: number;
  /** Items that will sound: played as recorded or by a stand-in, and not sharing a note with another sound. */
  sounding: number;
  /** Items whose note and channel another pad uses for a different sound (each counts 0). */
  noteClashes: number;
  /** Sounding items with velocities no layer covers. */
  withGaps: number;
}

/** A kit slot left empty, with every pad (pedal zone, chick note) that aims at it: each of them is silent. */
export interface EmptySlotGroup {
  slotId: string;
  slotName: string;
  padIds: string[];
  /** The pads' labels, in the order of padIds. */
  labels: string[];
}

export interface AuditSummary {
  pads: number;
  direct: number;
  standIn: number;
  silent: number;
  pedalZones: number;
  pedalZonesRecorded: number;
  conflicts: number;
}

export interface AuditResult {
  layoutId: string;
  layoutName: string;
  kitId: string;
  kitName: string;
  /** Conflicts come first, as the reader should see them first. */
  conflicts: Conflict[];
  /** Slots the kit leaves empty that pads aim at (their pads are silent; an empty slot is not a conflict). */
  emptySlots: EmptySlotGroup[];
  summary: AuditSummary;
  score: AuditScore;
  pads: PadFinding[];
  pedal: PedalFinding | null;
  /** The studio's own strokes the audit met (asked for, played, or on a path), as defined when it ran. */
  strokes: StudioStroke[];
}
