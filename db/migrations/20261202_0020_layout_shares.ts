// Published layouts: a layout an owner or editor shares at an unguessable link (a 256-bit random token in the
// URL: the link is the permission, so it is kept to be shown to the publisher again, and revoking deletes it).
// Views are counted; one link per layout (publishing again keeps it, a new link replaces it).
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("layout_shares", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("layout_id", 36).primary().references("layouts.id").onDelete("CASCADE");
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("token", 64).notNullable().unique("layout_shares_token_unique");
    t.text("description").notNullable();
    t.integer("views").unsigned().notNullable().defaultTo(0);
    t.string("created_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["studio_id"], "layout_shares_studio_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("layout_shares");
}
