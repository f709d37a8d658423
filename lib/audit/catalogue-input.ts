// The one converter from a catalogue to the auditor's CatalogueInstrument list. The command line feeds it the
// cataloguer's output (lib/catalogue catalogueSamples()) or a catalogue file; the server feeds it the rows the
// cataloguing wrote (instruments + layer_groups, lib/server/kits/catalogue-for-audit.ts). Tolerant of field names
// (id/key, name/displayName, instrumentId/instrumentKey), strict on values: anything it cannot read, and every
// value it changes, is reported in `problems`, one line each; nothing is silently invented.
//
// Layers (readLayers, the only reader of layers):
// - a layer needs numeric velocityLow and velocityHigh and a sampleIds list (its round robins); otherwise it is
//   left out and reported;
// - velocities are MIDI 1.0 note-on velocities, whole numbers 1-127 (0 means note-off): a bound that is not a
//   whole number is rounded, one outside 1-127 is clamped into it, and each change is reported; a layer whose
//   low bound is then above its high bound is left out and reported;
// - index defaults to the layer's position in the list, meanStrikeLufs to NaN when absent or not finite;
//   sampleIds keeps its strings.
// An instrument's pitchHz is a positive number or null (anything else is reported and read as null).
// An articulation is a built-in stroke or one of the studio's own (`strokes`, lib/catalogue/strokes.ts); any other
// is reported and its layers left out.

import { isKnownStroke, type StrokeList } from "../catalogue/strokes";
import { isFamily } from "../catalogue/taxonomy";
import { CATALOGUE_SCHEMA, parseCatalogueFile } from "./schema";
import type { CatalogueArticulation, CatalogueInstrument, CatalogueLayer } from "./types";

type Obj = Record<string, unknown>;
const isObj = (x: unknown): x is Obj => typeof x === "object" && x !== null && !Array.isArray(x);
const str = (x: unknown): string | null => (typeof x === "string" && x.length ? x : null);
const num = (x: unknown): number | null => (typeof x === "number" && Number.isFinite(x) ? x : null);

export interface CatalogueReading {
  instruments: CatalogueInstrument[];
  /** What could not be read or was changed, one line each. */
  problems: string[];
}

/** A velocity bound as a whole number 1-127 (rounded, then clamped); the change is reported. */
function velocity(v: number, what: string, problems: string[]): number {
  const out = Math.max(1, Math.min(127, Math.round(v)));
  if (out !== v) problems.push(`${what} ${v} read as ${out} (velocities are whole numbers 1-127)`);
  return out;
}

/** The layers of one articulation (rules in the header). */
export function readLayers(raw: unknown, where: string, problems: string[]): CatalogueLayer[] {
  if (!Array.isArray(raw)) {
    problems.push(`${where}: no layers list`);
    return [];
  }
  const out: CatalogueLayer[] = [];
  raw.forEach((l, i) => {
    const at = `${where}.layers[${i}]`;
    if (!isObj(l)) return void problems.push(`${at}: not an object`);
    const lo = num(l.velocityLow);
    const hi = num(l.velocityHigh);
    const ids = Array.isArray(l.sampleIds) ? l.sampleIds.filter((s): s is string => typeof s === "string") : null;
    if (lo === null || hi === null || ids === null) return void problems.push(`${at}: needs velocityLow, velocityHigh and sampleIds`);
    const low = velocity(lo, `${at}: velocityLow`, problems);
    const high = velocity(hi, `${at}: velocityHigh`, problems);
    if (low > high) return void problems.push(`${at}: velocityLow ${low} is above velocityHigh ${high}; layer left out`);
    out.push({ index: num(l.index) ?? i, velocityLow: low, velocityHigh: high, meanStrikeLufs: num(l.meanStrikeLufs) ?? NaN, sampleIds: ids });
  });
  return out;
}

function readArticulation(raw: unknown, where: string, problems: string[], strokes?: StrokeList | null): CatalogueArticulation | null {
  if (!isObj(raw)) return (problems.push(`${where}: not an object`), null);
  const a = str(raw.articulation);
  if (!a || !isKnownStroke(a, strokes)) return (problems.push(`${where}: unknown articulation ${JSON.stringify(raw.articulation)}`), null);
  return { articulation: a, mic: str(raw.mic), layers: readLayers(raw.layers, where, problems) };
}

function readPitch(raw: unknown, where: string, problems: string[]): number | null {
  if (raw === null || raw === undefined) return null;
  const p = num(raw);
  if (p !== null && p > 0) return p;
  problems.push(`${where}: pitchHz ${JSON.stringify(raw)} is not a positive number; read as none`);
  return null;
}

/**
 * Read a catalogue: a kitwright.catalogue/v1 document (validated by its schema, SchemaError when invalid), a bare
 * list of instruments, or an object with `instruments` (and optionally `groups`: { instrumentId|instrumentKey,
 * articulation, mic, layers }), such as catalogueSamples() returns. Instruments keep their input order.
 * `strokes`: the studio's own strokes an articulation may name besides the built-ins.
 */
export function readCatalogue(input: unknown, strokes?: StrokeList | null): CatalogueReading {
  if (isObj(input) && input.schema === CATALOGUE_SCHEMA) return { instruments: parseCatalogueFile(input), problems: [] };
  const problems: string[] = [];
  const list: unknown[] = Array.isArray(input) ? input : isObj(input) && Array.isArray(input.instruments) ? input.instruments : [];
  if (!Array.isArray(input) && !(isObj(input) && Array.isArray(input.instruments))) {
    problems.push("no instruments list found");
  }
  const byId = new Map<string, CatalogueInstrument>();
  list.forEach((raw, i) => {
    if (!isObj(raw)) return void problems.push(`instruments[${i}]: not an object`);
    const id = str(raw.id) ?? str(raw.key);
    const family = str(raw.family);
    if (!id) return void problems.push(`instruments[${i}]: no id`);
    if (!family || !isFamily(family)) return void problems.push(`instrument ${id}: unknown family ${JSON.stringify(raw.family)}`);
    if (byId.has(id)) return void problems.push(`instrument ${id}: listed twice; the first is kept`);
    const arts = Array.isArray(raw.articulations)
      ? raw.articulations.map((a, j) => readArticulation(a, `instrument ${id}.articulations[${j}]`, problems, strokes)).filter((a): a is CatalogueArticulation => !!a)
      : [];
    byId.set(id, { id, name: str(raw.name) ?? str(raw.displayName) ?? id, family, pitchHz: readPitch(raw.pitchHz, `instrument ${id}`, problems), articulations: arts });
  });
  if (isObj(input) && Array.isArray(input.groups)) {
    input.groups.forEach((g, i) => {
      if (!isObj(g)) return void problems.push(`groups[${i}]: not an object`);
      const instId = str(g.instrumentId) ?? str(g.instrumentKey) ?? str(g.instrument);
      const inst = instId ? byId.get(instId) : undefined;
      if (!inst) return void problems.push(`groups[${i}]: instrument ${JSON.stringify(instId)} is not in the list`);
      const a = readArticulation(g, `groups[${i}]`, problems, strokes);
      if (a) inst.articulations.push(a);
    });
  }
  return { instruments: [...byId.values()], problems };
}
