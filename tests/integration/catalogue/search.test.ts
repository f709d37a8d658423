// The samples table's search through the real route handler, against a library of 6,000 rows written with
// their path words. Every way the server can answer (a single word range counted directly; several words
// listed or counted; pages by walking the sort index or by fetching the matches; other filters joined; the
// "contains" fallback) is compared with the rule itself, applied here in plain code to every row: a sample
// matches when each run of the term starts one of its path words (lib/catalogue/path-words.ts, unit-tested on
// its own examples), or, when no sample does, when its path contains the term.
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, makeStudioWithRoles } from "../helpers";
import { db, closeDb } from "@/lib/server/db";
import { pathWords, searchRuns } from "@/lib/catalogue/path-words";
import { insertSamplesWithWords, sweepOrphanWords } from "@/lib/server/catalogue/words";
import { deleteLibrary } from "@/lib/server/catalogue/libraries";
import * as samplesRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/route";

const N = 6000;
let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;
let rows: { id: string; rel_path: string; family: string; strike_lufs: number }[];
let pathOrder: string[]; // ids in the database's own path order (its collation decides, not ours)

const FAMS = ["Snare", "Kick", "Tom", "HiHat"];
beforeAll(async () => {
  ctx = await makeStudioWithRoles();
  libraryId = crypto.randomUUID();
  await db()("libraries").insert({ id: libraryId, studio_id: ctx.studio.id, name: "search", created_by: ctx.users.owner.id });
  rows = Array.from({ length: N }, (_, i) => {
    const fam = FAMS[i % 4]!;
    const folder = i % 50 === 0 ? "Caisse claire é" : `${fam}s`;
    const rel_path = `${folder}/${fam}Top_v${(i % 8) + 1}-rr${(i % 3) + 1}_${String(i).padStart(5, "0")}.wav`;
    return { id: crypto.randomUUID(), rel_path, family: fam.toLowerCase(), strike_lufs: -40 + ((i * 7919) % N) / 100 }; // distinct at the column's 0.01 (FLOAT(8,2))
  });
  await insertSamplesWithWords(db(), rows.map((r, i) => ({ ...r, studio_id: ctx.studio.id, library_id: libraryId, path_key: r.rel_path, file_name: r.rel_path.split("/").pop()!, sha256: crypto.createHash("sha256").update(String(i)).digest("hex"), size_bytes: 1000, storage_key: `x/${i}`, state: "catalogued" })));
  pathOrder = (await db()("samples").where({ library_id: libraryId }).orderBy([{ column: "path_key" }, { column: "id" }]).select("id")).map((r: { id: string }) => r.id);
}, 60_000);
afterAll(async () => {
  await closeDb();
});

const byWords = (term: string) => {
  const runs = searchRuns(term);
  return rows.filter((r) => {
    const w = pathWords(r.rel_path);
    return runs.length > 0 && runs.every((x) => w.some((y) => y.startsWith(x)));
  });
};

async function search(qs: string) {
  const r = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, path: `/x?${qs}`, user: ctx.users.viewer });
  expect(r.status).toBe(200);
  return r.json as { rows: { id: string; path: string }[]; total: number; search?: string };
}

describe("samples search by path words", () => {
  it.each([
    ["rr2", "one word range, a third of the rows"],
    ["snare rr2", "two words: the matches are listed"],
    ["v rr", "two words matching every row: more than the list holds, so counted"],
    ["00012", "a rare prefix: the few matches are fetched and sorted"],
    ["tom", "one family, last in path order: the walk is cut short and the matches are fetched"],
    ["SNARETOP_V5", "glued words, other case"],
    ["caisse claire e", "accent folded"],
  ])("%s (%s): total and pages agree with the rule", async (term) => {
    const expected = new Set(byWords(term).map((r) => r.id));
    expect(expected.size).toBeGreaterThan(0);
    const inOrder = pathOrder.filter((id) => expected.has(id));
    for (const page of [1, 3]) {
      const res = await search(`q=${encodeURIComponent(term)}&sort=path&page=${page}&pageSize=50`);
      expect(res.search).toBe("words");
      expect(res.total).toBe(expected.size);
      expect(res.rows.map((r) => r.id)).toEqual(inOrder.slice((page - 1) * 50, page * 50));
    }
    // descending by a measure (distinct values): the reference sorts the same rows by value
    const desc = [...byWords(term)].sort((a, b) => b.strike_lufs - a.strike_lufs);
    const res = await search(`q=${encodeURIComponent(term)}&sort=strike&dir=desc&page=2&pageSize=20`);
    expect(res.rows.map((r) => r.id)).toEqual(desc.slice(20, 40).map((r) => r.id));
  });

  it("a search with another filter joins the sample rows", async () => {
    const expected = byWords("top rr2").filter((r) => r.family === "snare");
    const res = await search("q=top%20rr2&family=snare&sort=strike&pageSize=200");
    expect(res.total).toBe(expected.length);
    expect(res.rows.map((r) => r.id)).toEqual([...expected].sort((a, b) => a.strike_lufs - b.strike_lufs).slice(0, 200).map((r) => r.id));
  });

  it("falls back to 'path contains' when no word starts with the term, and says so", async () => {
    const res = await search("q=naretop&pageSize=200&sort=strike");
    expect(res.search).toBe("contains");
    const expected = rows.filter((r) => r.rel_path.toLowerCase().includes("naretop"));
    expect(res.total).toBe(expected.length);
    expect(res.total).toBe(N / 4);
    // the fallback folds case and accents on both sides too: "AIRE É" is inside "Caisse claire é/"
    const folded = await search("q=AIRE%20%C3%89&pageSize=10");
    expect(folded.search).toBe("contains");
    expect(folded.total).toBe(rows.filter((r) => r.rel_path.startsWith("Caisse claire é/")).length);
    expect(folded.total).toBe(N / 50);
    // a term without letters or digits cannot use the words
    const dash = await search("q=-&pageSize=10");
    expect(dash.search).toBe("contains");
    expect(dash.total).toBe(N);
    const none = await search("q=zzzz");
    expect(none).toMatchObject({ total: 0, rows: [], search: "contains" });
    // 66 words in the 200 characters a query may hold: only the first 8 are used, so the answer is an answer
    // (one join per word would pass MariaDB's 61-table limit and fail the request)
    const words66 = Array.from({ length: 66 }, (_, i) => `${"abcdefg"[Math.floor(i / 10)]}${i % 10}`).join(" ");
    expect(words66.length).toBeLessThanOrEqual(200);
    expect(await search(`q=${encodeURIComponent(words66)}`)).toMatchObject({ total: 0, search: "contains" });
    // words after the 8th are not used: these junk words would match nothing
    const firstEight = await search(`q=${encodeURIComponent("snaretop rr2 wav v rr top snare s zz0 zz1 zz2 zz3")}`);
    expect(firstEight.search).toBe("words");
    expect(firstEight.total).toBe(byWords("snaretop rr2").length);
  });

  it("words go with their library, and the sweep removes words left by a cascade", async () => {
    expect(Number((await db()("sample_words").where({ library_id: libraryId }).count({ n: "*" }))[0]!.n)).toBeGreaterThan(N);
    await deleteLibrary({ studioId: ctx.studio.id, actorId: ctx.users.owner.id, libraryId, confirmName: "search" });
    expect(Number((await db()("sample_words").where({ library_id: libraryId }).count({ n: "*" }))[0]!.n)).toBe(0);
    const ghost = crypto.randomUUID();
    await db()("sample_words").insert([{ library_id: ghost, word: "ghost", sample_id: crypto.randomUUID() }]);
    expect(await sweepOrphanWords(db())).toBeGreaterThanOrEqual(1);
    expect(await db()("sample_words").where({ library_id: ghost }).first()).toBeUndefined();
  });
});
