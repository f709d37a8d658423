// The bench environment: the test profile's services (started when they are not running) with a database of
// its own, kitwright_bench, created and migrated. `fresh` drops that database first.
import { execFileSync } from "node:child_process";
import path from "node:path";

export const ROOT = path.resolve(import.meta.dirname, "..");

export function benchEnv({ fresh = false }: { fresh?: boolean } = {}): NodeJS.ProcessEnv {
  const out = execFileSync("bash", ["-c", `source scripts/lib.sh; source scripts/env.sh; kw_profile test; kw_start_services >/dev/null; create_database "$KW_RUN" kitwright_bench ${fresh ? "fresh" : ""}; env -0`], { cwd: ROOT, encoding: "utf8", stdio: ["ignore", "pipe", "inherit"] });
  const env = {} as NodeJS.ProcessEnv;
  for (const kv of out.split("\0")) {
    const i = kv.indexOf("=");
    if (i > 0) env[kv.slice(0, i)] = kv.slice(i + 1);
  }
  env.KW_DB_NAME = "kitwright_bench";
  execFileSync(process.execPath, ["--import", "tsx", "db/migrate.ts"], { cwd: ROOT, env, stdio: "ignore" });
  return env;
}
