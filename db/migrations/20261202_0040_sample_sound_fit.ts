// What the sound alone says of a sample, kept beside its labels: the family and stroke the sound suggests, its
// confidence, where the suggestion came from (trained model, rules of thumb, the studio's confirmed samples) and
// the families it weighed with their fit (lib/catalogue/catalogue.ts soundFit). Written by every cataloguing;
// rows catalogued before this stay null until their library is catalogued again (the sample page then shows
// nothing for it).
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.json("sound").nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.dropColumn("sound");
  });
}
