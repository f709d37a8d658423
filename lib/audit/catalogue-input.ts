// Turning a catalogue from elsewhere (the cataloguer's output, a kitwright.catalogue/v1 file) into the
// auditor's CatalogueInstrument list. Tolerant of field names (id/key, name/displayName), strict on values:
// anything it cannot read is reported, nothing is silently invented.

import { isArticulation, isFamily } from "../catalog/taxonomy";
import { CATALOGUE_SCHEMA, parseCatalogueFile } from "./schema";
import type { CatalogueArticulation, CatalogueInstrument, CatalogueLayer } from "./types";

type Obj = Record<string, unknown>;
const isObj = (x: unknown): x is Obj => typeof x === "object" && x !== null && !Array.isArray(x);
const str = (x: unknown): string | null => (typeof x === "string" && x.length ? x : null);
const num = (x: unknown): number | null => (typeof x === "number" && Number.isFinite(x) ? x : null);

export interface CatalogueReading {
  instruments: CatalogueInstrument[];
  /** What could not be read, one line each. */
  problems: string[];
}

function readLayers(raw: unknown, where: string, problems: string[]): CatalogueLayer[] {
  if (!Array.isArray(raw)) {
    problems.push(`${where}: no layers list`);
    return [];
  }
  const out: CatalogueLayer[] = [];
  raw.forEach((l, i) => {
    if (!isObj(l)) return void problems.push(`${where}.layers[${i}]: not an object`);
    const lo = num(l.velocityLow);
    const hi = num(l.velocityHigh);
    const ids = Array.isArray(l.sampleIds) ? l.sampleIds.filter((s): s is string => typeof s === "string") : null;
    if (lo === null || hi === null || ids === null) return void problems.push(`${where}.layers[${i}]: needs velocityLow, velocityHigh and sampleIds`);
    out.push({ index: num(l.index) ?? i, velocityLow: lo, velocityHigh: hi, meanStrikeLufs: num(l.meanStrikeLufs) ?? NaN, sampleIds: ids });
  });
  return out;
}

function readArticulation(raw: unknown, where: string, problems: string[]): CatalogueArticulation | null {
  if (!isObj(raw)) return (problems.push(`${where}: not an object`), null);
  const a = str(raw.articulation);
  if (!a || !isArticulation(a)) return (problems.push(`${where}: unknown articulation ${JSON.stringify(raw.articulation)}`), null);
  return { articulation: a, mic: str(raw.mic), layers: readLayers(raw.layers, where, problems) };
}

/**
 * Read a catalogue: a kitwright.catalogue/v1 document, a bare list of instruments, or an object with
 * `instruments` (and optionally `groups`: { instrumentId|instrumentKey, articulation, mic, layers }).
 */
export function readCatalogue(input: unknown): CatalogueReading {
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
    const arts = Array.isArray(raw.articulations)
      ? raw.articulations.map((a, j) => readArticulation(a, `instrument ${id}.articulations[${j}]`, problems)).filter((a): a is CatalogueArticulation => !!a)
      : [];
    byId.set(id, { id, name: str(raw.name) ?? str(raw.displayName) ?? id, family, pitchHz: num(raw.pitchHz), articulations: arts });
  });
  if (isObj(input) && Array.isArray(input.groups)) {
    input.groups.forEach((g, i) => {
      if (!isObj(g)) return void problems.push(`groups[${i}]: not an object`);
      const instId = str(g.instrumentId) ?? str(g.instrumentKey) ?? str(g.instrument);
      const inst = instId ? byId.get(instId) : undefined;
      if (!inst) return void problems.push(`groups[${i}]: instrument ${JSON.stringify(instId)} is not in the list`);
      const a = readArticulation(g, `groups[${i}]`, problems);
      if (a) inst.articulations.push(a);
    });
  }
  return { instruments: [...byId.values()], problems };
}
