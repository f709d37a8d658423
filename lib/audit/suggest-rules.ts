// Words, notes and reasons of a suggested layout (see suggest.ts). Note numbers: General MIDI Level 1's
// percussion key map where it names the stroke (templates.ts GM_PERCUSSION), Kitwright's EXTRA_NOTES for
// strokes it does not name, then the first free note from 96 up. Pads that play the same stroke share a note.

import { FAMILY_ARTICULATIONS, type Articulation, type Family, type Stroke } from "../catalogue/taxonomy";
import { EXTRA_NOTES } from "./templates";
import type { OfferedStroke } from "./suggest";

/** A stroke in a drummer's words ("rim shot", "crash"). */
export function strokeWords(a: Stroke): string {
  if (a === "crash-hit") return "crash";
  if (a === "open-tone") return "open tone";
  if (a === "rim-shot" || a === "rim-click") return a.replace("-", " ");
  return a;
}

/** The stroke a family is mostly played with: the first of its list (centre, closed, bow, crash ...). */
export function mainStrike(family: Family): Articulation {
  return FAMILY_ARTICULATIONS[family][0]!;
}

/** Order of strokes within a family (its list order; strokes outside it last). */
export function strokeRank(family: Family, a: Stroke): number {
  const i = (FAMILY_ARTICULATIONS[family] as readonly Stroke[]).indexOf(a);
  return i >= 0 ? i : 100;
}

// General MIDI tom keys, high to low (50 High Tom ... 41 Low Floor Tom), chosen evenly for smaller kits.
const GM_TOMS: Record<number, number[]> = {
  1: [47], 2: [50, 45], 3: [50, 47, 43], 4: [50, 48, 45, 43], 5: [50, 48, 47, 45, 43], 6: [50, 48, 47, 45, 43, 41],
};

function preferredNote(s: OfferedStroke): number | null {
  const f = s.slot.family;
  const a = s.articulation;
  const first = s.ordinal === 0;
  const X = EXTRA_NOTES;
  if (f === "kick" && a === "centre") return first ? 36 : 35;
  if (f === "snare") {
    if (a === "centre") return first ? 38 : 40;
    if (!first) return null;
    return ({ "cross-stick": 37, "rim-shot": X.snareRimShot, "half-edge": X.snareHalfEdge, edge: X.snareEdge, flam: X.snareFlam } as Partial<Record<Stroke, number>>)[a] ?? null;
  }
  if (f === "tom") {
    if (a === "centre") return GM_TOMS[s.ofFamily]?.[s.ordinal] ?? null;
    if (a === "rim-shot") return [X.tom1Rim, X.tom2Rim, X.tom3Rim][s.ordinal] ?? null;
    return null;
  }
  if (f === "hi-hat") return ({ closed: 42, pedal: 44, open: 46, "half-open": X.hiHatHalfOpen, shank: X.hiHatShank } as Partial<Record<Stroke, number>>)[a] ?? null;
  if (f === "crash") return a === "crash-hit" ? (first ? 49 : s.ordinal === 1 ? 57 : null) : a === "bow" && first ? X.crashBow : null;
  if (f === "ride") return first ? (({ bow: 51, bell: 53, edge: X.rideEdge } as Partial<Record<Stroke, number>>)[a] ?? null) : a === "bow" && s.ordinal === 1 ? 59 : null;
  if (f === "china" && a === "crash-hit" && first) return 52;
  if (f === "splash" && a === "crash-hit" && first) return 55;
  if (f === "cowbell" && a === "hit" && first) return 56;
  return null;
}

/** The note of a stroke: its preferred note when still free, else the first free note from 96 up (then 0 up). */
export function noteFor(s: OfferedStroke, used: ReadonlySet<number>): number {
  const p = preferredNote(s);
  if (p !== null && !used.has(p)) return p;
  for (let n = 96; n < 128; n++) if (!used.has(n)) return n;
  for (let n = 0; n < 96; n++) if (!used.has(n)) return n;
  throw new Error("all 128 notes are taken");
}

/** A pad's label: the slot's name, and the stroke unless it is the main strike ("Snare A rim shot"). */
export function padLabel(s: OfferedStroke): string {
  return s.articulation === mainStrike(s.slot.family) ? s.slot.name : `${s.slot.name} ${strokeWords(s.articulation)}`;
}

/** Why a stroke sits where it does, in a sentence (common practice, as the module comment says). */
export function reasonFor(s: OfferedStroke, rows: number, beside = true): string {
  const main = strokeWords(mainStrike(s.slot.family));
  let why: string;
  switch (s.role) {
    case "snare":
      why = "Snare in the middle of the lower rows: either hand reaches it.";
      break;
    case "kick":
      why =
        s.copy === 0
          ? "Kick central, beside the snare: one hand plays it while the other keeps time."
          : "A second kick pad (same note) on the snare's other side: fast doubles with both hands.";
      break;
    case "hat":
      why = `Hi-hat ${strokeWords(s.articulation)} on both sides of the snare (this is the ${s.copy === 0 ? "left" : "right"} one, same note): either hand keeps time without crossing.`;
      break;
    case "tom":
      why = `Tom ${s.ordinal + 1} of ${s.ofFamily}: toms run high to low from left to right, as they sit around a kit, ${rows >= 3 ? "in the row above the snare" : "in the top row"}.`;
      break;
    case "cymbal":
      why =
        s.slot.family === "ride"
          ? "Ride in the top row on the right: where it sits on most kits, above and outside the drums."
          : s.slot.family === "crash" && s.ordinal === 0
            ? "Crash in the top row on the left: where it sits on most kits, above and outside the drums."
            : "Cymbal in the top row toward the outside: cymbals sit above and outside the drums.";
      break;
    case "second-snare":
      why = "Second snare next to the first: switching between them is one step.";
      break;
    case "percussion":
      why = "Percussion toward the outer columns, after the kit.";
      break;
    default: {
      const home = s.slot.family === "hi-hat" ? "the right-hand closed hat" : `its ${main}`;
      why = beside
        ? `${s.slot.name} ${strokeWords(s.articulation)} next to ${home}: a secondary stroke beside its main strike.`
        : `${s.slot.name} ${strokeWords(s.articulation)} as near ${home} as the free pads allowed.`;
    }
  }
  return s.standInFor ? `${why} Not recorded: the ${strokeWords(s.standInFor)} plays instead (the nearest recorded stroke).` : why;
}
