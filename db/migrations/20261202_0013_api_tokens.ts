// Personal API tokens: a member's key for scripts (the command line's upload). Each is scoped to one studio and
// holds a role chosen at creation, never above the creator's; a request is served with the lower of that role
// and the creator's role at the time (lib/server/auth/api-tokens.ts). Only the SHA-256 of the secret is kept.
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("api_tokens", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("user_id", 36).notNullable().references("users.id").onDelete("CASCADE");
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("name", 120).notNullable();
    t.enum("role", ["owner", "editor", "viewer"]).notNullable();
    t.string("token_hash", 64).notNullable().unique("api_tokens_hash_unique");
    // the first characters of the secret, shown in the list so a person can tell their tokens apart
    t.string("hint", 16).notNullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("expires_at", { precision: 3 }).nullable();
    t.dateTime("last_used_at", { precision: 3 }).nullable();
    t.dateTime("revoked_at", { precision: 3 }).nullable();
    t.index(["user_id", "revoked_at"], "api_tokens_user_idx");
    t.index(["studio_id"], "api_tokens_studio_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("api_tokens");
}
