// Browser-table benchmark (run by bench/run.ts in a child: node --conditions=react-server --import tsx
// bench/browse.ts, with KW_DB_NAME pointing at a bench database). Seeds a library of 100,000 sample rows
// with batch inserts (once; reused while the row count matches), then times the samples list API (the real
// route handler, called in-process with a signed session: session, membership, zod, SQL, JSON) for a first
// page, a sorted page and a filtered page, and EXPLAINs the SQL each one ran to see whether an index is used.
// Prints one JSON line: { rows, seedSec, pages: [{ name, p50, p95, max, n }], plans: [...] }.
import crypto from "node:crypto";
import { NextRequest } from "next/server";
import { db } from "@/lib/server/db";
import { env } from "@/lib/server/env";
import { createSessionCookie, createStudio, createUser } from "@/db/factories";
import { insertSamplesWithWords } from "@/lib/server/catalogue/words";
import { FAMILIES, FAMILY_ARTICULATIONS } from "@/lib/catalogue/taxonomy";
import * as samplesRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/route";
import { mulberry32 as rng } from "../lib/synth/rng";

const ROWS = Number(process.env.KW_BENCH_ROWS ?? 100_000);
const RUNS = Number(process.env.KW_BENCH_RUNS ?? 20);
const LIB_NAME = `bench-${ROWS}`;


async function seed(): Promise<{ studioId: string; libraryId: string; userId: string; seedSec: number }> {
  const k = db();
  const existing = await k("libraries").where({ name: LIB_NAME }).first("id", "studio_id");
  if (existing) {
    const n = Number((await k("samples").where({ library_id: existing.id }).count({ n: "*" }))[0]!.n);
    const owner = await k("memberships").where({ studio_id: existing.studio_id, role: "owner" }).first("user_id");
    if (n === ROWS && owner) return { studioId: existing.studio_id, libraryId: existing.id, userId: owner.user_id, seedSec: 0 };
    await k("libraries").where({ id: existing.id }).delete();
  }
  const t0 = performance.now();
  const user = await createUser(k, { email: `bench-${crypto.randomBytes(4).toString("hex")}@example.test`, name: "Bench owner", password: "correct-horse-9" });
  const studio = await createStudio(k, { name: `Bench ${crypto.randomBytes(3).toString("hex")}`, ownerId: user.id });
  const libraryId = crypto.randomUUID();
  await k("libraries").insert({ id: libraryId, studio_id: studio.id, name: LIB_NAME, created_by: user.id });
  const r = rng(99);
  // later migrations may add columns the app fills on upload (e.g. a sort key for paths): fill them the same way
  const hasPathKey = await k.schema.hasColumn("samples", "path_key");
  const hasWords = await k.schema.hasTable("sample_words");
  const fams = FAMILIES.filter((f) => FAMILY_ARTICULATIONS[f].length);
  const BATCH = 1000;
  for (let start = 0; start < ROWS; start += BATCH) {
    const rows = [];
    for (let i = start; i < Math.min(ROWS, start + BATCH); i++) {
      const family = fams[Math.floor(r() * fams.length)]!;
      const arts = FAMILY_ARTICULATIONS[family];
      const articulation = arts[Math.floor(r() * arts.length)]!;
      const inst = `${family}-${1 + Math.floor(r() * 6)}`;
      const layer = Math.floor(r() * 8);
      const rr = 1 + Math.floor(r() * 4);
      const name = `${inst}_${articulation}_v${layer + 1}_rr${rr}_${String(i).padStart(6, "0")}.wav`;
      const relPath = `${family}/${inst}/${name}`;
      rows.push({
        ...(hasPathKey ? { path_key: relPath.slice(0, 500) } : {}),
        id: crypto.randomUUID(), studio_id: studio.id, library_id: libraryId, rel_path: relPath, file_name: name,
        sha256: crypto.createHash("sha256").update(`${libraryId}:${i}`).digest("hex"), size_bytes: 200_000 + Math.floor(r() * 400_000),
        storage_key: `bench/${i}.wav`, state: r() < 0.02 ? "rejected" : "catalogued", sample_rate: 48000, bits: 24, channels: 2,
        duration_sec: 0.5 + 3 * r(), strike_lufs: -40 + 35 * r(), true_peak_dbtp: -20 + 20 * r(), centroid_hz: 200 + 8000 * r(), decay_sec: 0.1 + 3 * r(),
        family, family_source: "name", articulation, articulation_source: "name", confidence: r(), instrument_key: inst, layer_index: layer, layer_count: 8,
        round_robin: rr, velocity_low: layer * 16, velocity_high: layer * 16 + 15, conflict: r() < 0.03 ? "strong" : "none", uploaded_by: user.id,
      });
    }
    if (hasWords) await insertSamplesWithWords(k, rows);
    else await k("samples").insert(rows);
  }
  return { studioId: studio.id, libraryId, userId: user.id, seedSec: (performance.now() - t0) / 1000 };
}

async function main() {
  const s = await seed();
  const cookie = await createSessionCookie(db(), s.userId, env().NEXTAUTH_SECRET);
  const base = env().KW_APP_URL;
  const pathOf = (qs: string) => `/api/studios/${s.studioId}/libraries/${s.libraryId}/samples${qs}`;
  const get = async (qs: string) => {
    const req = new NextRequest(new URL(pathOf(qs), base), { headers: { host: new URL(base).host, cookie } });
    const res = await samplesRoute.GET(req, { params: Promise.resolve({ studioId: s.studioId, libraryId: s.libraryId }) });
    const body = await res.json();
    if (res.status !== 200) throw new Error(`${qs}: ${res.status} ${JSON.stringify(body)}`);
    return body as { rows: unknown[]; total: number };
  };
  const pages = [
    { name: "first page (default: by path)", qs: "" },
    { name: "sorted page (strike loudness, desc, page 40)", qs: "?sort=strike&dir=desc&page=40" },
    { name: "filtered page (family + articulation, by name)", qs: "?family=snare&articulation=rim-shot&sort=name" },
    { name: "search page (q=rr2: a quarter of the rows match)", qs: "?q=rr2" },
    { name: "search page (q=snare rr2 v3: two words and a prefix)", qs: "?q=snare%20rr2%20v3" },
    { name: "search page (q=00012: 10 rows match)", qs: "?q=00012" },
    { name: "search page (q=tom: one family, its rows together late in path order)", qs: "?q=tom" },
    { name: "search page (q=nare: no word starts so, falls back to path contains)", qs: "?q=nare" },
  ];
  const out: { name: string; qs: string; total: number; p50: number; p95: number; max: number; n: number }[] = [];
  const plans: { page: string; sql: string; table: string; type: string; key: string | null; rows: number; extra: string }[] = [];
  for (const p of pages) {
    // capture the SQL of one call, then EXPLAIN each statement
    const seen: { sql: string; bindings: unknown[] }[] = [];
    const onQuery = (q: { sql: string; bindings: unknown[] }) => seen.push(q);
    db().on("query", onQuery);
    const first = await get(p.qs);
    db().removeListener("query", onQuery);
    for (const q of seen.filter((x) => /from `(samples|sample_words)`/i.test(x.sql))) {
      // a statement run with its own optimizer settings is explained with them
      const m = /^(SET STATEMENT .*? FOR )([\s\S]*)$/.exec(q.sql);
      const [plan] = (await db().raw(m ? `${m[1]}EXPLAIN ${m[2]}` : `EXPLAIN ${q.sql}`, q.bindings as never)) as unknown as [Record<string, unknown>[]];
      for (const row of plan.filter((x) => x.table === "s" || x.table === "sample_words" || String(x.table).startsWith("<subquery"))) {
        plans.push({ page: p.name, sql: /count\(/i.test(q.sql) ? "count" : "page", table: String(row.table), type: String(row.type), key: (row.key as string) ?? null, rows: Number(row.rows), extra: String(row.Extra ?? "") });
      }
    }
    for (let i = 0; i < 3; i++) await get(p.qs);
    const times: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      const t0 = performance.now();
      await get(p.qs);
      times.push(performance.now() - t0);
    }
    times.sort((a, b) => a - b);
    const q = (x: number) => times[Math.min(times.length - 1, Math.ceil(x * times.length) - 1)]!;
    out.push({ name: p.name, qs: p.qs, total: first.total, p50: q(0.5), p95: q(0.95), max: times.at(-1)!, n: RUNS });
  }
  process.stdout.write(`${JSON.stringify({ rows: ROWS, seedSec: s.seedSec, pages: out, plans })}\n`);
  await db().destroy();
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
