// Catalogue rows for audit tests and the e2e flow: a library, instruments and layer groups written the way
// the cataloguing job writes them (layer_groups.layers = [{ index, velocityLow, velocityHigh, meanStrikeLufs, sampleIds }]).
import crypto from "node:crypto";
import type { Knex } from "knex";

export async function makeLibrary(k: Knex, studioId: string, name = `Library ${crypto.randomBytes(3).toString("hex")}`): Promise<string> {
  const id = crypto.randomUUID();
  await k("libraries").insert({ id, studio_id: studioId, name });
  return id;
}

/** `layers` velocity layers spread evenly over 1-127 (the last one ends at 127), `rr` round robins each. */
export function evenLayers(layers: number, rr: number) {
  const out = [];
  for (let i = 0; i < layers; i++) {
    const lo = Math.floor((i * 127) / layers) + 1;
    const hi = Math.floor(((i + 1) * 127) / layers);
    out.push({ index: i, velocityLow: lo, velocityHigh: hi, meanStrikeLufs: -40 + i * 6, sampleIds: Array.from({ length: rr }, () => crypto.randomUUID()) });
  }
  return out;
}

export interface InstrumentSpec {
  key: string;
  name: string;
  family: string;
  pitchHz?: number | null;
  /** articulation -> [layers, round robins] */
  articulations: Record<string, [number, number]>;
}

export async function addInstrument(k: Knex, studioId: string, libraryId: string, spec: InstrumentSpec): Promise<string> {
  const id = crypto.randomUUID();
  let count = 0;
  for (const [articulation, [n, rr]] of Object.entries(spec.articulations)) {
    count += n * rr;
    await addLayerGroup(k, studioId, libraryId, spec.key, articulation, evenLayers(n, rr));
  }
  await k("instruments").insert({ id, studio_id: studioId, library_id: libraryId, key: spec.key, name: spec.name, family: spec.family, pitch_hz: spec.pitchHz ?? null, sample_count: count });
  return id;
}

export async function addLayerGroup(k: Knex, studioId: string, libraryId: string, instrumentKey: string, articulation: string, layers: { index: number; velocityLow: number; velocityHigh: number; meanStrikeLufs: number; sampleIds: string[] }[], mic: string | null = "close"): Promise<void> {
  await k("layer_groups").insert({
    studio_id: studioId, library_id: libraryId, group_key: `${instrumentKey}|${articulation}|${mic ?? ""}`, instrument_key: instrumentKey,
    articulation, mic, label: `${instrumentKey} ${articulation}`, count_from: "name", criterion: null, layers: JSON.stringify(layers),
  });
}

/** A small studio catalogue: snare (centre, edge), kick (centre), ride (bow only), cowbell (catalogued, nothing recorded yet), two toms. */
export async function smallCatalogue(k: Knex, studioId: string) {
  const libraryId = await makeLibrary(k, studioId, "Test room kit");
  const snare = await addInstrument(k, studioId, libraryId, { key: "snare-14", name: "Snare 14x6.5", family: "snare", articulations: { centre: [3, 2], edge: [2, 2] } });
  const kick = await addInstrument(k, studioId, libraryId, { key: "kick-22", name: "Kick 22", family: "kick", articulations: { centre: [4, 3] } });
  const ride = await addInstrument(k, studioId, libraryId, { key: "ride-20", name: "Ride 20", family: "ride", articulations: { bow: [2, 2] } });
  const cowbell = await addInstrument(k, studioId, libraryId, { key: "cowbell", name: "Cowbell", family: "cowbell", articulations: {} });
  const tomLow = await addInstrument(k, studioId, libraryId, { key: "tom-16", name: "Tom 16", family: "tom", pitchHz: 82, articulations: { centre: [2, 1] } });
  const tomHigh = await addInstrument(k, studioId, libraryId, { key: "tom-10", name: "Tom 10", family: "tom", pitchHz: 196, articulations: { centre: [2, 1] } });
  return { libraryId, snare, kick, ride, cowbell, tomLow, tomHigh };
}
