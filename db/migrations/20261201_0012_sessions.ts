// Sessions that can be ended. The session cookie (a next-auth JWT) names its session row; a request is served
// only while that row is neither revoked nor expired. Signing out revokes the row of that device; a password
// reset and removal from a studio revoke every row of the account (lib/server/auth/sessions.ts).
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("sessions", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("user_id", 36).notNullable().references("users.id").onDelete("CASCADE");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("expires_at", { precision: 3 }).notNullable();
    t.dateTime("revoked_at", { precision: 3 }).nullable();
    t.index(["user_id", "revoked_at"], "sessions_user_idx");
    t.index(["expires_at"], "sessions_expires_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("sessions");
}
