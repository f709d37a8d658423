import "server-only";
// A studio's catalogue as the auditor reads it: the `instruments` rows of every library of the studio, with
// their articulations from `layer_groups` (linked by library id + instrument key). The cataloguing job fills both
// tables from lib/catalogue (pitch included); until it has run, a studio simply has no instruments (audits then
// report empty slots / silence). This module only reads the rows: they go through the same converter as the
// command line's catalogues (lib/audit/catalogue-input.ts readCatalogue), so layers are read, clamped and
// reported one way everywhere.
import type { Knex } from "knex";
import { db } from "../db";
import { jsonColumnOrNull } from "../json-column";
import { readCatalogue } from "@/lib/audit/catalogue-input";
import { loadStudioStrokes } from "../strokes";
import type { StrokeList } from "@/lib/catalogue/strokes";
import type { InstrumentChoice } from "@/lib/api-types/kits";
import type { StudioCatalogueInstrument } from "@/lib/api-types/audits";

/**
 * The studio's catalogue for lib/audit (every library, or only the given instrument ids), with what the
 * converter could not read (rows with a family or articulation Kitwright does not know are left out and named).
 */
export async function readStudioCatalogue(
  { studioId, instrumentIds, strokes: given }: { studioId: string; instrumentIds?: readonly string[]; strokes?: StrokeList },
  k: Knex = db(),
): Promise<{ instruments: StudioCatalogueInstrument[]; problems: string[] }> {
  if (instrumentIds && instrumentIds.length === 0) return { instruments: [], problems: [] };
  const iq = k("instruments").where({ studio_id: studioId }).orderBy([{ column: "library_id" }, { column: "name" }]).select("id", "library_id", "key", "name", "family", "pitch_hz");
  if (instrumentIds) iq.whereIn("id", [...instrumentIds]);
  const insts = await iq;
  if (!insts.length) return { instruments: [], problems: [] };
  const libs = [...new Set(insts.map((r) => r.library_id as string))];
  const groups = await k("layer_groups").where({ studio_id: studioId }).whereIn("library_id", libs).orderBy("id").select("library_id", "instrument_key", "articulation", "mic", "layers");
  const idByKey = new Map(insts.map((r) => [`${r.library_id}\u0000${r.key}`, r.id as string]));
  const strokes = given ?? (await loadStudioStrokes(studioId, k));
  const reading = readCatalogue({
    instruments: insts.map((r) => ({ id: r.id, name: r.name, family: r.family, pitchHz: r.pitch_hz === null || r.pitch_hz === undefined ? null : Number(r.pitch_hz) })),
    // groups of instruments not asked for are not read; layers that are not JSON are reported by the
    // converter as "no layers list"
    groups: groups.flatMap((g) => {
      const instrumentId = idByKey.get(`${g.library_id}\u0000${g.instrument_key}`);
      return instrumentId ? [{ instrumentId, articulation: g.articulation, mic: g.mic ?? null, layers: jsonColumnOrNull(g.layers) }] : [];
    }),
  }, strokes);
  const libraryOf = new Map(insts.map((r) => [r.id as string, r.library_id as string]));
  return { instruments: reading.instruments.map((i) => ({ ...i, libraryId: libraryOf.get(i.id)! })), problems: reading.problems };
}

/** The studio's catalogue for lib/audit; what could not be read is logged (and left out). */
export async function loadStudioCatalogue(
  { studioId, instrumentIds, strokes }: { studioId: string; instrumentIds?: readonly string[]; strokes?: StrokeList },
  k: Knex = db(),
): Promise<StudioCatalogueInstrument[]> {
  const { instruments, problems } = await readStudioCatalogue({ studioId, instrumentIds, strokes }, k);
  for (const p of problems) console.warn(`[catalogue] studio ${studioId}: ${p}`);
  return instruments;
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
