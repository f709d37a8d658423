// The shape version of each stored audit result: 1 for the audits written so far (kitwright.audit/v1: an empty
// slot was also a conflict, and each conflict took 5 points off the score), 2 from now on (kitwright.audit/v2:
// empty slots are grouped apart, the score is the share that plays). lib/server/kits/audits.ts brings a version 1
// row to version 2 the first time the studio's audits are read, recomputing its score from its stored findings.
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("audits", (t) => {
    t.smallint("result_version").notNullable().defaultTo(1);
    t.index(["studio_id", "result_version"], "audits_studio_version_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("audits", (t) => {
    t.dropIndex(["studio_id", "result_version"], "audits_studio_version_idx");
    t.dropColumn("result_version");
  });
}
