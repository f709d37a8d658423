// Instruments: one physical drum or cymbal of a library, grouped automatically from the folder and file name
// stems plus the family. Keys are deterministic ("snare:14x6.5-brass"), display names readable ("Snare 14x6.5 Brass").

import { clusterSizes, layerCountFromGaps } from "./layers";
import type { Family } from "./taxonomy";

export interface InstrumentInput {
  id: string;
  family: Family;
  /** Descriptive words of the name (NameInfo.stem): canonical family words, sizes, materials, drum numbers. */
  stem: string[];
}

export interface Instrument {
  key: string;
  family: Family;
  displayName: string;
  /** Descriptor words that tell this instrument from the others of its family. */
  descriptors: string[];
  /** Sorted. */
  sampleIds: string[];
  /** Keys of instruments merged into this one. */
  mergedFrom: string[];
}

const FAMILY_WORDS = new Set(["kick", "snare", "tom", "hi-hat", "crash", "ride", "china", "splash", "stack", "cowbell", "shaker"]);
/** Words placed before the family word in display names ("Floor Tom", "High Tom"). */
const PREFIX_WORDS = new Set(["rack", "floor", "high", "mid", "low", "piccolo"]);

const FAMILY_LABEL: Record<Family, string> = {
  kick: "Kick", snare: "Snare", tom: "Tom", "hi-hat": "Hi-Hat", crash: "Crash", ride: "Ride", china: "China", splash: "Splash",
  stack: "Stack", cowbell: "Cowbell", "hand-drum": "Hand Drum", shaker: "Shaker", other: "Other",
};

/** Descriptor words of a stem: the stem without family words, lower-case, unique, in order. */
export function descriptorsOf(stem: string[]): string[] {
  const out: string[] = [];
  for (const w of stem.map((s) => s.toLowerCase())) if (!FAMILY_WORDS.has(w) && !out.includes(w)) out.push(w);
  return out;
}

/** Deterministic key: family, colon, descriptors joined by "-" (or "main" when there are none). */
export function instrumentKey(family: Family, stem: string[]): string {
  const d = descriptorsOf(stem).map((w) => w.replace(/[^a-z0-9.]+/g, ""));
  return `${family}:${d.filter(Boolean).join("-") || "main"}`;
}

const title = (w: string) => (/^\d/.test(w) ? w : w.charAt(0).toUpperCase() + w.slice(1));

/** Readable name: qualifiers before the family word ("Floor Tom 16in"), the other descriptors after it. */
export function instrumentDisplayName(family: Family, stem: string[]): string {
  const d = descriptorsOf(stem);
  // hand drums and "other" name themselves ("Conga", "Clap")
  if ((family === "hand-drum" || family === "other" || family === "shaker") && d.length) return d.map(title).join(" ");
  const pre = d.filter((w) => PREFIX_WORDS.has(w));
  const post = d.filter((w) => !PREFIX_WORDS.has(w));
  return [...pre.map(title), FAMILY_LABEL[family], ...post.map(title)].join(" ");
}

/** Groups samples into instruments by family + stem. Output sorted by key. */
export function groupInstruments(samples: InstrumentInput[]): { instruments: Instrument[]; bySample: Record<string, string> } {
  const map = new Map<string, Instrument>();
  const bySample: Record<string, string> = {};
  for (const s of samples) {
    const key = instrumentKey(s.family, s.stem);
    let inst = map.get(key);
    if (!inst) {
      inst = { key, family: s.family, displayName: instrumentDisplayName(s.family, s.stem), descriptors: descriptorsOf(s.stem), sampleIds: [], mergedFrom: [] };
      map.set(key, inst);
    }
    inst.sampleIds.push(s.id);
    bySample[s.id] = key;
  }
  const instruments = [...map.values()].sort((a, b) => a.key.localeCompare(b.key));
  for (const i of instruments) i.sampleIds.sort();
  return { instruments, bySample };
}

/**
 * Merges `source` into `target` (a member says they are one instrument). Pure: returns a new instrument with
 * the target's key, both sample lists and the source recorded in mergedFrom. Families must match.
 */
export function mergeInstruments(target: Instrument, source: Instrument, opts: { displayName?: string } = {}): Instrument {
  if (target.family !== source.family) {
    throw new Error(`cannot merge ${source.displayName} (${source.family}) into ${target.displayName} (${target.family}): families differ`);
  }
  if (target.key === source.key) return { ...target, sampleIds: [...target.sampleIds], mergedFrom: [...target.mergedFrom] };
  return {
    key: target.key,
    family: target.family,
    displayName: opts.displayName ?? target.displayName,
    descriptors: [...target.descriptors],
    sampleIds: [...new Set([...target.sampleIds, ...source.sampleIds])].sort(),
    mergedFrom: [...new Set([...target.mergedFrom, source.key, ...source.mergedFrom])].sort(),
  };
}

/** Applies a merge to a list of instruments: the source disappears, the target grows. Unknown keys are an error. */
export function mergeInList(instruments: Instrument[], targetKey: string, sourceKey: string, opts: { displayName?: string } = {}): Instrument[] {
  const t = instruments.find((i) => i.key === targetKey);
  const s = instruments.find((i) => i.key === sourceKey);
  if (!t) throw new Error(`no instrument "${targetKey}"`);
  if (!s) throw new Error(`no instrument "${sourceKey}"`);
  if (t === s) return instruments.slice();
  const merged = mergeInstruments(t, s, opts);
  return instruments.filter((i) => i.key !== sourceKey).map((i) => (i.key === targetKey ? merged : i));
}

/**
 * Splits an instrument named by sound only (no name words) by the pitch of its hits: drums of one kind in one
 * folder (three toms, two snares) sit at different pitches, while one drum's hits vary by well under a whole
 * tone with strength. Clusters of log pitch (semitones) by the same gap criterion as the layers, with a
 * smallest gap of 2 semitones (toms are commonly tuned a third or fourth apart: common practice, no published
 * source). Parts are numbered from the highest pitch (toms are ordered high to low, common practice).
 * Samples without a measured pitch stay together in a part of their own ("unpitched").
 */
export function splitByPitch(inst: Instrument, pitchById: Record<string, number | null>, opts: { minGapSemitones?: number } = {}): Instrument[] {
  const pitched = inst.sampleIds.filter((id) => (pitchById[id] ?? 0) > 0);
  const unpitched = inst.sampleIds.filter((id) => !((pitchById[id] ?? 0) > 0));
  if (pitched.length < 2) return [inst];
  const semis = pitched.map((id) => ({ id, s: 12 * Math.log2(pitchById[id]! / 440) })).sort((a, b) => a.s - b.s || a.id.localeCompare(b.id));
  const choice = layerCountFromGaps(semis.map((x) => x.s), { minGapDb: opts.minGapSemitones ?? 2, spreadFloorDb: 0.5, maxLayers: 8 });
  if (choice.k < 2) return [inst];
  const sizes = clusterSizes(semis.map((x) => x.s), choice.k);
  const parts: { ids: string[]; hz: number }[] = [];
  let at = 0;
  for (const n of sizes) {
    const chunk = semis.slice(at, at + n);
    at += n;
    const mean = chunk.reduce((a, x) => a + x.s, 0) / chunk.length;
    parts.push({ ids: chunk.map((x) => x.id).sort(), hz: 440 * 2 ** (mean / 12) });
  }
  parts.reverse(); // highest first
  const out: Instrument[] = parts.map((p, i) => ({
    key: `${inst.key}-p${i + 1}`,
    family: inst.family,
    displayName: `${inst.displayName} ${i + 1} (about ${Math.round(p.hz)} Hz)`,
    descriptors: [...inst.descriptors, `p${i + 1}`],
    sampleIds: p.ids,
    mergedFrom: [],
  }));
  if (unpitched.length) {
    out.push({ key: `${inst.key}-unpitched`, family: inst.family, displayName: `${inst.displayName} (no clear pitch)`, descriptors: [...inst.descriptors, "unpitched"], sampleIds: unpitched.sort(), mergedFrom: [] });
  }
  return out;
}
