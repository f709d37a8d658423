// The worker's maintenance: old auth rows purged, upload leftovers and stored files without a sample swept after
// an hour, stranded queued samples queued again (deterministic job ids, so nothing is doubled), libraries changed
// and not catalogued since queued for their cataloguing; at start, samples measured by an older MEASURE_VERSION
// queued to be measured again, and measured again in place, and the jobs of retired queue names removed.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import crypto from "node:crypto";
import { afterAll, describe, expect, it } from "vitest";
import { db, closeDb } from "@/lib/server/db";
import { purgeAuthRows } from "@/lib/server/auth/maintenance";
import { requeueOutdated, requeueStaleCatalogues, requeueStranded } from "@/lib/server/catalogue/maintenance";
import { LocalStorage, storage, sweepPartials } from "@/lib/server/storage";
import { sweepOrphanFiles } from "@/lib/server/catalogue/orphans";
import { sampleKey } from "@/lib/server/catalogue/libraries";
import { Queue } from "bullmq";
import { catalogueQueue, closeQueues, maintenanceQueue, measureJobId, measureQueue, retireRenamedJobs } from "@/lib/server/jobs";
import { redis } from "@/lib/server/redis";
import { MEASURE_VERSION } from "@/lib/audio/version";
import { measureWav } from "@/lib/audio";
import { measureSample } from "@/lib/server/catalogue/measure";
import { hitWav } from "../catalogue/helpers";
import { makeStudioWithRoles, makeUser } from "../helpers";

afterAll(async () => {
  await closeQueues();
  await closeDb();
});

describe("maintenance", () => {
  it("sweeps partial upload files older than an hour and nothing else", async () => {
    const root = fs.mkdtempSync(path.join(os.tmpdir(), "kw-sweep-"));
    const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "kw-sweep-tmp-"));
    const dir = path.join(root, "studios", "s", "libraries", "l");
    fs.mkdirSync(dir, { recursive: true });
    const old = path.join(dir, "a.wav.part-0123456789ab");
    const fresh = path.join(dir, "b.wav.part-ba9876543210");
    const kept = path.join(dir, "c.wav");
    const oldZip = path.join(tmp, "kw-zip-0123456789abcdef.zip");
    const oldS3Spool = path.join(tmp, "kw-s3-0123456789abcdef"); // S3Storage.put's spool, left by a killed app
    const freshS3Spool = path.join(tmp, "kw-s3-fedcba9876543210");
    for (const f of [old, fresh, kept, oldZip, oldS3Spool, freshS3Spool]) fs.writeFileSync(f, "x");
    const twoHoursAgo = new Date(Date.now() - 2 * 3600_000);
    for (const f of [old, kept, oldZip, oldS3Spool]) fs.utimesSync(f, twoHoursAgo, twoHoursAgo);
    expect(await sweepPartials({ storageRoot: root, tmpDir: tmp })).toBe(3);
    expect([fs.existsSync(old), fs.existsSync(fresh), fs.existsSync(kept), fs.existsSync(oldZip), fs.existsSync(oldS3Spool), fs.existsSync(freshS3Spool)]).toEqual([false, true, true, false, false, true]);
    fs.rmSync(root, { recursive: true, force: true });
    fs.rmSync(tmp, { recursive: true, force: true });
  });

  it("deletes stored sample files that no sample names once they are an hour old (an app killed between storing and recording), and nothing else", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const libraryId = crypto.randomUUID();
    await db()("libraries").insert({ id: libraryId, studio_id: studio.id, name: "Orphans" });
    const key = (id: string, lib = libraryId) => sampleKey(studio.id, lib, id);
    const recorded = crypto.randomUUID();
    const orphan = crypto.randomUUID();
    const freshOrphan = crypto.randomUUID(); // an upload in progress: stored, not yet recorded
    const ofGoneLibrary = crypto.randomUUID();
    const goneLibraryKey = key(ofGoneLibrary, crypto.randomUUID());
    const notASample = `studios/${studio.id}/libraries/${libraryId}/notes.txt`;
    for (const k of [key(recorded), key(orphan), key(freshOrphan), goneLibraryKey, notASample]) await storage().put(k, hitWav(9));
    await db()("samples").insert({ id: recorded, studio_id: studio.id, library_id: libraryId, rel_path: "a.wav", file_name: "a.wav", sha256: crypto.randomBytes(32).toString("hex"), size_bytes: 1, storage_key: key(recorded), state: "catalogued", uploaded_by: users.owner.id });
    const root = (storage() as LocalStorage).root;
    const twoHoursAgo = new Date(Date.now() - 2 * 3600_000);
    for (const k of [key(recorded), key(orphan), goneLibraryKey, notASample]) fs.utimesSync(path.join(root, k), twoHoursAgo, twoHoursAgo);
    try {
      expect(await sweepOrphanFiles()).toBeGreaterThanOrEqual(2);
      expect(await storage().exists(key(recorded))).toBe(true);
      expect(await storage().exists(key(orphan))).toBe(false);
      expect(await storage().exists(goneLibraryKey)).toBe(false);
      expect(await storage().exists(key(freshOrphan))).toBe(true);
      expect(await storage().exists(notASample)).toBe(true);
      // nothing left to sweep here; the fresh one goes once it is old
      const later = Date.now() + 2 * 3600_000;
      expect(await sweepOrphanFiles({ now: later })).toBeGreaterThanOrEqual(1);
      expect(await storage().exists(key(freshOrphan))).toBe(false);
      expect(await storage().exists(key(recorded))).toBe(true);
    } finally {
      await db()("samples").where({ id: recorded }).delete();
      await storage().deletePrefix(`studios/${studio.id}/`);
    }
  });

  it("queues stranded samples again, once, and leaves recent ones to their own job", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const libraryId = crypto.randomUUID();
    await db()("libraries").insert({ id: libraryId, studio_id: studio.id, name: "Stranded" });
    const mk = (updated: Date) => ({ id: crypto.randomUUID(), studio_id: studio.id, library_id: libraryId, rel_path: `${crypto.randomUUID()}.wav`, file_name: "x.wav", sha256: crypto.randomBytes(32).toString("hex"), size_bytes: 1, storage_key: "k", state: "queued", uploaded_by: users.owner.id, updated_at: updated });
    const stranded = mk(new Date(Date.now() - 10 * 60_000));
    const recent = mk(new Date());
    await db()("samples").insert([stranded, recent]);
    try {
      const n = await requeueStranded();
      expect(n).toBeGreaterThanOrEqual(1);
      expect(await measureQueue().getJob(measureJobId(stranded.id))).toBeTruthy();
      expect(await measureQueue().getJob(measureJobId(recent.id))).toBeFalsy();
      const before = await measureQueue().getJobCounts("waiting", "delayed", "active");
      await requeueStranded();
      expect(await measureQueue().getJobCounts("waiting", "delayed", "active")).toEqual(before);
    } finally {
      await (await measureQueue().getJob(measureJobId(stranded.id)))?.remove().catch(() => undefined);
      await db()("samples").whereIn("id", [stranded.id, recent.id]).delete();
    }
  });

  it("queues samples measured by an older MEASURE_VERSION again, once, and leaves current and queued ones alone", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const libraryId = crypto.randomUUID();
    await db()("libraries").insert({ id: libraryId, studio_id: studio.id, name: "Outdated" });
    const mk = (state: string, version: number | null) => ({ id: crypto.randomUUID(), studio_id: studio.id, library_id: libraryId, rel_path: `${crypto.randomUUID()}.wav`, file_name: "x.wav", sha256: crypto.randomBytes(32).toString("hex"), size_bytes: 1, storage_key: "k", state, measure_version: version, uploaded_by: users.owner.id });
    const old = mk("catalogued", MEASURE_VERSION - 1);
    const oldRefused = mk("rejected", MEASURE_VERSION - 1);
    const oldMeasured = mk("measured", MEASURE_VERSION - 1);
    const current = mk("catalogued", MEASURE_VERSION);
    const queued = mk("queued", null);
    const all = [old, oldRefused, oldMeasured, current, queued];
    await db()("samples").insert(all);
    try {
      // pages of two: the walk by id goes on past a full page
      expect(await requeueOutdated({ pageSize: 2 })).toBeGreaterThanOrEqual(3);
      for (const s of [old, oldRefused, oldMeasured]) expect(await measureQueue().getJob(measureJobId(s.id))).toBeTruthy();
      for (const s of [current, queued]) expect(await measureQueue().getJob(measureJobId(s.id))).toBeFalsy();
      const before = await measureQueue().getJobCounts("waiting", "delayed", "active");
      await requeueOutdated();
      expect(await measureQueue().getJobCounts("waiting", "delayed", "active")).toEqual(before);
    } finally {
      for (const s of all) await (await measureQueue().getJob(measureJobId(s.id)))?.remove().catch(() => undefined);
      await db()("samples").whereIn("id", all.map((s) => s.id)).delete();
    }
  });

  it("queues the cataloguing of a library changed a while ago and not catalogued since, and of no other", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const mkLib = async (name: string) => {
      const id = crypto.randomUUID();
      await db()("libraries").insert({ id, studio_id: studio.id, name });
      return id;
    };
    const stale = await mkLib("Stale"), fresh = await mkLib("Fresh"), done = await mkLib("Done"), relabelled = await mkLib("Relabelled");
    const tenMinutesAgo = new Date(Date.now() - 10 * 60_000), twentyMinutesAgo = new Date(Date.now() - 20 * 60_000);
    const mk = (libraryId: string, state: string, updated: Date) => ({ id: crypto.randomUUID(), studio_id: studio.id, library_id: libraryId, rel_path: `${crypto.randomUUID()}.wav`, file_name: "x.wav", sha256: crypto.randomBytes(32).toString("hex"), size_bytes: 1, storage_key: "k", state, uploaded_by: users.owner.id, updated_at: updated });
    // stale: measured ten minutes ago, never catalogued; fresh: measured just now (its own job is due);
    // done: catalogued after its last change; relabelled: a catalogued sample changed after the catalogue was read
    await db()("samples").insert([mk(stale, "measured", tenMinutesAgo), mk(fresh, "measured", new Date()), mk(done, "catalogued", twentyMinutesAgo), mk(relabelled, "catalogued", tenMinutesAgo)]);
    const health = (libraryId: string, at: Date) => ({ library_id: libraryId, studio_id: studio.id, findings: "[]", curve: "dls", sample_count: 1, computed_at: at });
    await db()("library_health").insert([health(done, tenMinutesAgo), health(relabelled, twentyMinutesAgo)]);
    const jobsOf = async () => new Set((await catalogueQueue().getJobs(["waiting", "delayed", "prioritized"])).map((j) => j.data.libraryId as string));
    try {
      expect(await requeueStaleCatalogues()).toBeGreaterThanOrEqual(2);
      const queued = await jobsOf();
      expect([stale, fresh, done, relabelled].map((l) => queued.has(l))).toEqual([true, false, false, true]);
    } finally {
      for (const j of await catalogueQueue().getJobs(["waiting", "delayed", "prioritized"])) if ([stale, relabelled].includes(j.data.libraryId)) await j.remove().catch(() => undefined);
      await db()("libraries").whereIn("id", [stale, fresh, done, relabelled]).delete();
    }
  });

  it("at worker start, the queue and the schedule of retired names are removed with what they held", async () => {
    const old = new Queue("kw-regroup", { connection: redis() });
    try {
      await old.add("regroup", { studioId: "s", libraryId: "l" }, { delay: 60_000 });
      await maintenanceQueue().upsertJobScheduler("purge-expired", { every: 600_000 }, { name: "purge-expired", data: {} });
      expect(await retireRenamedJobs()).toBeGreaterThanOrEqual(1);
      expect(Object.values(await old.getJobCounts()).reduce((a, b) => a + b, 0)).toBe(0);
      expect(await maintenanceQueue().getJobScheduler("purge-expired")).toBeFalsy();
      const left = await maintenanceQueue().getJobs(["waiting", "delayed", "prioritized", "wait", "active"]);
      expect(left.filter((j) => j.name === "purge-expired")).toEqual([]);
      expect(await retireRenamedJobs()).toBe(0);
    } finally {
      await old.close();
    }
  });

  it("measures a sample of an older version again in place: it stays catalogued meanwhile and takes the new record", async () => {
    const { studio, users } = await makeStudioWithRoles();
    const libraryId = crypto.randomUUID();
    await db()("libraries").insert({ id: libraryId, studio_id: studio.id, name: "Measured again" });
    const key = `test-remeasure/${crypto.randomUUID()}.wav`;
    await storage().put(key, hitWav(5));
    const id = crypto.randomUUID();
    await db()("samples").insert({
      id, studio_id: studio.id, library_id: libraryId, rel_path: "Kick/kick_01.wav", file_name: "kick_01.wav", sha256: crypto.randomBytes(32).toString("hex"),
      size_bytes: 1, storage_key: key, state: "catalogued", measure_version: MEASURE_VERSION - 1, measurement: JSON.stringify({ measureVersion: MEASURE_VERSION - 1 }), uploaded_by: users.owner.id,
    });
    try {
      let during = "";
      const out = await measureSample({ sampleId: id, studioId: studio.id }, async (bytes) => {
        during = (await db()("samples").where({ id }).first("state")).state;
        return measureWav(bytes);
      });
      expect(out).toBe("catalogued");
      expect(during).toBe("catalogued");
      const row = await db()("samples").where({ id }).first("state", "measure_version", "measurement");
      expect(row).toMatchObject({ state: "catalogued", measure_version: MEASURE_VERSION });
      const m = typeof row.measurement === "string" ? JSON.parse(row.measurement) : row.measurement;
      expect(m.measureVersion).toBe(MEASURE_VERSION);
      expect(typeof m.tailEndDb).toBe("number"); // a field of MEASURE_VERSION 2
      // measured at this version, it is left alone
      expect(await measureSample({ sampleId: id, studioId: studio.id }, async () => { throw new Error("not measured again"); })).toBe("skipped");
    } finally {
      await db()("samples").where({ id }).delete();
      await storage().delete(key).catch(() => undefined);
    }
  });

  it("purges auth tokens and sign-in attempts older than a day", async () => {
    const u = await makeUser();
    const oldTime = new Date(Date.now() - 2 * 24 * 3600_000);
    const id = crypto.randomUUID();
    await db()("auth_tokens").insert({ id, user_id: u.id, kind: "reset-password", token_hash: crypto.randomBytes(32).toString("hex"), expires_at: oldTime });
    await db()("sign_in_attempts").insert({ email: u.email, ip: "10.9.9.9", succeeded: false, created_at: oldTime });
    const r = await purgeAuthRows();
    expect(r.tokens).toBeGreaterThanOrEqual(1);
    expect(await db()("auth_tokens").where({ id }).first()).toBeUndefined();
    expect(await db()("sign_in_attempts").where({ email: u.email }).first()).toBeUndefined();
  });
});
