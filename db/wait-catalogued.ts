// Waits until no sample of the demo studio is queued, being measured or waiting for the cataloguing, printing
// progress; gives up after --timeout seconds (default 600) without failing, so the demo still starts. Used by
// scripts/demo.sh between the demo library seed and the demo kits seed.
import knexFactory from "knex";
import config from "../knexfile";
import { DEMO_STUDIO } from "./demo-accounts";

async function main() {
  const i = process.argv.indexOf("--timeout");
  const timeoutS = i > 0 ? Number(process.argv[i + 1]) : 600;
  const k = knexFactory(config);
  try {
    const studio = await k("studios").where({ name: DEMO_STUDIO }).first("id");
    if (!studio) return;
    const end = Date.now() + timeoutS * 1000;
    let last = "";
    for (;;) {
      const rows = (await k("samples").where({ studio_id: studio.id }).groupBy("state").select("state").count({ n: "*" })) as { state: string; n: number | string }[];
      const c = Object.fromEntries(rows.map((r) => [r.state, Number(r.n)]));
      const total = rows.reduce((s, r) => s + Number(r.n), 0);
      const waiting = (c.queued ?? 0) + (c.measuring ?? 0) + (c.measured ?? 0);
      const line = `demo library: ${c.catalogued ?? 0} catalogued, ${c.rejected ?? 0} refused, ${waiting} waiting of ${total}`;
      if (line !== last) process.stdout.write(`${line}\n`);
      last = line;
      if (waiting === 0) return;
      if (Date.now() > end) {
        process.stdout.write(`still measuring or cataloguing after ${timeoutS} s; the worker goes on in the background\n`);
        return;
      }
      await new Promise((r) => setTimeout(r, 2000));
    }
  } finally {
    await k.destroy();
  }
}

main().catch((e) => {
  process.stderr.write(`waiting for the catalogue failed: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
});
