// Instruments a member renamed keep their name across cataloguings (name_source = 'person').
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("instruments", (t) => {
    t.enum("name_source", ["auto", "person"]).notNullable().defaultTo("auto");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("instruments", (t) => t.dropColumn("name_source"));
}
