// Knex configuration for scripts (migrations, seeds). The app builds the same config in lib/server/db.ts.
import path from "node:path";

const config = {
  client: "mysql2",
  connection: {
    host: process.env.KW_DB_HOST ?? "127.0.0.1",
    port: Number(process.env.KW_DB_PORT ?? 33061),
    user: process.env.KW_DB_USER ?? "kitwright",
    password: process.env.KW_DB_PASSWORD ?? "kitwright-local",
    database: process.env.KW_DB_NAME ?? "kitwright",
    timezone: "Z",
    charset: "utf8mb4",
  },
  migrations: { directory: path.join(__dirname, "db", "migrations"), loadExtensions: [".ts"] },
};

export default config;
