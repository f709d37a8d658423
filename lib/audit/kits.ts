// Default kits: when no kit is given, fill the slots a layout expects from a catalogue.
//
// One slot per catalogued instrument: each slot the layout expects takes the next unused instrument of its
// family. Toms go from high to low measured pitch (common practice, no published source: "toms are ordered
// from high to low pitch"; toms without a pitch come after, by name). Other families take the instrument with
// the most recorded articulations first, then the most samples, then by name (then id). The kit never depends
// on the order the catalogue lists its instruments in: the server lists them by library and name, the command
// line by key, and both must fill a layout's slots alike. Percussion slots
// (hand drum, cowbell, shaker, other) first take an instrument whose name carries the slot's word.
// An instrument is never used twice; expected slots with no instrument left stay empty (their pads go
// silent); instruments no slot asked for are appended as extra slots so the kit holds all of them. No two slots
// share a name, whatever the case: clashing names are numbered ("Kick 1", "Kick 2"; kit-fill.ts uniqueSlotNames).

import { FAMILIES, FAMILY_ARTICULATIONS, type Family } from "../catalogue/taxonomy";
import { byName, tomPitchOrder, withUniqueNames } from "./kit-fill";
import type { Catalogue, CatalogueInstrument, Kit, KitSlot, Layout, LayoutSlot } from "./types";

const FAMILY_WORDS: Array<[RegExp, Family]> = [
  [/kick|bass-?drum|\bbd\b/, "kick"],
  [/snare/, "snare"],
  [/tom/, "tom"],
  [/hi-?hat|hat/, "hi-hat"],
  [/crash/, "crash"],
  [/ride/, "ride"],
  [/china/, "china"],
  [/splash/, "splash"],
  [/stack/, "stack"],
  [/cowbell|agogo/, "cowbell"],
  [/conga|bongo|djembe|cajon|hand/, "hand-drum"],
  [/shaker|maraca|cabasa|tambourine/, "shaker"],
];

/** The slots a layout expects: its own list when it has one, otherwise inferred from slot ids and articulations. */
export function expectedSlots(layout: Layout): LayoutSlot[] {
  if (layout.slots && layout.slots.length) return layout.slots.map((s) => ({ ...s }));
  const arts = new Map<string, Set<string>>();
  const add = (slotId: string, a: string) => {
    const s = arts.get(slotId) ?? new Set<string>();
    s.add(a);
    arts.set(slotId, s);
  };
  for (const p of layout.pads) if (p.target) add(p.target.slotId, p.target.articulation);
  if (layout.hiHatPedal) for (const z of layout.hiHatPedal.zones) add(layout.hiHatPedal.slotId, z.articulation);
  return [...arts].map(([id, set]) => {
    const word = id.toLowerCase();
    let family: Family | undefined = FAMILY_WORDS.find(([re]) => re.test(word))?.[1];
    if (!family) {
      // the first family (in FAMILIES order) that records every articulation asked of the slot
      family = FAMILIES.find((f) => [...set].every((a) => (FAMILY_ARTICULATIONS[f] as readonly string[]).includes(a))) ?? "other";
    }
    return { id, name: id, family };
  });
}

const NAME_MATCHED = new Set<Family>(["hand-drum", "cowbell", "shaker", "other"]);
const GENERIC_WORDS = new Set(["high", "low", "hi", "lo", "short", "long", "mute", "open", "a", "b"]);

function normalise(s: string): string {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, "");
}
function slotWords(s: LayoutSlot): string[] {
  return `${s.id} ${s.name}`
    .toLowerCase()
    .split(/[^a-z]+/)
    .filter((w) => w.length > 2 && !GENERIC_WORDS.has(w))
    .map(normalise);
}
function catalogueWords(list: CatalogueInstrument[] | undefined): Set<string> {
  // slot words some instrument of the family is named after (such slots wait for that instrument)
  const out = new Set<string>();
  for (const i of list ?? []) for (const w of normalise(i.name).match(/[a-z]+/g) ?? []) out.add(w);
  return out;
}
function namedForOtherSlot(i: CatalogueInstrument, family: Family, expected: LayoutSlot[]): boolean {
  if (!NAME_MATCHED.has(family)) return false;
  const n = normalise(i.name);
  return expected.some((s) => s.family === family && slotWords(s).some((w) => n.includes(w)));
}

function recordedCount(i: CatalogueInstrument): number {
  return new Set(i.articulations.filter((a) => a.layers.some((l) => l.sampleIds.length > 0)).map((a) => a.articulation)).size;
}
function sampleCount(i: CatalogueInstrument): number {
  return i.articulations.reduce((s, a) => s + a.layers.reduce((t, l) => t + l.sampleIds.length, 0), 0);
}

/** Other families: the instrument with the most recorded articulations first, then the most samples, then by name. */
function richerFirst(a: CatalogueInstrument, b: CatalogueInstrument): number {
  return recordedCount(b) - recordedCount(a) || sampleCount(b) - sampleCount(a) || byName(a, b);
}

const tomOrder = tomPitchOrder;

/** Build a kit for `layout` from the instruments of `catalogue` (rules above). */
export function buildDefaultKit(layout: Layout, catalogue: Catalogue, name = `Default kit for ${layout.name}`): Kit {
  const byFamily = new Map<Family, CatalogueInstrument[]>();
  for (const inst of catalogue) {
    const list = byFamily.get(inst.family) ?? [];
    list.push(inst);
    byFamily.set(inst.family, list);
  }
  for (const [f, list] of byFamily) list.sort(f === "tom" ? tomOrder : richerFirst);
  const used = new Set<string>();
  const expected = expectedSlots(layout);
  const chosen = new Map<string, CatalogueInstrument>();
  // First pass, percussion only: a slot whose name word appears in an instrument's name takes it
  // ("Conga high" takes "Conga 11"), so a conga does not land in a bongo slot just by coming first.
  for (const s of expected) {
    if (!NAME_MATCHED.has(s.family)) continue;
    const words = slotWords(s);
    const hit = (byFamily.get(s.family) ?? []).find((i) => !used.has(i.id) && words.some((w) => normalise(i.name).includes(w)));
    if (hit) {
      used.add(hit.id);
      chosen.set(s.id, hit);
    }
  }
  const slots: KitSlot[] = expected.map((s) => {
    let inst = chosen.get(s.id) ?? null;
    if (!inst && !(NAME_MATCHED.has(s.family) && slotWords(s).some((w) => catalogueWords(byFamily.get(s.family)).has(w)))) {
      inst = (byFamily.get(s.family) ?? []).find((i) => !used.has(i.id) && !namedForOtherSlot(i, s.family, expected)) ?? null;
      if (inst) used.add(inst.id);
    }
    return { id: s.id, name: s.name, family: s.family, instrumentId: inst?.id ?? null };
  });
  const ids = new Set(slots.map((s) => s.id));
  let n = 0;
  for (const f of FAMILIES) {
    for (const inst of byFamily.get(f) ?? []) {
      if (used.has(inst.id)) continue;
      let id: string;
      do id = `extra-${++n}`;
      while (ids.has(id));
      ids.add(id);
      slots.push({ id, name: inst.name, family: inst.family, instrumentId: inst.id });
    }
  }
  // an instrument named like a slot ("Kick" beside the slot "Kick", "Hi-Hat" beside "Hi-hat") is numbered
  return { id: `default-${layout.id}`, name, slots: withUniqueNames(slots) };
}

/** Order tom instruments from high to low measured pitch (unpitched last, by name). */
export function orderTomsByPitch<T extends CatalogueInstrument>(toms: readonly T[]): T[] {
  return [...toms].sort(tomOrder);
}
