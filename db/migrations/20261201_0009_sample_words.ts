// Words of each sample's path (lib/catalogue/path-words.ts), for the samples table's search: (library, word,
// sample) is the primary key, so "words starting with rr2 in this library" is one index range, counted without
// reading a sample row; the second index, (sample_id, word), answers "does this sample have a word starting
// with ..." in one dive.
// Words are binary (utf8mb4_bin): they are folded in code, and a binary prefix comparison is what makes
// LIKE 'rr2%' a range. The ids are ASCII and binary too: comparing 36-character ids under utf8mb4_unicode_ci on
// every index entry made counting a range much slower (bench/RESULTS.md, "Measurements behind design choices").
// A foreign key must have its parent's collation, so this table has none: its rows are deleted with their sample or library by the code that deletes those
// (lib/server/catalogue/words.ts deleteWords*), and the worker's maintenance removes any left without a sample.
import type { Knex } from "knex";
import { pathWords } from "../../lib/catalogue/path-words";

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`CREATE TABLE sample_words (
    library_id CHAR(36) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
    word VARCHAR(40) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL,
    sample_id CHAR(36) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
    PRIMARY KEY (library_id, word, sample_id),
    KEY sample_words_sample_idx (sample_id, word)
  ) ENGINE=InnoDB`);
  // samples recorded before this migration get their words now
  let after = "";
  for (;;) {
    const rows: { id: string; library_id: string; rel_path: string }[] = await knex("samples").where("id", ">", after).orderBy("id").limit(2000).select("id", "library_id", "rel_path");
    if (!rows.length) break;
    const words = rows.flatMap((r) => pathWords(r.rel_path).map((word) => ({ library_id: r.library_id, word, sample_id: r.id })));
    for (let i = 0; i < words.length; i += 5000) await knex("sample_words").insert(words.slice(i, i + 5000));
    after = rows[rows.length - 1]!.id;
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("sample_words");
}
