import "server-only";
// A studio's catalogue as the auditor reads it: the `instruments` rows of every library of the studio, with
// their articulations from `layer_groups` (linked by library id + instrument key). The regroup job fills both
// tables; until it has run, a studio simply has no instruments (audits then report empty slots / silence).
import type { Knex } from "knex";
import { db } from "../db";
import { isArticulation, isFamily, type Family } from "@/lib/catalog/taxonomy";
import type { CatalogueArticulation, CatalogueInstrument, CatalogueLayer } from "@/lib/audit/types";

const parseJson = (v: unknown): unknown => (typeof v === "string" ? JSON.parse(v) : v);

/** One instrument as the kit editor lists it (family, library, sample counts). */
export interface InstrumentChoice {
  id: string;
  name: string;
  family: Family;
  libraryId: string;
  libraryName: string;
  pitchHz: number | null;
  sampleCount: number;
  articulations: string[];
}

/** The catalogue instrument plus the library it belongs to (the audition fetches sample audio per library). */
export interface StudioCatalogueInstrument extends CatalogueInstrument {
  libraryId: string;
}

function readLayers(raw: unknown): CatalogueLayer[] {
  const arr = parseJson(raw);
  if (!Array.isArray(arr)) return [];
  const out: CatalogueLayer[] = [];
  arr.forEach((l, i) => {
    if (!l || typeof l !== "object") return;
    const o = l as Record<string, unknown>;
    const lo = Number(o.velocityLow);
    const hi = Number(o.velocityHigh);
    if (!Number.isFinite(lo) || !Number.isFinite(hi)) return;
    out.push({
      index: Number.isFinite(Number(o.index)) ? Number(o.index) : i,
      velocityLow: Math.max(1, Math.min(127, Math.round(lo))),
      velocityHigh: Math.max(1, Math.min(127, Math.round(hi))),
      meanStrikeLufs: Number.isFinite(Number(o.meanStrikeLufs)) ? Number(o.meanStrikeLufs) : NaN,
      sampleIds: Array.isArray(o.sampleIds) ? o.sampleIds.filter((s): s is string => typeof s === "string") : [],
    });
  });
  return out;
}

/**
 * The studio's catalogue for lib/audit (every library, or only the given instrument ids).
 * Rows with a family or articulation Kitwright does not know are skipped.
 */
export async function loadStudioCatalogue(
  { studioId, instrumentIds }: { studioId: string; instrumentIds?: readonly string[] },
  k: Knex = db(),
): Promise<StudioCatalogueInstrument[]> {
  if (instrumentIds && instrumentIds.length === 0) return [];
  const iq = k("instruments").where({ studio_id: studioId }).orderBy([{ column: "library_id" }, { column: "name" }]).select("id", "library_id", "key", "name", "family", "pitch_hz");
  if (instrumentIds) iq.whereIn("id", [...instrumentIds]);
  const insts = await iq;
  if (!insts.length) return [];
  const libs = [...new Set(insts.map((r) => r.library_id as string))];
  const groups = await k("layer_groups").where({ studio_id: studioId }).whereIn("library_id", libs).orderBy("id").select("library_id", "instrument_key", "articulation", "mic", "layers");
  const byKey = new Map<string, CatalogueArticulation[]>();
  for (const g of groups) {
    if (!isArticulation(g.articulation)) continue;
    const key = `${g.library_id}\u0000${g.instrument_key}`;
    const list = byKey.get(key) ?? [];
    list.push({ articulation: g.articulation, mic: g.mic ?? null, layers: readLayers(g.layers) });
    byKey.set(key, list);
  }
  const out: StudioCatalogueInstrument[] = [];
  for (const r of insts) {
    if (!isFamily(r.family)) continue;
    out.push({
      id: r.id,
      name: r.name,
      family: r.family,
      pitchHz: r.pitch_hz === null || r.pitch_hz === undefined ? null : Number(r.pitch_hz),
      libraryId: r.library_id,
      articulations: byKey.get(`${r.library_id}\u0000${r.key}`) ?? [],
    });
  }
  return out;
}

/** Instruments of the studio for the kit editor's picker. */
export async function listInstrumentChoices({ studioId }: { studioId: string }): Promise<InstrumentChoice[]> {
  const cat = await loadStudioCatalogue({ studioId });
  if (!cat.length) return [];
  const libs = await db()("libraries").where({ studio_id: studioId }).select("id", "name");
  const libName = new Map(libs.map((l) => [l.id as string, l.name as string]));
  return cat
    .map((i) => ({
      id: i.id,
      name: i.name,
      family: i.family,
      libraryId: i.libraryId,
      libraryName: libName.get(i.libraryId) ?? "",
      pitchHz: i.pitchHz ?? null,
      sampleCount: i.articulations.reduce((s, a) => s + a.layers.reduce((t, l) => t + l.sampleIds.length, 0), 0),
      articulations: [...new Set(i.articulations.filter((a) => a.layers.some((l) => l.sampleIds.length)).map((a) => a.articulation))],
    }))
    .sort((a, b) => a.family.localeCompare(b.family) || a.libraryName.localeCompare(b.libraryName) || a.name.localeCompare(b.name));
}
