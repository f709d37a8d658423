// Platform tables: users, studios, memberships, invitations, single-use auth tokens, sign-in attempts,
// and the activity log. All text columns use utf8mb4_unicode_ci; all times are UTC DATETIME(3).
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("users", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("email", 254).notNullable().unique();
    t.string("name", 120).notNullable();
    t.string("password_hash", 100).notNullable();
    t.dateTime("email_verified_at", { precision: 3 }).nullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });

  await knex.schema.createTable("studios", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("name", 120).notNullable();
    t.string("created_by", 36).notNullable().references("users.id");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });

  await knex.schema.createTable("memberships", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("user_id", 36).notNullable().references("users.id").onDelete("CASCADE");
    t.enum("role", ["owner", "editor", "viewer"]).notNullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.primary(["studio_id", "user_id"]);
    t.index(["user_id"]);
  });

  await knex.schema.createTable("invitations", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("email", 254).notNullable();
    t.enum("role", ["owner", "editor", "viewer"]).notNullable();
    t.string("token_hash", 64).notNullable().unique();
    t.string("invited_by", 36).notNullable().references("users.id");
    t.dateTime("expires_at", { precision: 3 }).notNullable();
    t.dateTime("accepted_at", { precision: 3 }).nullable();
    t.string("accepted_by", 36).nullable().references("users.id");
    t.dateTime("revoked_at", { precision: 3 }).nullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["studio_id", "email"]);
  });

  await knex.schema.createTable("auth_tokens", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("user_id", 36).notNullable().references("users.id").onDelete("CASCADE");
    t.enum("kind", ["verify-email", "reset-password"]).notNullable();
    t.string("token_hash", 64).notNullable().unique();
    t.dateTime("expires_at", { precision: 3 }).notNullable();
    t.dateTime("used_at", { precision: 3 }).nullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["user_id", "kind"]);
  });

  await knex.schema.createTable("sign_in_attempts", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.bigIncrements("id");
    t.string("email", 254).notNullable();
    t.string("ip", 64).notNullable();
    t.boolean("succeeded").notNullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["email", "created_at"]);
    t.index(["ip", "created_at"]);
  });

  await knex.schema.createTable("activity", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.bigIncrements("id");
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("actor_id", 36).nullable().references("users.id").onDelete("SET NULL");
    t.string("action", 64).notNullable();
    t.string("subject_type", 32).nullable();
    t.string("subject_id", 64).nullable();
    t.json("details").nullable();
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["studio_id", "created_at"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ["activity", "sign_in_attempts", "auth_tokens", "invitations", "memberships", "studios", "users"]) {
    await knex.schema.dropTableIfExists(t);
  }
}
