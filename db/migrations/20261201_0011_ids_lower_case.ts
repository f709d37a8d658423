// Ids are generated in lower case (crypto.randomUUID) and every route now reads the ids of its URL in lower
// case (lib/server/route.ts normaliseParams). Before that, a request through an upper-case spelling of an id
// could store that spelling in a reference column (an upload: samples.studio_id and library_id, the library's
// counter rows, its search words, the activity row). The columns compare without regard to case, except
// sample_words' binary ids, so such rows were found by some queries and missed by others. This rewrites the
// UUIDs held in every `*_id` text column of the schema in lower case where their bytes differ. `id` columns are
// left alone: they were always generated, never taken from a URL.
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  const [cols] = (await knex.raw(
    `SELECT TABLE_NAME AS t, COLUMN_NAME AS c FROM information_schema.COLUMNS
     WHERE TABLE_SCHEMA = DATABASE() AND COLUMN_NAME LIKE '%\\_id' AND DATA_TYPE IN ('char', 'varchar') AND CHARACTER_MAXIMUM_LENGTH >= 36
       AND TABLE_NAME NOT LIKE 'knex\\_%'`,
  )) as [{ t: string; c: string }[]];
  for (const { t, c } of cols) {
    await knex.raw(`UPDATE ?? SET ?? = LOWER(??) WHERE CAST(?? AS BINARY) <> CAST(LOWER(??) AS BINARY) AND ?? REGEXP '^[0-9A-Fa-f]{8}-[0-9A-Fa-f]{4}-[0-9A-Fa-f]{4}-[0-9A-Fa-f]{4}-[0-9A-Fa-f]{12}$'`, [t, c, c, c, c, c]);
  }
}

export async function down(): Promise<void> {
  // nothing to undo: lower case is the only spelling the code writes
}
