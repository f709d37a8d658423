// Ids in URLs are UUIDs (RFC 9562 section 4: hex digits are case-insensitive on input, written in lower case).
// MariaDB compares our id columns without regard to case, so an id spelled in upper case finds its row; it
// must never be stored in that spelling. One upload through upper-case ids used to leave every member with a
// 500 on the library list, the library, its progress and its samples.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, makeStudioWithRoles, uniq } from "../helpers";
import { db, closeDb } from "@/lib/server/db";
import { countsFor } from "@/lib/server/catalogue/libraries";
import { closeQueues } from "@/lib/server/jobs";
import { up as lowerCaseIds } from "@/db/migrations/20261201_0011_ids_lower_case";
import { hitWav, multipart } from "./helpers";
import * as libsRoute from "@/app/api/studios/[studioId]/libraries/route";
import * as libRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/route";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";
import * as samplesRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/route";
import * as progressRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/progress/route";

let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;

beforeAll(async () => {
  ctx = await makeStudioWithRoles();
});

afterAll(async () => {
  await closeQueues();
  await closeDb();
});

async function newLibrary(): Promise<string> {
  const r = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name: uniq("Case") }, user: ctx.users.editor });
  expect(r.status).toBe(201);
  return r.json.id;
}

describe("ids spelled in upper case", () => {
  it("an upload through upper-case ids stores the lower-case ids; every member then reads the library (no 5xx)", async () => {
    const libraryId = await newLibrary();
    const S = ctx.studio.id.toUpperCase();
    const L = libraryId.toUpperCase();
    const { body, type } = await multipart([{ name: "Kick/kick_v1.wav", data: hitWav(9101) }]);
    const up = await call(uploadRoute.POST, { params: { studioId: S, libraryId: L }, rawBody: body, headers: { "content-type": type }, user: ctx.users.editor });
    expect(up.status).toBe(201);
    expect(up.json.files[0].status).toBe("queued");
    // stored spelled as generated (compared byte for byte: the columns themselves ignore case)
    const row = await db()("samples").where({ id: up.json.files[0].sampleId }).first(db().raw("BINARY studio_id AS s"), db().raw("BINARY library_id AS l"));
    expect(String(row.s)).toBe(ctx.studio.id);
    expect(String(row.l)).toBe(libraryId);
    const counts = await db()("library_sample_counts").where({ library_id: libraryId }).select(db().raw("BINARY library_id AS l"));
    expect(counts.map((c: { l: Buffer }) => String(c.l))).toEqual([libraryId]);

    for (const user of [ctx.users.viewer, ctx.users.editor, ctx.users.owner]) {
      const list = await call(libsRoute.GET, { params: { studioId: ctx.studio.id }, user });
      expect(list.status).toBe(200);
      expect(list.json.libraries.find((l: { id: string }) => l.id === libraryId).counts.total).toBe(1);
      const one = await call(libRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user });
      expect(one.status).toBe(200);
      expect(one.json.counts.queued).toBe(1);
      const progress = await call(progressRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user });
      expect(progress.status).toBe(200);
      expect(progress.json.queued).toBe(1);
      const samples = await call(samplesRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, path: `/api/x?q=kick`, user });
      expect(samples.status).toBe(200);
      expect(samples.json.total).toBe(1);
    }
    // and through upper-case ids as well
    const upper = await call(libRoute.GET, { params: { studioId: S, libraryId: L }, user: ctx.users.viewer });
    expect(upper.status).toBe(200);
    expect(upper.json.id).toBe(libraryId);
  });

  it("a PATCH through upper-case ids answers 200 with the saved library", async () => {
    const libraryId = await newLibrary();
    const { body, type } = await multipart([{ name: "snare.wav", data: hitWav(9102) }]);
    expect((await call(uploadRoute.POST, { params: { studioId: ctx.studio.id, libraryId }, rawBody: body, headers: { "content-type": type }, user: ctx.users.editor })).status).toBe(201);
    const name = uniq("Renamed");
    const r = await call(libRoute.PATCH, { method: "PATCH", params: { studioId: ctx.studio.id.toUpperCase(), libraryId: libraryId.toUpperCase() }, body: { name }, user: ctx.users.editor });
    expect(r.status).toBe(200);
    expect(r.json).toMatchObject({ id: libraryId, name, counts: { queued: 1, total: 1 } });
  });

  it("counts stored under another spelling of the id (rows written before ids were normalised) are still found", async () => {
    const libraryId = await newLibrary();
    await db()("library_sample_counts").insert({ library_id: libraryId.toUpperCase(), state: "catalogued", n: 3 });
    const c = await countsFor(ctx.studio.id, [libraryId]);
    expect(c.get(libraryId)).toEqual({ queued: 0, measuring: 0, measured: 0, catalogued: 3, rejected: 0, total: 3 });
    const list = await call(libsRoute.GET, { params: { studioId: ctx.studio.id }, user: ctx.users.viewer });
    expect(list.status).toBe(200);
    // a counter without samples behind it: take it back (other tests compare every counter with COUNT(*))
    await db()("library_sample_counts").where({ library_id: libraryId }).delete();
  });

  it("migration 0011 rewrites ids stored in upper case by earlier versions, in binary columns too", async () => {
    const libraryId = await newLibrary();
    const L = libraryId.toUpperCase();
    await db()("activity").insert({ studio_id: ctx.studio.id.toUpperCase(), actor_id: ctx.users.owner.id, action: "test.case", subject_type: "library", subject_id: L });
    const word = uniq("case");
    await db()("sample_words").insert({ library_id: L, word, sample_id: "00000000-0000-4000-8000-00000000abcd".toUpperCase() });
    await lowerCaseIds(db());
    const act = await db()("activity").where({ action: "test.case", subject_id: libraryId }).first(db().raw("BINARY studio_id AS s"), db().raw("BINARY subject_id AS x"));
    expect([String(act.s), String(act.x)]).toEqual([ctx.studio.id, libraryId]);
    const w = await db()("sample_words").where({ word }).select("library_id", "sample_id");
    expect(w).toEqual([{ library_id: libraryId, sample_id: "00000000-0000-4000-8000-00000000abcd" }]);
    await db()("sample_words").where({ word }).delete();
  });
});
