import "server-only";
// Samples of a library: the paged browser (server-side sorting, filtering, paging), one sample's detail,
// bulk relabel and confirm (labels become the member's: source "person"), and the stored file for listening.
import type { Knex } from "knex";
import { db } from "../db";
import { logActivity } from "../activity";
import { AppError, notFound } from "../errors";
import { assertLibrary, countsFor } from "./libraries";
import { enqueueRegroup } from "./queue";
import type { SampleSort, SamplesQuery } from "@/lib/validation/library";

export interface SampleRow {
  id: string;
  path: string;
  fileName: string;
  state: "queued" | "measuring" | "catalogued" | "rejected";
  rejectCode: string | null;
  rejectReason: string | null;
  family: string | null;
  familySource: string | null;
  articulation: string | null;
  articulationSource: string | null;
  confidence: number | null;
  mic: string | null;
  instrumentKey: string | null;
  instrumentName: string | null;
  layerIndex: number | null;
  layerCount: number | null;
  roundRobin: number | null;
  velocityLow: number | null;
  velocityHigh: number | null;
  strikeLufs: number | null;
  truePeakDbtp: number | null;
  durationSec: number | null;
  sampleRate: number | null;
  bits: number | null;
  channels: number | null;
  centroidHz: number | null;
  decaySec: number | null;
  conflict: string | null;
  confirmed: boolean;
  sizeBytes: number;
}

const SORT_COLUMN: Record<SampleSort, string> = {
  name: "s.file_name",
  path: "s.path_key",
  instrument: "s.instrument_key",
  articulation: "s.articulation",
  family: "s.family",
  layer: "s.layer_index",
  roundRobin: "s.round_robin",
  mic: "s.mic",
  strike: "s.strike_lufs",
  truePeak: "s.true_peak_dbtp",
  duration: "s.duration_sec",
  confidence: "s.confidence",
  state: "s.state",
  added: "s.created_at",
};

const num = (x: unknown) => (x === null || x === undefined ? null : Number(x));

function toRow(r: Record<string, any>): SampleRow {
  return {
    id: r.id, path: r.rel_path, fileName: r.file_name, state: r.state, rejectCode: r.reject_code, rejectReason: r.reject_reason,
    family: r.family, familySource: r.family_source, articulation: r.articulation, articulationSource: r.articulation_source,
    confidence: num(r.confidence), mic: r.mic, instrumentKey: r.instrument_key, instrumentName: r.instrument_name ?? null,
    layerIndex: num(r.layer_index), layerCount: num(r.layer_count), roundRobin: num(r.round_robin), velocityLow: num(r.velocity_low), velocityHigh: num(r.velocity_high),
    strikeLufs: num(r.strike_lufs), truePeakDbtp: num(r.true_peak_dbtp), durationSec: num(r.duration_sec), sampleRate: num(r.sample_rate), bits: num(r.bits),
    channels: num(r.channels), centroidHz: num(r.centroid_hz), decaySec: num(r.decay_sec), conflict: r.conflict,
    confirmed: !!(r.confirmed_family || r.confirmed_articulation || r.confirmed_mic || r.confirmed_instrument_key), sizeBytes: Number(r.size_bytes),
  };
}

const LIST_COLS = [
  "s.id", "s.rel_path", "s.file_name", "s.state", "s.reject_code", "s.reject_reason", "s.family", "s.family_source", "s.articulation", "s.articulation_source",
  "s.confidence", "s.mic", "s.instrument_key", "s.layer_index", "s.layer_count", "s.round_robin", "s.velocity_low", "s.velocity_high", "s.strike_lufs",
  "s.true_peak_dbtp", "s.duration_sec", "s.sample_rate", "s.bits", "s.channels", "s.centroid_hz", "s.decay_sec", "s.conflict", "s.confirmed_family",
  "s.confirmed_articulation", "s.confirmed_mic", "s.confirmed_instrument_key", "s.size_bytes", "i.name as instrument_name",
];

function filtered(k: Knex, studioId: string, libraryId: string, q: Omit<SamplesQuery, "page" | "pageSize" | "sort" | "dir">) {
  const b = k("samples as s").where({ "s.studio_id": studioId, "s.library_id": libraryId });
  if (q.state) b.andWhere("s.state", q.state);
  if (q.family) b.andWhere("s.family", q.family);
  if (q.articulation) b.andWhere("s.articulation", q.articulation);
  if (q.instrument) b.andWhere("s.instrument_key", q.instrument);
  if (q.flag === "conflict") b.andWhere("s.conflict", "strong");
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    // path_key (the path's first 500 characters) is in an index: the search reads the index, not the rows
    b.andWhere("s.path_key", "like", like);
  }
  return b;
}

export async function listSamples({ studioId, libraryId, query }: { studioId: string; libraryId: string; query: SamplesQuery }): Promise<{ rows: SampleRow[]; total: number; page: number; pageSize: number }> {
  await assertLibrary({ studioId, libraryId });
  const k = db();
  // Without filters (or by state alone) the total comes from the library's counters (kept by triggers);
  // otherwise it is counted. The count and the page are independent: they run side by side.
  const onlyState = !query.family && !query.articulation && !query.instrument && !query.flag && !query.q;
  const total$ = onlyState
    ? countsFor(studioId, [libraryId]).then((m) => {
        const c = m.get(libraryId)!;
        return { n: query.state ? c[query.state] : c.total };
      })
    : filtered(k, studioId, libraryId, query).count({ n: "*" }).first();
  const [totalRow, rows] = await Promise.all([
    total$,
    filtered(k, studioId, libraryId, query)
      .leftJoin("instruments as i", function () {
        this.on("i.library_id", "s.library_id").andOn("i.key", "s.instrument_key");
      })
      // one direction for the column and the id tie-breaker: the (library_id, column) index, whose entries end in
      // the primary key, is then read in order and no sort is needed
      .orderBy(SORT_COLUMN[query.sort], query.dir)
      .orderBy("s.id", query.dir)
      .limit(query.pageSize)
      .offset((query.page - 1) * query.pageSize)
      .select(LIST_COLS),
  ]);
  const total = Number(totalRow?.n ?? 0);
  return { rows: rows.map(toRow), total, page: query.page, pageSize: query.pageSize };
}

export async function getSample({ studioId, libraryId, sampleId }: { studioId: string; libraryId: string; sampleId: string }) {
  const r = await db()("samples as s")
    .leftJoin("instruments as i", function () {
      this.on("i.library_id", "s.library_id").andOn("i.key", "s.instrument_key");
    })
    .where({ "s.studio_id": studioId, "s.library_id": libraryId, "s.id": sampleId })
    .first([...LIST_COLS, "s.peaks", "s.reasons", "s.measurement"]);
  if (!r) throw notFound("The sample");
  const parse = (v: unknown) => (v == null ? null : typeof v === "string" ? JSON.parse(v) : v);
  const m = parse(r.measurement) as Record<string, any> | null;
  return {
    ...toRow(r),
    peaks: parse(r.peaks) as { min: number[]; max: number[] } | null,
    reasons: (parse(r.reasons) as string[] | null) ?? [],
    measurement: m ? { onsetMs: m.onsetMs, attackMs: m.attackMs, tail: m.tail, samplePeakDbfs: m.samplePeakDbfs, clippedRuns: m.clippedRuns, dcOffset: m.dcOffset, noiseFloorDbfs: m.noiseFloorDbfs, warnings: m.warnings } : null,
  };
}

/** Where the stored file of a sample is (for the audio route). */
export async function sampleFile({ studioId, libraryId, sampleId }: { studioId: string; libraryId: string; sampleId: string }): Promise<{ key: string; size: number; fileName: string }> {
  const r = await db()("samples").where({ studio_id: studioId, library_id: libraryId, id: sampleId }).first("storage_key", "size_bytes", "file_name");
  if (!r) throw notFound("The sample");
  return { key: r.storage_key, size: Number(r.size_bytes), fileName: r.file_name };
}

async function ownedIds(trx: Knex.Transaction, studioId: string, libraryId: string, ids: string[]): Promise<string[]> {
  const rows = await trx("samples").where({ studio_id: studioId, library_id: libraryId }).whereIn("id", ids).select("id");
  if (rows.length !== new Set(ids).size) throw notFound("Some of the selected samples");
  return rows.map((r) => r.id);
}

export interface RelabelInput { sampleIds: string[]; family?: string; articulation?: string; mic?: string | null; instrumentKey?: string }

/** Sets labels on many samples at once; they become confirmed (source "person"), are logged, and trigger a regroup. */
export async function relabelSamples({ studioId, libraryId, actorId, input }: { studioId: string; libraryId: string; actorId: string; input: RelabelInput }): Promise<{ updated: number }> {
  await assertLibrary({ studioId, libraryId });
  if (input.instrumentKey) {
    const inst = await db()("instruments").where({ studio_id: studioId, library_id: libraryId, key: input.instrumentKey }).first("id");
    if (!inst) throw new AppError("invalid-input", "That instrument is not in this library.");
  }
  const updated = await db().transaction(async (trx) => {
    const ids = await ownedIds(trx, studioId, libraryId, input.sampleIds);
    const patch: Record<string, unknown> = { confirmed_by: actorId, confirmed_at: trx.fn.now(3), updated_at: trx.fn.now(3) };
    if (input.family !== undefined) Object.assign(patch, { confirmed_family: input.family, family: input.family, family_source: "person" });
    if (input.articulation !== undefined) Object.assign(patch, { confirmed_articulation: input.articulation, articulation: input.articulation, articulation_source: "person" });
    if (input.mic !== undefined) Object.assign(patch, { confirmed_mic: input.mic ?? "-", mic: input.mic });
    if (input.instrumentKey !== undefined) Object.assign(patch, { confirmed_instrument_key: input.instrumentKey, instrument_key: input.instrumentKey });
    for (let i = 0; i < ids.length; i += 1000) await trx("samples").whereIn("id", ids.slice(i, i + 1000)).update(patch);
    const set = Object.fromEntries(Object.entries({ family: input.family, articulation: input.articulation, mic: input.mic, instrumentKey: input.instrumentKey }).filter(([, v]) => v !== undefined));
    await logActivity(trx, { studioId, actorId, action: "samples.relabelled", subjectType: "library", subjectId: libraryId, details: { count: ids.length, set, sampleIds: ids.slice(0, 50) } });
    return ids.length;
  });
  await enqueueRegroup({ studioId, libraryId });
  return { updated };
}

/** Confirms the current family and articulation (and mic, instrument) of catalogued samples as they are. */
export async function confirmSamples({ studioId, libraryId, actorId, sampleIds }: { studioId: string; libraryId: string; actorId: string; sampleIds: string[] }): Promise<{ confirmed: number; skipped: number }> {
  await assertLibrary({ studioId, libraryId });
  const confirmed = await db().transaction(async (trx) => {
    await ownedIds(trx, studioId, libraryId, sampleIds);
    const rows = await trx("samples").where({ studio_id: studioId, library_id: libraryId, state: "catalogued" }).whereIn("id", sampleIds).whereNotNull("family").select("id");
    const ids = rows.map((r) => r.id as string);
    for (let i = 0; i < ids.length; i += 1000) {
      await trx("samples")
        .whereIn("id", ids.slice(i, i + 1000))
        .update({
          confirmed_family: trx.ref("family"),
          confirmed_articulation: trx.ref("articulation"),
          confirmed_mic: trx.raw("COALESCE(mic, '-')"),
          confirmed_instrument_key: trx.ref("instrument_key"),
          family_source: "person",
          articulation_source: "person",
          confidence: 1,
          confirmed_by: actorId,
          confirmed_at: trx.fn.now(3),
          updated_at: trx.fn.now(3),
        });
    }
    await logActivity(trx, { studioId, actorId, action: "samples.confirmed", subjectType: "library", subjectId: libraryId, details: { count: ids.length, sampleIds: ids.slice(0, 50) } });
    return ids.length;
  });
  await enqueueRegroup({ studioId, libraryId });
  return { confirmed, skipped: sampleIds.length - confirmed };
}
