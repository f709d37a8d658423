// Layout templates: the General MIDI Level 1 percussion key map (from the standard) and layouts of our own.
//
// Note numbers in our own layouts: where General MIDI names the sound, its note is used (36 kick, 38 snare,
// 42 closed hi-hat ...); articulations General MIDI does not name get a note from EXTRA_NOTES (84-95),
// Kitwright's own choice, above the GM range so the two never collide.

import type { Family } from "../catalogue/taxonomy";
import type { Articulation, Layout, LayoutSlot, Pad } from "./types";

/** General MIDI Level 1 percussion key map, channel 10 (MIDI Manufacturers Association, GM Level 1). */
export const GM_PERCUSSION: ReadonlyArray<{ note: number; name: string }> = [
  [35, "Acoustic Bass Drum"], [36, "Bass Drum 1"], [37, "Side Stick"], [38, "Acoustic Snare"], [39, "Hand Clap"],
  [40, "Electric Snare"], [41, "Low Floor Tom"], [42, "Closed Hi-Hat"], [43, "High Floor Tom"], [44, "Pedal Hi-Hat"],
  [45, "Low Tom"], [46, "Open Hi-Hat"], [47, "Low-Mid Tom"], [48, "Hi-Mid Tom"], [49, "Crash Cymbal 1"],
  [50, "High Tom"], [51, "Ride Cymbal 1"], [52, "Chinese Cymbal"], [53, "Ride Bell"], [54, "Tambourine"],
  [55, "Splash Cymbal"], [56, "Cowbell"], [57, "Crash Cymbal 2"], [58, "Vibraslap"], [59, "Ride Cymbal 2"],
  [60, "Hi Bongo"], [61, "Low Bongo"], [62, "Mute Hi Conga"], [63, "Open Hi Conga"], [64, "Low Conga"],
  [65, "High Timbale"], [66, "Low Timbale"], [67, "High Agogo"], [68, "Low Agogo"], [69, "Cabasa"],
  [70, "Maracas"], [71, "Short Whistle"], [72, "Long Whistle"], [73, "Short Guiro"], [74, "Long Guiro"],
  [75, "Claves"], [76, "Hi Wood Block"], [77, "Low Wood Block"], [78, "Mute Cuica"], [79, "Open Cuica"],
  [80, "Mute Triangle"], [81, "Open Triangle"],
].map(([note, name]) => ({ note: note as number, name: name as string }));

export const GM_PERCUSSION_CHANNEL = 10;

/** Kitwright's notes for articulations General MIDI does not name. */
export const EXTRA_NOTES = {
  tom1Rim: 84,
  tom2Rim: 85,
  tom3Rim: 86,
  snareHalfEdge: 88,
  snareEdge: 89,
  snareRimShot: 90,
  snareFlam: 91,
  hiHatHalfOpen: 92,
  crashBow: 93,
  rideEdge: 94,
  hiHatShank: 95,
} as const;

const S = (id: string, name: string, family: Family): LayoutSlot => ({ id, name, family });

// The slot plan every template draws from (kit order: drums, then cymbals, then percussion).
const SLOT_PLAN: LayoutSlot[] = [
  S("kick", "Kick", "kick"),
  S("snare", "Snare A", "snare"),
  S("snare-2", "Snare B", "snare"),
  S("tom-1", "Tom 1", "tom"),
  S("tom-2", "Tom 2", "tom"),
  S("tom-3", "Tom 3", "tom"),
  S("tom-4", "Tom 4", "tom"),
  S("tom-5", "Tom 5", "tom"),
  S("tom-6", "Tom 6", "tom"),
  S("hi-hat", "Hi-hat", "hi-hat"),
  S("crash-1", "Crash 1", "crash"),
  S("crash-2", "Crash 2", "crash"),
  S("ride-1", "Ride 1", "ride"),
  S("ride-2", "Ride 2", "ride"),
  S("china", "China", "china"),
  S("splash", "Splash", "splash"),
  S("cowbell", "Cowbell", "cowbell"),
  S("clap", "Clap", "other"),
  S("tambourine", "Tambourine", "shaker"),
  S("vibraslap", "Vibraslap", "other"),
  S("bongo-high", "Bongo high", "hand-drum"),
  S("bongo-low", "Bongo low", "hand-drum"),
  S("conga-high", "Conga high", "hand-drum"),
  S("conga-low", "Conga low", "hand-drum"),
  S("timbale-high", "Timbale high", "other"),
  S("timbale-low", "Timbale low", "other"),
  S("agogo-high", "Agogo high", "cowbell"),
  S("agogo-low", "Agogo low", "cowbell"),
  S("cabasa", "Cabasa", "shaker"),
  S("maracas", "Maracas", "shaker"),
  S("whistle-short", "Whistle short", "other"),
  S("whistle-long", "Whistle long", "other"),
  S("guiro-short", "Guiro short", "other"),
  S("guiro-long", "Guiro long", "other"),
  S("claves", "Claves", "other"),
  S("woodblock-high", "Wood block high", "other"),
  S("woodblock-low", "Wood block low", "other"),
  S("cuica", "Cuica", "other"),
  S("triangle", "Triangle", "other"),
];

function slotsFor(pads: Pad[], pedalSlot?: string): LayoutSlot[] {
  const used = new Set(pads.map((p) => p.target?.slotId).filter((x): x is string => !!x));
  if (pedalSlot) used.add(pedalSlot);
  return SLOT_PLAN.filter((s) => used.has(s.id));
}

// GM note -> [slot, articulation] (our reading of each GM name as a kit target).
const GM_TARGETS: Record<number, [string, Articulation]> = {
  35: ["kick", "centre"], 36: ["kick", "centre"], 37: ["snare", "cross-stick"], 38: ["snare", "centre"],
  39: ["clap", "hit"], 40: ["snare-2", "centre"], 41: ["tom-6", "centre"], 42: ["hi-hat", "closed"],
  43: ["tom-5", "centre"], 44: ["hi-hat", "pedal"], 45: ["tom-4", "centre"], 46: ["hi-hat", "open"],
  47: ["tom-3", "centre"], 48: ["tom-2", "centre"], 49: ["crash-1", "crash-hit"], 50: ["tom-1", "centre"],
  51: ["ride-1", "bow"], 52: ["china", "crash-hit"], 53: ["ride-1", "bell"], 54: ["tambourine", "hit"],
  55: ["splash", "crash-hit"], 56: ["cowbell", "hit"], 57: ["crash-2", "crash-hit"], 58: ["vibraslap", "hit"],
  59: ["ride-2", "bow"], 60: ["bongo-high", "open-tone"], 61: ["bongo-low", "open-tone"], 62: ["conga-high", "mute"],
  63: ["conga-high", "open-tone"], 64: ["conga-low", "open-tone"], 65: ["timbale-high", "hit"], 66: ["timbale-low", "hit"],
  67: ["agogo-high", "hit"], 68: ["agogo-low", "hit"], 69: ["cabasa", "hit"], 70: ["maracas", "hit"],
  71: ["whistle-short", "hit"], 72: ["whistle-long", "hit"], 73: ["guiro-short", "hit"], 74: ["guiro-long", "hit"],
  75: ["claves", "hit"], 76: ["woodblock-high", "hit"], 77: ["woodblock-low", "hit"], 78: ["cuica", "mute"],
  79: ["cuica", "open-tone"], 80: ["triangle", "mute"], 81: ["triangle", "open-tone"],
};

function gmLayout(): Layout {
  const pads: Pad[] = GM_PERCUSSION.map(({ note, name }) => {
    const [slotId, articulation] = GM_TARGETS[note]!;
    return { id: `gm-${note}`, label: name, note, channel: GM_PERCUSSION_CHANNEL, target: { slotId, articulation } };
  });
  return { id: "gm-percussion", name: "General MIDI percussion map", surface: { kind: "zones" }, pads, hiHatPedal: null, slots: slotsFor(pads) };
}

type Cell = [label: string, note: number, slotId: string, articulation: Articulation];

function gridLayout(id: string, name: string, rows: Cell[][]): Layout {
  const pads: Pad[] = [];
  rows.forEach((cells, r) =>
    cells.forEach(([label, note, slotId, articulation], c) => {
      pads.push({ id: `r${r + 1}c${c + 1}`, label, row: r + 1, col: c + 1, note, channel: 10, target: { slotId, articulation } });
    }),
  );
  return { id, name, surface: { kind: "grid", rows: rows.length, cols: rows[0]!.length }, pads, hiHatPedal: null, slots: slotsFor(pads) };
}

const X = EXTRA_NOTES;

/** A 4 x 6 grid of our own: cymbals on top, toms, snare articulations, then kick and hi-hat at the bottom. */
function grid24(): Layout {
  return gridLayout("grid-24", "Four-row 24-pad grid", [
    [["Crash 1", 49, "crash-1", "crash-hit"], ["China", 52, "china", "crash-hit"], ["Ride bell", 53, "ride-1", "bell"], ["Ride bow", 51, "ride-1", "bow"], ["Splash", 55, "splash", "crash-hit"], ["Crash 2", 57, "crash-2", "crash-hit"]],
    [["Tom 1", 50, "tom-1", "centre"], ["Tom 1 rim", X.tom1Rim, "tom-1", "rim-shot"], ["Tom 2", 47, "tom-2", "centre"], ["Tom 2 rim", X.tom2Rim, "tom-2", "rim-shot"], ["Tom 3", 43, "tom-3", "centre"], ["Tom 3 rim", X.tom3Rim, "tom-3", "rim-shot"]],
    [["Snare", 38, "snare", "centre"], ["Snare half-edge", X.snareHalfEdge, "snare", "half-edge"], ["Snare edge", X.snareEdge, "snare", "edge"], ["Snare rim shot", X.snareRimShot, "snare", "rim-shot"], ["Cross-stick", 37, "snare", "cross-stick"], ["Snare flam", X.snareFlam, "snare", "flam"]],
    [["Kick left", 36, "kick", "centre"], ["Kick right", 36, "kick", "centre"], ["Hat closed", 42, "hi-hat", "closed"], ["Hat half-open", X.hiHatHalfOpen, "hi-hat", "half-open"], ["Hat open", 46, "hi-hat", "open"], ["Hat pedal", 44, "hi-hat", "pedal"]],
  ]);
}

/** A 2 x 8 grid of our own: cymbals and hats on the top row, drums on the bottom row. */
function grid2x8(): Layout {
  return gridLayout("grid-2x8", "Two-row 16-pad strip", [
    [["Hat closed", 42, "hi-hat", "closed"], ["Hat open", 46, "hi-hat", "open"], ["Crash 1", 49, "crash-1", "crash-hit"], ["Ride bow", 51, "ride-1", "bow"], ["Ride bell", 53, "ride-1", "bell"], ["Crash 2", 57, "crash-2", "crash-hit"], ["China", 52, "china", "crash-hit"], ["Splash", 55, "splash", "crash-hit"]],
    [["Kick", 36, "kick", "centre"], ["Snare", 38, "snare", "centre"], ["Snare rim shot", X.snareRimShot, "snare", "rim-shot"], ["Cross-stick", 37, "snare", "cross-stick"], ["Tom 1", 50, "tom-1", "centre"], ["Tom 2", 47, "tom-2", "centre"], ["Tom 3", 43, "tom-3", "centre"], ["Hat pedal", 44, "hi-hat", "pedal"]],
  ]);
}

/** A five-piece trigger kit of our own: head and rim zones on snare and toms, cymbal zones, a hi-hat pedal. */
function triggerFive(): Layout {
  const z = (id: string, zone: string, label: string, note: number, slotId: string, articulation: Articulation): Pad => ({
    id,
    label,
    zone,
    note,
    channel: 10,
    target: { slotId, articulation },
  });
  const pads: Pad[] = [
    z("kick", "kick head", "Kick", 36, "kick", "centre"),
    z("snare-head", "snare head", "Snare head", 38, "snare", "centre"),
    z("snare-rim", "snare rim", "Snare rim", X.snareRimShot, "snare", "rim-shot"),
    z("tom1-head", "tom 1 head", "Tom 1 head", 50, "tom-1", "centre"),
    z("tom1-rim", "tom 1 rim", "Tom 1 rim", X.tom1Rim, "tom-1", "rim-shot"),
    z("tom2-head", "tom 2 head", "Tom 2 head", 47, "tom-2", "centre"),
    z("tom2-rim", "tom 2 rim", "Tom 2 rim", X.tom2Rim, "tom-2", "rim-shot"),
    z("tom3-head", "tom 3 head", "Tom 3 head", 43, "tom-3", "centre"),
    z("tom3-rim", "tom 3 rim", "Tom 3 rim", X.tom3Rim, "tom-3", "rim-shot"),
    z("hat-bow", "hi-hat top", "Hat top", 42, "hi-hat", "closed"),
    z("hat-edge", "hi-hat edge", "Hat edge", X.hiHatShank, "hi-hat", "shank"),
    z("crash-edge", "crash edge", "Crash edge", 49, "crash-1", "crash-hit"),
    z("crash-bow", "crash bow", "Crash bow", X.crashBow, "crash-1", "bow"),
    z("ride-bow", "ride bow", "Ride bow", 51, "ride-1", "bow"),
    z("ride-bell", "ride bell", "Ride bell", 53, "ride-1", "bell"),
    z("ride-edge", "ride edge", "Ride edge", X.rideEdge, "ride-1", "edge"),
  ];
  return {
    id: "trigger-five",
    name: "Five-piece trigger kit",
    surface: { kind: "zones" },
    pads,
    hiHatPedal: {
      controller: 4,
      channel: 10,
      slotId: "hi-hat",
      closedAt: "high",
      zones: [
        { low: 0, high: 31, articulation: "open" },
        { low: 32, high: 63, articulation: "half-open" },
        { low: 64, high: 95, articulation: "quarter-open" },
        { low: 96, high: 127, articulation: "closed" },
      ],
      chickNote: 44,
    },
    slots: slotsFor(pads, "hi-hat"),
  };
}

const BUILDERS: Record<string, () => Layout> = {
  "gm-percussion": gmLayout,
  "grid-24": grid24,
  "grid-2x8": grid2x8,
  "trigger-five": triggerFive,
};

/** Names accepted by getTemplate (and by `kitwright audit --layout <name>`). */
export const TEMPLATE_NAMES = Object.keys(BUILDERS) as readonly string[];

/** A fresh copy of a template layout, or null for an unknown name. */
export function getTemplate(name: string): Layout | null {
  const b = BUILDERS[name];
  return b ? b() : null;
}

/** The slot plan of the templates (id, name, family), in kit order. */
export function templateSlotPlan(): LayoutSlot[] {
  return SLOT_PLAN.map((s) => ({ ...s }));
}

/**
 * Our reading of a General MIDI Level 1 percussion key as a family and articulation (the same reading the
 * GM template aims its pads with). Null for keys outside the GM Level 1 map (35-81).
 */
export function gmPercussionTruth(note: number): { name: string; slot: string; family: Family; articulation: Articulation } | null {
  const gm = GM_PERCUSSION.find((g) => g.note === note);
  const target = GM_TARGETS[note];
  if (!gm || !target) return null;
  const slot = SLOT_PLAN.find((s) => s.id === target[0])!;
  return { name: gm.name, slot: slot.id, family: slot.family, articulation: target[1] };
}
