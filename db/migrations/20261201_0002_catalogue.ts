// Catalogue tables: libraries, samples (with their measurement and sorted labels), instruments, layer
// groups and library health. The cataloguing job rewrites instruments, layer groups and health of a library
// from lib/catalogue's catalogueSamples(); sample rows keep per-sample columns for fast browsing.
import type { Knex } from "knex";

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("libraries", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("name", 160).notNullable();
    t.text("description").nullable();
    t.string("created_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.index(["studio_id", "name"]);
  });

  await knex.schema.createTable("samples", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("library_id", 36).notNullable().references("libraries.id").onDelete("CASCADE");
    t.string("rel_path", 1024).notNullable(); // relative path inside the upload (folders carry names)
    t.string("file_name", 255).notNullable();
    t.string("sha256", 64).notNullable();
    t.bigInteger("size_bytes").unsigned().notNullable();
    t.string("storage_key", 255).notNullable();
    t.enum("state", ["queued", "measuring", "catalogued", "rejected"]).notNullable().defaultTo("queued");
    t.string("reject_code", 40).nullable();
    t.text("reject_reason").nullable();
    t.integer("measure_version").nullable();
    t.json("measurement").nullable();
    t.json("peaks").nullable(); // waveform min/max per bucket
    // format and key measures, copied out of the measurement for sorting and filtering
    t.integer("sample_rate").nullable();
    t.smallint("bits").nullable();
    t.smallint("channels").nullable();
    t.float("duration_sec").nullable();
    t.float("strike_lufs").nullable();
    t.float("true_peak_dbtp").nullable();
    t.float("centroid_hz").nullable();
    t.float("decay_sec").nullable();
    // sorted labels (the cataloguing job writes these)
    t.string("family", 20).nullable();
    t.enum("family_source", ["name", "sound", "person"]).nullable();
    t.string("articulation", 20).nullable();
    t.enum("articulation_source", ["name", "sound", "person"]).nullable();
    t.float("confidence").nullable();
    t.string("mic", 20).nullable();
    t.string("instrument_key", 191).nullable();
    t.integer("layer_index").nullable();
    t.integer("layer_count").nullable();
    t.integer("round_robin").nullable();
    t.tinyint("velocity_low").unsigned().nullable();
    t.tinyint("velocity_high").unsigned().nullable();
    t.enum("conflict", ["none", "mild", "strong"]).nullable();
    t.json("reasons").nullable();
    // labels a member confirmed (win over names and sound)
    t.string("confirmed_family", 20).nullable();
    t.string("confirmed_articulation", 20).nullable();
    t.string("confirmed_mic", 20).nullable();
    t.string("confirmed_instrument_key", 191).nullable();
    t.string("confirmed_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("confirmed_at", { precision: 3 }).nullable();
    t.string("uploaded_by", 36).nullable().references("users.id").onDelete("SET NULL");
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.unique(["library_id", "sha256"]);
    t.index(["studio_id", "library_id", "state"]);
    t.index(["library_id", "family", "articulation"]);
    t.index(["library_id", "instrument_key", "articulation", "mic", "layer_index"], "samples_group_idx");
    t.index(["library_id", "file_name"]);
    t.index(["library_id", "strike_lufs"]);
    t.index(["library_id", "created_at"]);
  });

  await knex.schema.createTable("instruments", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("id", 36).primary();
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("library_id", 36).notNullable().references("libraries.id").onDelete("CASCADE");
    t.string("key", 191).notNullable(); // deterministic key from lib/catalogue (stable across cataloguings)
    t.string("name", 160).notNullable();
    t.string("family", 20).notNullable();
    t.float("pitch_hz").nullable();
    t.integer("sample_count").notNullable().defaultTo(0);
    t.dateTime("created_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.dateTime("updated_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
    t.unique(["library_id", "key"]);
    t.index(["studio_id", "family"]);
  });

  await knex.schema.createTable("layer_groups", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.bigIncrements("id");
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.string("library_id", 36).notNullable().references("libraries.id").onDelete("CASCADE");
    t.string("group_key", 255).notNullable();
    t.string("instrument_key", 191).notNullable();
    t.string("articulation", 20).notNullable();
    t.string("mic", 20).nullable();
    t.string("label", 255).notNullable();
    t.string("count_from", 10).notNullable();
    t.text("criterion").nullable();
    t.json("layers").notNullable(); // [{ index, velocityLow, velocityHigh, meanStrikeLufs, sampleIds, ... }]
    t.unique(["library_id", "group_key"]);
    t.index(["library_id", "instrument_key"]);
  });

  await knex.schema.createTable("library_health", (t) => {
    t.collate("utf8mb4_unicode_ci");
    t.string("library_id", 36).primary().references("libraries.id").onDelete("CASCADE");
    t.string("studio_id", 36).notNullable().references("studios.id").onDelete("CASCADE");
    t.json("findings").notNullable(); // HealthFinding[]
    t.string("curve", 40).notNullable().defaultTo("dls");
    t.integer("sample_count").notNullable().defaultTo(0);
    t.dateTime("computed_at", { precision: 3 }).notNullable().defaultTo(knex.raw("CURRENT_TIMESTAMP(3)"));
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const t of ["library_health", "layer_groups", "instruments", "samples", "libraries"]) await knex.schema.dropTableIfExists(t);
}
