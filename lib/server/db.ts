import "server-only";
// The one Knex pool of the process (cached on globalThis so hot reload does not open new pools).
import knexFactory, { type Knex } from "knex";
import { env } from "./env";

export function knexConfig(): Knex.Config {
  const e = env();
  return {
    client: "mysql2",
    connection: {
      host: e.KW_DB_HOST,
      port: e.KW_DB_PORT,
      user: e.KW_DB_USER,
      password: e.KW_DB_PASSWORD,
      database: e.KW_DB_NAME,
      timezone: "Z",
      charset: "utf8mb4",
      supportBigNumbers: true,
    },
    // Requests queue for a connection rather than fail under bursts (50 uploaders, the load suite); MariaDB is
    // started with max-connections=300, so app + worker + tests stay well inside it.
    pool: { min: 0, max: 25 },
    acquireConnectionTimeout: 15_000,
  };
}

const g = globalThis as unknown as { __kwKnex?: Knex };

export function db(): Knex {
  if (!g.__kwKnex) g.__kwKnex = knexFactory(knexConfig());
  return g.__kwKnex;
}

export async function closeDb(): Promise<void> {
  if (g.__kwKnex) {
    const k = g.__kwKnex;
    g.__kwKnex = undefined;
    await k.destroy();
  }
}
