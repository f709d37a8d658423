import "server-only";
// The search index of sample paths (table sample_words, migration 0009): rows written and deleted with their
// sample, and the queries that read it. The words themselves are cut by lib/catalogue/path-words.ts.
import type { Knex } from "knex";
import { foldText, pathWords, searchRuns } from "@/lib/catalogue/path-words";

export interface WordRow { library_id: string; word: string; sample_id: string }

export function wordRows(libraryId: string, sampleId: string, relPath: string): WordRow[] {
  return pathWords(relPath).map((word) => ({ library_id: libraryId, word, sample_id: sampleId }));
}

/** The folded path kept for the "contains" fallback (migration 0010). */
export const pathFold = (relPath: string) => foldText(relPath).slice(0, 500);

/**
 * Inserts sample rows with their folded path and their path words, in one transaction (a sample is never
 * recorded unsearchable).
 */
export async function insertSamplesWithWords(k: Knex, rows: ({ id: string; library_id: string; rel_path: string } & Record<string, unknown>)[]): Promise<void> {
  if (!rows.length) return;
  const words = rows.flatMap((r) => wordRows(r.library_id, r.id, r.rel_path));
  const withFold = rows.map((r) => ({ ...r, path_fold: pathFold(r.rel_path) }));
  await k.transaction(async (trx) => {
    for (let i = 0; i < withFold.length; i += 1000) await trx("samples").insert(withFold.slice(i, i + 1000));
    for (let i = 0; i < words.length; i += 5000) await trx("sample_words").insert(words.slice(i, i + 5000));
  });
}

/** The table has no foreign keys (see the migration): whoever deletes samples deletes their words. */
export async function deleteWordsOfSamples(k: Knex | Knex.Transaction, libraryId: string, sampleIds: string[]): Promise<void> {
  for (let i = 0; i < sampleIds.length; i += 1000) await k("sample_words").where("library_id", libraryId).whereIn("sample_id", sampleIds.slice(i, i + 1000)).delete();
}

export async function deleteWordsOfLibrary(k: Knex | Knex.Transaction, libraryId: string): Promise<void> {
  await k("sample_words").where("library_id", libraryId).delete();
}

/**
 * Removes the words of libraries that no longer exist (a studio deleted with its libraries by a foreign-key
 * cascade, which runs no code of ours). Reads one index entry per library (a loose scan of the primary key).
 */
export async function sweepOrphanWords(k: Knex): Promise<number> {
  const libs = ((await k("sample_words").distinct("library_id")) as { library_id: string }[]).map((r) => r.library_id);
  if (!libs.length) return 0;
  const live = new Set(((await k("libraries").whereIn("id", libs).select("id")) as { id: string }[]).map((r) => r.id));
  let n = 0;
  for (const id of libs.filter((l) => !live.has(l))) n += await k("sample_words").where("library_id", id).delete();
  return n;
}

/** Whether a term can use the word index (it has letters or digits). */
export const searchableByWords = (term: string) => searchRuns(term).length > 0;

/**
 * How a words search reads the index: the run whose word range is smallest drives, every other run is checked
 * per driving row (one dive into the (sample_id, word) index). `distinct` is false when the driving range
 * holds one word only and no other run is checked: each sample then appears once and nothing is de-duplicated.
 */
export interface WordPlan { libraryId: string; driver: string; others: string[]; distinct: boolean }

const PROBE = 2000; // range sizes are compared up to this many entries
// the per-sample check reads the (sample_id, word) index; left alone, the planner may pick the primary key's
// (library, word) range instead, which reads every match once per row
const BY_SAMPLE = "sample_words AS ?? FORCE INDEX (sample_words_sample_idx)";

export async function planWords(k: Knex, libraryId: string, term: string): Promise<WordPlan> {
  const runs = searchRuns(term);
  const range = (r: string) => k("sample_words").where("library_id", libraryId).andWhere("word", "like", `${r}%`);
  let driver = runs[0]!;
  if (runs.length > 1) {
    const sizes = await Promise.all(runs.map(async (r) => Number((await k.from(range(r).select(k.raw("1")).limit(PROBE).as("x")).count({ n: "*" }).first())?.n ?? 0)));
    // the smallest range drives; between equals, the longer run (more likely the rarer word)
    driver = runs.map((r, i) => ({ r, n: sizes[i]! })).sort((a, b) => a.n - b.n || b.r.length - a.r.length)[0]!.r;
  }
  // first and last word of the driving range: two index dives
  const [first, last] = await Promise.all([range(driver).orderBy("word", "asc").first("word"), range(driver).orderBy("word", "desc").first("word")]);
  const others = runs.filter((r) => r !== driver);
  return { libraryId, driver, others, distinct: others.length > 0 || first?.word !== last?.word };
}

/** Rows of the driving range whose sample also has every other run (alias w; one or more rows per sample). */
function driving(k: Knex, plan: WordPlan): Knex.QueryBuilder {
  const b = k("sample_words as w").where("w.library_id", plan.libraryId).andWhere("w.word", "like", `${plan.driver}%`);
  plan.others.forEach((r, i) => {
    const a = `o${i}`;
    b.join(k.raw(BY_SAMPLE, [a]), function () {
      this.on(`${a}.sample_id`, "w.sample_id").andOn(`${a}.library_id`, "w.library_id").andOn(k.raw(`?? LIKE ?`, [`${a}.word`, `${r}%`]));
    });
  });
  return b;
}

/** The matching samples, one row each (column sample_id), at most `limit` when given. */
export function wordMatches(k: Knex, plan: WordPlan, limit?: number): Knex.QueryBuilder {
  const b = driving(k, plan).select("w.sample_id as sample_id");
  if (plan.distinct) b.distinct();
  if (limit) b.limit(limit);
  return b;
}

/** How many samples match (reads the index only). */
export function countWordMatches(k: Knex, plan: WordPlan): Knex.QueryBuilder {
  return plan.distinct ? driving(k, plan).countDistinct({ n: "w.sample_id" }) : driving(k, plan).count({ n: "*" });
}

/**
 * Adds "has a word starting with each run" as a per-row check on samples `s` (for walking a sort index): one
 * dive per run and row. The id is converted to the index's ASCII binary form so the dive can use it.
 */
export function whereWordsExist(k: Knex, b: Knex.QueryBuilder, libraryId: string, term: string): void {
  for (const r of searchRuns(term))
    b.whereExists(
      k.from(k.raw(BY_SAMPLE, ["w"])).select(k.raw("1")).whereRaw("w.sample_id = CONVERT(s.id USING ascii) COLLATE ascii_bin").andWhere("w.library_id", libraryId).andWhere("w.word", "like", `${r}%`),
    );
}

/**
 * Runs a page query that walks an index with per-row checks, stopping once MariaDB has examined `examined` rows
 * (LIMIT ... ROWS EXAMINED: what was found by then is returned, so a walk that does not fill its page within that
 * comes back short). The EXISTS checks stay per-row checks: MariaDB would otherwise turn EXISTS into IN and the IN
 * into a join over every match (exists_to_in, semijoin), which reads whole ranges to fill one page.
 */
export async function rowsCapped<T = Record<string, unknown>>(k: Knex, b: Knex.QueryBuilder, examined: number): Promise<T[]> {
  const { sql, bindings } = b.toSQL();
  if (!/ limit \?( offset \?)?$/i.test(sql)) throw new Error("rowsCapped needs a query that ends in its LIMIT");
  const [rows] = (await k.raw(`SET STATEMENT optimizer_switch='exists_to_in=off,semijoin=off' FOR ${sql} ROWS EXAMINED ${Math.max(1, Math.floor(examined))}`, bindings as Knex.RawBinding[])) as unknown as [T[]];
  return rows;
}

const containsPattern = (term: string) => `%${foldText(term).replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/**
 * "The path contains the term", both folded (case and accents): reads every folded path of the library, byte by
 * byte (the fallback).
 */
export function wherePathContains(b: Knex.QueryBuilder, term: string): void {
  b.andWhere("s.path_fold", "like", containsPattern(term));
}

/** The samples whose folded path contains the term (column id), read from the folded-path index alone. */
export function pathContainsMatches(k: Knex, studioId: string, libraryId: string, term: string): Knex.Raw {
  return k.raw("(SELECT id FROM samples FORCE INDEX (samples_library_path_fold_idx) WHERE studio_id = ? AND library_id = ? AND path_fold LIKE ?) AS m", [studioId, libraryId, containsPattern(term)]);
}
