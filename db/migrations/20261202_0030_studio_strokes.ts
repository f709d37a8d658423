// A studio's own strokes (lib/catalogue/strokes.ts): one row per stroke, its id unique within the studio. Stroke ids
// may now be up to 40 characters ("buzz-rim-shot", "cajon-heel-tone"), so the articulation columns widen from 20.
import type { Knex } from "knex";

const WIDEN: Array<[string, string]> = [
  ["samples", "articulation"],
  ["samples", "confirmed_articulation"],
  ["layer_groups", "articulation"],
];

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("studio_strokes", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("stroke_id", 40).notNullable();
    t.string("name", 60).notNullable();
    t.json("families").notNullable(); // Family[]
    t.json("words").notNullable(); // string[]
    t.json("neighbours").notNullable(); // [{ to, cost }]
    t.integer("position").unsigned().notNullable().defaultTo(0);
    t.string("created_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.primary(["studio_id", "stroke_id"]);
  });
  for (const [table, col] of WIDEN) {
    await knex.raw(`ALTER TABLE ?? MODIFY ?? VARCHAR(40) ${col === "confirmed_articulation" ? "NULL" : table === "samples" ? "NULL" : "NOT NULL"}`, [table, col]);
  }
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("studio_strokes");
  for (const [table, col] of WIDEN) {
    await knex.raw(`ALTER TABLE ?? MODIFY ?? VARCHAR(20) ${table === "samples" ? "NULL" : "NOT NULL"}`, [table, col]);
  }
}
