// The path folded (lib/catalogue/path-words.ts foldText: NFKD, accents dropped, lower case) in a binary column
// with its own index, for the search's "path contains" fallback (a term no path word starts with). A LIKE
// '%...%' cannot use an index range, so it reads every entry of the library; compared byte by byte that read
// is several times faster than the same read of path_key under utf8mb4_unicode_ci (bench/RESULTS.md,
// "Measurements behind design choices").
import type { Knex } from "knex";
import { foldText } from "../../lib/catalogue/path-words";

export async function up(knex: Knex): Promise<void> {
  await knex.raw("ALTER TABLE samples ADD COLUMN path_fold VARCHAR(500) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NULL AFTER path_key");
  // rows recorded before this migration: folded here, 1,000 at a time
  let after = "";
  for (;;) {
    const rows: { id: string; rel_path: string }[] = await knex("samples").where("id", ">", after).orderBy("id").limit(1000).select("id", "rel_path");
    if (!rows.length) break;
    const sel = rows.map(() => "SELECT ? AS id, ? AS f").join(" UNION ALL ");
    await knex.raw(`UPDATE samples s JOIN (${sel}) v ON v.id = s.id SET s.path_fold = v.f`, rows.flatMap((r) => [r.id, foldText(r.rel_path).slice(0, 500)]));
    after = rows[rows.length - 1]!.id;
  }
  await knex.schema.alterTable("samples", (t) => {
    t.index(["studio_id", "library_id", "path_fold"], "samples_library_path_fold_idx");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("samples", (t) => {
    t.dropIndex([], "samples_library_path_fold_idx");
  });
  await knex.raw("ALTER TABLE samples DROP COLUMN path_fold");
}
