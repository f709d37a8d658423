import "server-only";
// Cataloguing of a library: every measured sample (state `measured` or `catalogued`) + its confirmed labels + the
// studio's label model through lib/catalogue's catalogueSamples(); then, in one transaction, the per-sample labels,
// layers and round robins, the instruments with their pitch (upserted by key so ids stay stable; gone ones
// deleted), the layer groups and the health, and the samples it placed become `catalogued`. Nothing is computed
// here that the command line would compute otherwise.
import { loadStudioStrokes } from "../strokes";
import { isKnownStroke } from "@/lib/catalogue/strokes";
import { buildLabelModel, catalogueSamples, featureVector, isArticulation, isFamily, MIC_POSITIONS, type CatalogueSampleInput, type LabelModel, type MicPosition } from "@/lib/catalogue";
import type { Measurement } from "@/lib/audio";
import { DLS, type VelocityCurve } from "@/lib/catalogue/velocity";
import { db } from "../db";
import { newId } from "../ids";
import { noteCataloguingDuration } from "./queue";
import { jsonColumn } from "../json-column";
import { MEASURED_STATES } from "@/lib/validation/library";

const isMic = (s: unknown): s is MicPosition => typeof s === "string" && (MIC_POSITIONS as readonly string[]).includes(s);

/** The studio's nearest-neighbour model from the samples members labelled (family_source = person). */
export async function studioLabelModel(studioId: string): Promise<LabelModel | undefined> {
  const rows = await db()("samples").where({ studio_id: studioId, family_source: "person" }).whereIn("state", MEASURED_STATES).whereNotNull("measurement").orderBy("confirmed_at", "desc").limit(5000).select("measurement", "family", "articulation");
  const examples = rows
    .filter((r) => isFamily(r.family) && isArticulation(r.articulation))
    .map((r) => ({ features: featureVector(jsonColumn<Measurement>(r.measurement)), family: r.family, articulation: r.articulation }));
  return examples.length ? buildLabelModel(examples) : undefined;
}

export interface CataloguingOutcome { samples: number; instruments: number; groups: number; findings: number }

export async function catalogueLibrary({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<CataloguingOutcome | null> {
  const [labelModel, strokes] = await Promise.all([studioLabelModel(studioId), loadStudioStrokes(studioId)]);
  return db().transaction(async (trx) => {
    const lib = await trx("libraries").where({ id: libraryId, studio_id: studioId }).forUpdate().first("id", "velocity_curve");
    if (!lib) return null;
    // The catalogue reflects the samples as read now: health.computed_at is this moment (database clock), so a
    // sample measured or relabelled after it (updated_at later) shows the library as still being catalogued.
    const [[{ t: readAt }]] = (await trx.raw("SELECT NOW(3) AS t")) as unknown as [[{ t: Date }]];
    const rows = await trx("samples")
      .where({ library_id: libraryId, studio_id: studioId })
      .whereIn("state", MEASURED_STATES)
      .select("id", "state", "rel_path", "file_name", "sha256", "size_bytes", "storage_key", "measurement", "confirmed_family", "confirmed_articulation", "confirmed_mic", "confirmed_instrument_key");
    const inputs: CatalogueSampleInput[] = rows.map((r) => {
      const confirmed: CatalogueSampleInput["confirmed"] = {};
      if (r.confirmed_family && isFamily(r.confirmed_family)) confirmed.family = r.confirmed_family;
      if (r.confirmed_articulation && isKnownStroke(r.confirmed_articulation, strokes)) confirmed.articulation = r.confirmed_articulation;
      if (r.confirmed_mic === "-") confirmed.mic = null;
      else if (isMic(r.confirmed_mic)) confirmed.mic = r.confirmed_mic;
      if (r.confirmed_instrument_key) confirmed.instrumentKey = r.confirmed_instrument_key;
      return { id: r.id, path: r.rel_path, sha256: r.sha256, measurement: jsonColumn<Measurement>(r.measurement), confirmed };
    });
    const curve: VelocityCurve = lib.velocity_curve === "dannenberg" ? { kind: "dannenberg" } : DLS;
    const cat = catalogueSamples(inputs, { labelModel, curve, strokes });
    const byId = new Map(rows.map((r) => [r.id as string, r]));

    // per-sample columns, in bulk (INSERT ... ON DUPLICATE KEY UPDATE on the primary key)
    const cols = ["path_key", "family", "family_source", "articulation", "articulation_source", "confidence", "mic", "instrument_key", "layer_index", "layer_count", "round_robin", "velocity_low", "velocity_high", "conflict", "reasons", "sound"];
    const upd = cat.samples.map((e) => {
      const r = byId.get(e.id)!;
      return {
        id: e.id, studio_id: studioId, library_id: libraryId, rel_path: r.rel_path, path_key: String(r.rel_path).slice(0, 500), file_name: r.file_name, sha256: r.sha256, size_bytes: r.size_bytes, storage_key: r.storage_key,
        family: e.family, family_source: e.familySource, articulation: e.articulation, articulation_source: e.articulationSource,
        confidence: e.confidence, mic: e.mic, instrument_key: e.instrumentKey, layer_index: e.layerIndex, layer_count: e.layerCount || null,
        round_robin: e.roundRobin, velocity_low: e.velocityLow, velocity_high: e.velocityHigh, conflict: e.conflict, reasons: JSON.stringify(e.reasons), sound: JSON.stringify(e.sound),
      };
    });
    for (let i = 0; i < upd.length; i += 500) await trx("samples").insert(upd.slice(i, i + 500)).onConflict("id").merge(cols);

    // instruments: stable ids per key; a member's name is kept
    const existing = await trx("instruments").where({ library_id: libraryId }).select("id", "key", "name_source");
    const exByKey = new Map(existing.map((x) => [x.key as string, x]));
    for (const inst of cat.instruments) {
      const ex = exByKey.get(inst.key);
      // the instrument's pitch comes from lib/catalogue (instrument-pitch.ts), as the command line's does
      const row = { family: inst.family, sample_count: inst.sampleIds.length, pitch_hz: inst.pitchHz, updated_at: trx.fn.now(3) };
      if (ex) await trx("instruments").where({ id: ex.id }).update(ex.name_source === "person" ? row : { ...row, name: inst.displayName.slice(0, 160) });
      else await trx("instruments").insert({ id: newId(), studio_id: studioId, library_id: libraryId, key: inst.key, name: inst.displayName.slice(0, 160), ...row });
    }
    const keep = new Set(cat.instruments.map((i) => i.key));
    const gone = existing.filter((x) => !keep.has(x.key)).map((x) => x.id);
    if (gone.length) await trx("instruments").whereIn("id", gone).delete();

    await trx("layer_groups").where({ library_id: libraryId }).delete();
    const groups = cat.groups.map((g) => ({
      studio_id: studioId, library_id: libraryId, group_key: g.key.slice(0, 255), instrument_key: g.instrumentKey, articulation: g.articulation, mic: g.mic,
      label: g.label.slice(0, 255), count_from: g.countFrom, criterion: g.criterion, layers: JSON.stringify(g.layers),
    }));
    for (let i = 0; i < groups.length; i += 200) await trx("layer_groups").insert(groups.slice(i, i + 200));

    const health = { library_id: libraryId, studio_id: studioId, findings: JSON.stringify(cat.health), curve: cat.curve.kind, sample_count: inputs.length, computed_at: readAt };
    await trx("library_health").insert(health).onConflict("library_id").merge(["findings", "curve", "sample_count", "computed_at"]);

    // every sample read now has its instrument and layer: `measured` becomes `catalogued` (last, so the state
    // counters of migration 0008 are held only briefly; updated_at stays, it dates the sample's own changes)
    const placed = cat.samples.filter((e) => byId.get(e.id)!.state === "measured").map((e) => e.id);
    for (let i = 0; i < placed.length; i += 1000) await trx("samples").whereIn("id", placed.slice(i, i + 1000)).where({ state: "measured" }).update({ state: "catalogued" });
    return { samples: inputs.length, instruments: cat.instruments.length, groups: cat.groups.length, findings: cat.health.length };
  });
}

/**
 * The cataloguing job (workers/main.ts): catalogues the library and notes how long it took, which sets the
 * window its next cataloguing requests share (lib/server/jobs.ts cataloguingWindowMs).
 */
export async function runCataloguingJob(data: { studioId: string; libraryId: string }): Promise<CataloguingOutcome | null> {
  const t0 = performance.now();
  const out = await catalogueLibrary(data);
  noteCataloguingDuration(data.libraryId, performance.now() - t0);
  return out;
}
