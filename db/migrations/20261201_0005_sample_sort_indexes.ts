// Indexes for the samples browser's server-side sorting at 50,000+ samples per library: path_key, the first
// 500 characters of the path (rel_path is too long for a full index key, and the key with the primary key
// appended must stay under InnoDB's 3072 bytes or ORDER BY path_key, id cannot read it in order; a plain column
// written with the row), and one (library_id, column) index per
// sortable measure. Each sort then reads an index in order (InnoDB appends the primary key, the tie-breaker).
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.raw("ALTER TABLE samples ADD COLUMN path_key VARCHAR(500) COLLATE utf8mb4_unicode_ci NULL AFTER rel_path");
  await knex.raw("UPDATE samples SET path_key = LEFT(rel_path, 500)");
  await knex.schema.alterTable("samples", (t) => {
    t.index(["studio_id", "library_id", "path_key"], "samples_library_path_idx");
    t.index(["library_id", "true_peak_dbtp"], "samples_library_true_peak_idx");
    t.index(["library_id", "duration_sec"], "samples_library_duration_idx");
    t.index(["library_id", "confidence"], "samples_library_confidence_idx");
    t.index(["library_id", "articulation"], "samples_library_articulation_idx");
    t.index(["library_id", "layer_index"], "samples_library_layer_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    for (const i of ["samples_library_path_idx", "samples_library_true_peak_idx", "samples_library_duration_idx", "samples_library_confidence_idx", "samples_library_articulation_idx", "samples_library_layer_idx"]) t.dropIndex([], i);
  });
  await knex.raw("ALTER TABLE samples DROP COLUMN path_key");
}
