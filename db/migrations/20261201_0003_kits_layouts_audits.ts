// Kits, layouts and saved audits. Kits and layouts keep their body in our own versioned JSON schema
// (lib/audit/schema.ts: kitwright.kit/v1, kitwright.layout/v1); audits keep the whole result
// (kitwright.audit/v1) so two audits of one layout can be compared later.
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("kits", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("name", 160).notNullable();
    t.json("body").notNullable();
    t.string("created_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["studio_id", "name"]);
  });
  await knex.schema.createTable("layouts", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("name", 160).notNullable();
    t.json("body").notNullable();
    t.string("created_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["studio_id", "name"]);
  });
  await knex.schema.createTable("audits", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("layout_id", 36).notNullable().references("layouts.id").onDelete("CASCADE");
    t.string("kit_id", 36).nullable().references("kits.id").onDelete("SET NULL");
    t.string("layout_name", 160).notNullable();
    t.string("kit_name", 160).notNullable();
    t.float("score").notNullable();
    t.integer("silent_pads").notNullable().defaultTo(0);
    t.integer("stand_in_pads").notNullable().defaultTo(0);
    t.integer("conflicts").notNullable().defaultTo(0);
    t.json("result").notNullable();
    t.string("created_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["studio_id", "layout_id", "created_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ["audits", "layouts", "kits"]) await knex.schema.dropTableIfExists(t);
}
