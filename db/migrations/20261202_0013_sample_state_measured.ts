// Sample state `measured`: the measurement is stored and the sample waits for the cataloguing, which places it
// in its instrument and layer and only then makes it `catalogued`. Before this, a sample was `catalogued` as soon
// as it was measured. Existing rows: a `catalogued` sample that no cataloguing has placed yet (no instrument key:
// every placed sample has one) becomes `measured`. The per-state counters of migration 0008 follow by their
// update trigger. The new value sits in the ENUM in the order a sample goes through (the samples browser sorts by
// it), so MariaDB copies the table once. Down: `measured` becomes `catalogued` again, as it was before.
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`ALTER TABLE samples MODIFY state ENUM('queued', 'measuring', 'measured', 'catalogued', 'rejected') NOT NULL DEFAULT 'queued'`);
  await knex.raw(`UPDATE samples SET state = 'measured' WHERE state = 'catalogued' AND instrument_key IS NULL`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`UPDATE samples SET state = 'catalogued' WHERE state = 'measured'`);
  await knex.raw(`ALTER TABLE samples MODIFY state ENUM('queued', 'measuring', 'catalogued', 'rejected') NOT NULL DEFAULT 'queued'`);
}
