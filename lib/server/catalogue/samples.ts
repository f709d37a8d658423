import "server-only";
// Samples of a library, read-only: the paged browser (server-side sorting, filtering, paging), one sample's
// detail, and the stored file for listening. The members' label writes are in sample-labels.ts.
import type { Knex } from "knex";
import { db } from "../db";
import { jsonColumn } from "../json-column";
import { notFound } from "../errors";
import { assertLibrary, countsFor } from "./libraries";
import { countWordMatches, pathContainsMatches, planWords, rowsCapped, searchableByWords, wherePathContains, whereWordsExist, wordMatches } from "./words";
import type { SampleDetail, SampleRow, SamplesPage, SearchMode } from "@/lib/api-types/samples";

/** A words search lists up to this many matching ids at once (more are counted, and pages walk an index). */
const ID_LIST_MAX = 5000;
/** A page walk may read three times the rows it should need (evenly spread matches), at least this many. */
const WALK_ROWS_MIN = 500;
import type { SampleSort, SamplesQuery } from "@/lib/validation/library";

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

/** The library's samples narrowed by every filter but the search term. */
function filtered(k: Knex, studioId: string, libraryId: string, q: Omit<SamplesQuery, "page" | "pageSize" | "sort" | "dir">) {
  const b = k("samples as s").where({ "s.studio_id": studioId, "s.library_id": libraryId });
  if (q.state) b.andWhere("s.state", q.state);
  if (q.family) b.andWhere("s.family", q.family);
  if (q.articulation) b.andWhere("s.articulation", q.articulation);
  if (q.instrument) b.andWhere("s.instrument_key", q.instrument);
  if (q.flag === "conflict") b.andWhere("s.conflict", "strong");
  return b;
}


export async function listSamples({ studioId, libraryId, query }: { studioId: string; libraryId: string; query: SamplesQuery }): Promise<SamplesPage> {
  await assertLibrary({ studioId, libraryId });
  if (!query.q) return { ...(await pageOf(studioId, libraryId, query, "words")), page: query.page, pageSize: query.pageSize };
  let mode: SearchMode = searchableByWords(query.q) ? "words" : "contains";
  let found = await pageOf(studioId, libraryId, query, mode);
  if (found.total === 0 && mode === "words") {
    mode = "contains";
    found = await pageOf(studioId, libraryId, query, mode);
  }
  return { ...found, page: query.page, pageSize: query.pageSize, search: mode };
}

async function pageOf(studioId: string, libraryId: string, query: SamplesQuery, mode: SearchMode): Promise<{ rows: SampleRow[]; total: number }> {
  const k = db();
  const base = () => filtered(k, studioId, libraryId, query);
  // one direction for the column and the id tie-breaker: the (library_id, column) index, whose entries end in the
  // primary key, is then read in order and no sort is needed
  const ordered = (b: Knex.QueryBuilder, { offset = true } = {}) =>
    b
      .orderBy(SORT_COLUMN[query.sort], query.dir)
      .orderBy("s.id", query.dir)
      .limit(query.pageSize)
      .offset(offset ? (query.page - 1) * query.pageSize : 0);
  const page = (b: Knex.QueryBuilder, opts?: { offset?: boolean }) =>
    ordered(
      b.leftJoin("instruments as i", function () {
        this.on("i.library_id", "s.library_id").andOn("i.key", "s.instrument_key");
      }),
      opts,
    ).select(LIST_COLS);
  const otherFilters = !!(query.family || query.articulation || query.instrument || query.flag || query.state);

  if (!query.q) {
    // Without filters (or by state alone) the total comes from the library's counters (kept by triggers);
    // otherwise it is counted. The count and the page are independent: they run side by side.
    const total$ = !query.family && !query.articulation && !query.instrument && !query.flag
      ? countsFor(studioId, [libraryId]).then((m) => {
          const c = m.get(libraryId)!;
          return { n: query.state ? c[query.state] : c.total };
        })
      : base().count({ n: "*" }).first();
    const [totalRow, rows] = await Promise.all([total$, page(base())]);
    return { rows: rows.map(toRow), total: Number(totalRow?.n ?? 0) };
  }

  // A search. First how many match; then a way to walk (the sort column's index, each row checked) and a way to
  // fetch (every match, then sorted).
  const q = query.q;
  let total: number;
  let walkRows: () => Knex.QueryBuilder;
  let fetchRows: () => Knex.QueryBuilder;
  let examinedPerRow = 1;
  if (mode === "contains") {
    // the folded paths are read from their own index (the count and the fetch)
    total = Number(
      (otherFilters
        ? await base().join(pathContainsMatches(k, studioId, libraryId, q), "m.id", "s.id").count({ n: "*" }).first()
        : await k.from(pathContainsMatches(k, studioId, libraryId, q)).count({ n: "*" }).first()
      )?.n ?? 0,
    );
    walkRows = () => {
      const b = base();
      wherePathContains(b, q);
      return b;
    };
    fetchRows = () => base().join(pathContainsMatches(k, studioId, libraryId, q), "m.id", "s.id");
  } else {
    // path words: the count reads the word index only (joined to the sample rows for other filters)
    const plan = await planWords(k, libraryId, q);
    let ids: string[] | null = null;
    if (otherFilters) {
      total = Number((await base().join(wordMatches(k, plan).as("m"), "m.sample_id", "s.id").count({ n: "*" }).first())?.n ?? 0);
    } else if (!plan.distinct) {
      total = Number((await countWordMatches(k, plan).first())?.n ?? 0);
    } else {
      // a few thousand matches are listed (then counted in hand); beyond that they are counted
      ids = ((await wordMatches(k, plan, ID_LIST_MAX + 1)) as { sample_id: string }[]).map((r) => r.sample_id);
      if (ids.length > ID_LIST_MAX) ids = null;
      total = ids ? ids.length : Number((await countWordMatches(k, plan).first())?.n ?? 0);
    }
    walkRows = () => {
      const b = base();
      whereWordsExist(k, b, libraryId, q);
      return b;
    };
    const listed = ids;
    fetchRows = () => (listed ? base().whereIn("s.id", listed) : base().join(wordMatches(k, plan).as("m"), "m.sample_id", "s.id"));
    examinedPerRow = 1 + 12 * (plan.others.length + 1); // a row and the words read by each check
  }
  const expected = Math.min(query.pageSize, Math.max(0, total - (query.page - 1) * query.pageSize));
  if (!expected) return { rows: [], total };
  // Walk when the matches look many enough to fill the page soon (page end x library size / matches rows, were
  // they spread evenly); but matches often sit together (a family's folder, sorted by path), so the walk may read
  // three times that (at least WALK_ROWS_MIN) and, when it comes back short, the matches are fetched instead.
  // The planner cannot know how many words match; we do.
  const libraryTotal = (await countsFor(studioId, [libraryId])).get(libraryId)!.total;
  const walkEstimate = (query.page * query.pageSize * libraryTotal) / total;
  let rows: Record<string, unknown>[] | null = null;
  if (walkEstimate < total) {
    rows = await rowsCapped(k, page(walkRows()), Math.max(WALK_ROWS_MIN, 3 * walkEstimate) * examinedPerRow);
    if (rows.length < expected) rows = null;
  }
  // Fetch: the matches are put in order by the sort column alone, and only the page's rows are then read in full
  // (with their instrument): sorting thousands of matches with every listed column costs more (bench/RESULTS.md,
  // "Measurements behind design choices").
  const fetchPage = async () => {
    const ids = ((await ordered(fetchRows()).select("s.id")) as { id: string }[]).map((r) => r.id);
    return ids.length ? await page(base().whereIn("s.id", ids), { offset: false }) : [];
  };
  const found = rows ?? (await fetchPage());
  return { rows: found.map(toRow), total };
}

export async function getSample({ studioId, libraryId, sampleId }: { studioId: string; libraryId: string; sampleId: string }): Promise<SampleDetail> {
  const r = await db()("samples as s")
    .leftJoin("instruments as i", function () {
      this.on("i.library_id", "s.library_id").andOn("i.key", "s.instrument_key");
    })
    .where({ "s.studio_id": studioId, "s.library_id": libraryId, "s.id": sampleId })
    .first([...LIST_COLS, "s.peaks", "s.reasons", "s.measurement", "s.sound"]);
  if (!r) throw notFound("The sample");
  const m = jsonColumn(r.measurement) as Record<string, any> | null;
  return {
    ...toRow(r),
    peaks: jsonColumn(r.peaks) as { min: number[]; max: number[] } | null,
    reasons: (jsonColumn(r.reasons) as string[] | null) ?? [],
    sound: (jsonColumn(r.sound) as SampleDetail["sound"]) ?? null,
    measurement: m ? { onsetMs: m.onsetMs, attackMs: m.attackMs, tail: m.tail, samplePeakDbfs: m.samplePeakDbfs, clippedRuns: m.clippedRuns, dcOffset: m.dcOffset, noiseFloorDbfs: m.noiseFloorDbfs, warnings: m.warnings } : null,
  };
}

/** Where the stored file of a sample is (for the audio route). */
export async function sampleFile({ studioId, libraryId, sampleId }: { studioId: string; libraryId: string; sampleId: string }): Promise<{ key: string; size: number; fileName: string }> {
  const r = await db()("samples").where({ studio_id: studioId, library_id: libraryId, id: sampleId }).first("storage_key", "size_bytes", "file_name");
  if (!r) throw notFound("The sample");
  return { key: r.storage_key, size: Number(r.size_bytes), fileName: r.file_name };
}
