// Sample counts per library and state, kept exact by triggers on `samples`, so a library's totals (samples
// table, progress polling, library list) do not count 100,000 rows on every request. Rows of a deleted library
// go with it (foreign key cascade; cascaded deletes fire no triggers, so nothing is left to miscount).
// When a sample changes state the two counter rows are touched in a fixed (alphabetical) order, so concurrent
// transitions cannot deadlock on them.
import type { Knex } from "knex";

const bump = (lib: string, state: string, d: number) =>
  `INSERT INTO library_sample_counts (library_id, state, n) VALUES (${lib}, ${state}, ${d}) ON DUPLICATE KEY UPDATE n = n + (${d});`;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("library_sample_counts", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("library_id", 36).notNullable().references("libraries.id").onDelete("CASCADE");
    t.string("state", 20).notNullable();
    t.bigInteger("n").notNullable().defaultTo(0);
    t.primary(["library_id", "state"]);
  });
  await knex.raw(`INSERT INTO library_sample_counts (library_id, state, n) SELECT library_id, state, COUNT(*) FROM samples GROUP BY library_id, state`);
  await knex.raw(`CREATE TRIGGER samples_count_ins AFTER INSERT ON samples FOR EACH ROW BEGIN ${bump("NEW.library_id", "NEW.state", 1)} END`);
  await knex.raw(`CREATE TRIGGER samples_count_del AFTER DELETE ON samples FOR EACH ROW BEGIN ${bump("OLD.library_id", "OLD.state", -1)} END`);
  await knex.raw(`CREATE TRIGGER samples_count_upd AFTER UPDATE ON samples FOR EACH ROW BEGIN
    IF OLD.state <> NEW.state OR OLD.library_id <> NEW.library_id THEN
      IF CONCAT(OLD.library_id, OLD.state) < CONCAT(NEW.library_id, NEW.state) THEN
        ${bump("OLD.library_id", "OLD.state", -1)}
        ${bump("NEW.library_id", "NEW.state", 1)}
      ELSE
        ${bump("NEW.library_id", "NEW.state", 1)}
        ${bump("OLD.library_id", "OLD.state", -1)}
      END IF;
    END IF;
  END`);
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ["samples_count_ins", "samples_count_del", "samples_count_upd"]) await knex.raw(`DROP TRIGGER IF EXISTS ${t}`);
  await knex.schema.dropTableIfExists("library_sample_counts");
}
