// Index for "when did a measured sample of this library last change" (the library progress asks it every
// 1.5 s while a library is being catalogued).
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.index(["library_id", "state", "updated_at"], "samples_change_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.dropIndex(["library_id", "state", "updated_at"], "samples_change_idx");
  });
}
