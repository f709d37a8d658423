// Runs the Knex migrations to the latest version: `node --import tsx db/migrate.ts`.
import knexFactory from "knex";
import config from "../knexfile";

async function main() {
  const k = knexFactory(config);
  try {
    const [batch, done] = await k.migrate.latest(config.migrations);
    process.stdout.write(done.length ? `migrations: batch ${batch}: ${done.length} run\n` : "migrations: up to date\n");
  } finally {
    await k.destroy();
  }
}

main().catch((e) => {
  process.stderr.write(`migration failed: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
});
