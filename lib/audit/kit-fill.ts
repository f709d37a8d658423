// Filling a kit's slots from a catalogue: slot names that never clash, and the instruments a slot is offered.
//
// Names: two slots of one kit never share a name, whatever the case or spacing ("Kick" and "kick ", "Hi-hat" and
// "Hi-Hat" are one name). Every slot of a clashing name is numbered in kit order from the first spelling met —
// "Tom 1", "Tom 2", "Tom 3" — skipping numbers another slot already carries. Kitwright's own rule (common
// practice for drum kits: numbered toms and cymbals), no published source.
//
// Choice: a slot is offered the instruments of the family it expects first, then the others family by family
// (FAMILIES order), optionally only those of one library; toms high to low by measured pitch, the rest by name.

import { FAMILIES, type Family } from "../catalogue/taxonomy";

/** The key two names clash on: case, accents' case and runs of spaces ignored. */
export function slotNameKey(name: string): string {
  return name.trim().replace(/\s+/g, " ").toLocaleLowerCase("en");
}

/** `names` with every clashing name numbered (rules above); names that do not clash are kept as given. */
export function uniqueSlotNames(names: readonly string[]): string[] {
  const count = new Map<string, number>();
  for (const n of names) count.set(slotNameKey(n), (count.get(slotNameKey(n)) ?? 0) + 1);
  // names kept as they are can not be taken by a number
  const taken = new Set(names.map(slotNameKey).filter((k) => count.get(k) === 1));
  const base = new Map<string, string>();
  const next = new Map<string, number>();
  return names.map((n) => {
    const key = slotNameKey(n);
    if (count.get(key) === 1) return n;
    if (!base.has(key)) base.set(key, n.trim().replace(/\s+/g, " "));
    let k = next.get(key) ?? 1;
    let name = `${base.get(key)} ${k}`;
    while (taken.has(slotNameKey(name))) name = `${base.get(key)} ${++k}`;
    next.set(key, k + 1);
    taken.add(slotNameKey(name));
    return name;
  });
}

/** The same slots with unique names (see uniqueSlotNames); ids and everything else unchanged. */
export function withUniqueNames<S extends { name: string }>(slots: readonly S[]): S[] {
  const names = uniqueSlotNames(slots.map((s) => s.name));
  return slots.map((s, i) => (names[i] === s.name ? s : { ...s, name: names[i]! }));
}

type Named = { id: string; name: string };
type Pitched = Named & { pitchHz?: number | null };

/** By name, then id (so equal names keep one order whatever order they came in). */
export function byName(a: Named, b: Named): number {
  return a.name.localeCompare(b.name) || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

/**
 * Toms from high to low measured pitch, unpitched ones after, by name (common practice, no published source:
 * "toms are ordered from high to low pitch").
 */
export function tomPitchOrder(a: Pitched, b: Pitched): number {
  const pa = a.pitchHz ?? null;
  const pb = b.pitchHz ?? null;
  if (pa !== null && pb !== null && pa !== pb) return pb - pa;
  if (pa !== null && pb === null) return -1;
  if (pa === null && pb !== null) return 1;
  return byName(a, b);
}

export interface ChoosableInstrument {
  id: string;
  name: string;
  family: Family;
  libraryId: string;
  pitchHz: number | null;
}

export interface SlotChoices<T> {
  /** Instruments of the family the slot expects. */
  expected: T[];
  /** The other families that have instruments, in FAMILIES order. */
  others: Array<{ family: Family; instruments: T[] }>;
}

/** What a slot expecting `family` is offered from `instruments` (only `libraryId`'s when given). */
export function choicesForSlot<T extends ChoosableInstrument>(family: Family, instruments: readonly T[], libraryId?: string | null): SlotChoices<T> {
  const pool = libraryId ? instruments.filter((i) => i.libraryId === libraryId) : [...instruments];
  const of = (f: Family) => {
    const list = pool.filter((i) => i.family === f);
    return list.sort(f === "tom" ? tomPitchOrder : byName);
  };
  return {
    expected: of(family),
    others: FAMILIES.filter((f) => f !== family).map((f) => ({ family: f, instruments: of(f) })).filter((g) => g.instruments.length > 0),
  };
}
