// The velocity curve a library's layers are mapped with: "dls" (MMA DLS Level 1 square law, the default) or
// "dannenberg" (Dannenberg, ICMC 2006, over each group's measured dynamic range).
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("libraries", (t) => {
    t.string("velocity_curve", 20).notNullable().defaultTo("dls");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("libraries", (t) => {
    t.dropColumn("velocity_curve");
  });
}
