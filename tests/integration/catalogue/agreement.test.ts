// The same answers everywhere: one folder of generated WAVs goes through the command line (`kitwright measure |
// catalogue | audit` as real processes) and through the app (upload route, the real worker process measuring
// and cataloguing, the library page's routes, a kit and an audit run over the API). The two catalogues and the
// two audits are compared field by field; any difference fails with the file (or pad) and the field named.
// The test compares the two paths with each other, not with fixed truths: whatever family the sound model picks
// for a file, both paths must pick the same.
import type { ChildProcess } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { kitwright } from "@/cli/run-kitwright";
import { call, makeStudioWithRoles, uniq } from "../helpers";
import { db, closeDb } from "@/lib/server/db";
import { closeQueues } from "@/lib/server/jobs";
import { kitToFile } from "@/lib/audit/schema";
import type { AuditResult, Kit } from "@/lib/audit/types";
import { renderSound, type SoundSpec } from "@/lib/synth/drums";
import { layerVelocity } from "@/lib/synth/scenario";
import { encodeWav } from "@/lib/synth/wav";
import { multipart, startWorker, waitFor, waitForReady } from "./helpers";
import { auditDifferences, catalogueDifferences, differences, type CliCatalogue } from "./compare";
import * as libsRoute from "@/app/api/studios/[studioId]/libraries/route";
import * as uploadRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";
import * as progressRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/progress/route";
import * as samplesRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/route";
import * as instrumentsRoute from "@/app/api/studios/[studioId]/libraries/[libraryId]/instruments/route";
import * as layoutsRoute from "@/app/api/studios/[studioId]/layouts/route";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import * as auditsRoute from "@/app/api/studios/[studioId]/audits/route";



// ------------------------------------------------------------------ the folder (our own generated kit)

const TOMS = [
  { label: "Tom10", spec: { diameterIn: 10, depthIn: 8, tuneHz: 180, floor: false } },
  { label: "Tom12", spec: { diameterIn: 12, depthIn: 9, tuneHz: 140, floor: false } },
  { label: "FloorTom16", spec: { diameterIn: 16, depthIn: 16, tuneHz: 90, floor: true } },
];
const SNARE = { diameterIn: 14, depthIn: 6.5, tuneHz: 200, shell: "brass" as const };
const PICCOLO = { diameterIn: 13, depthIn: 3.5, tuneHz: 260, shell: "steel" as const };
const KICK = { diameterIn: 22, depthIn: 18, tuneHz: 55, beater: "felt" as const };
const HAT = { diameterIn: 14 };

interface FileSpec { path: string; sound: SoundSpec; velocity: number; seconds: number }

function folderSpec(): FileSpec[] {
  const out: FileSpec[] = [];
  const add = (p: string, sound: SoundSpec, velocity: number, seconds = 1.2) => out.push({ path: p, sound, velocity, seconds });
  const r2 = (n: number) => String(n).padStart(2, "0");
  // three named toms, centre hits in two layers x two round robins, plus rim shots; the 12" tom has six edge
  // hits instead, whose strongest low peak (at these strengths) is an upper mode of the head, near 240 Hz for a
  // head tuned to 140 Hz: a pitch taken over all its hits would put it above the 10" tom
  for (const t of TOMS) {
    for (const [l, dyn] of [[1, "p"], [2, "f"]] as const) {
      for (const r of [1, 2]) add(`Toms/${t.label} center ${dyn} ${r2(r)}.wav`, { family: "tom", instrument: t.spec, articulation: "centre" }, layerVelocity(l, 2));
    }
    if (t.label === "Tom12") {
      for (const [v, dyn] of [[70, "mf"], [120, "ff"]] as const) for (const r of [1, 2, 3]) add(`Toms/${t.label} edge ${dyn} ${r2(r)}.wav`, { family: "tom", instrument: t.spec, articulation: "edge" }, v);
    } else {
      for (const r of [1, 2]) add(`Toms/${t.label} rimshot f ${r2(r)}.wav`, { family: "tom", instrument: t.spec, articulation: "rim-shot" }, 110);
    }
  }
  // a snare with three numbered layers of three round robins, and two rim shots
  for (let l = 1; l <= 3; l++) for (let r = 1; r <= 3; r++) add(`Snare14/Snare14_Center_v${l}_rr${r}.wav`, { family: "snare", instrument: SNARE, articulation: "centre" }, layerVelocity(l, 3));
  for (const l of [1, 2]) add(`Snare14/Snare14_RimShot_v${l}_rr1.wav`, { family: "snare", instrument: SNARE, articulation: "rim-shot" }, layerVelocity(l, 2));
  // a piccolo snare recorded just as fully (same articulations, same number of takes): which snare a default kit
  // takes must not hang on the order the instruments happen to be listed in
  for (let l = 1; l <= 3; l++) for (let r = 1; r <= 3; r++) add(`SnarePiccolo13/Piccolo Snare 13 center v${l} rr${r}.wav`, { family: "snare", instrument: PICCOLO, articulation: "centre" }, layerVelocity(l, 3));
  for (const l of [1, 2]) add(`SnarePiccolo13/Piccolo Snare 13 rimshot v${l} rr1.wav`, { family: "snare", instrument: PICCOLO, articulation: "rim-shot" }, layerVelocity(l, 2));
  // hats: closed in two layers, one open, one pedal
  for (const [l, dyn] of [[1, "p"], [2, "f"]] as const) for (const r of [1, 2]) add(`HiHat/hh_closed_${dyn}_${r2(r)}.wav`, { family: "hi-hat", instrument: HAT, articulation: "closed" }, layerVelocity(l, 2), 0.8);
  add("HiHat/hh_open_f_01.wav", { family: "hi-hat", instrument: HAT, articulation: "open" }, 110, 1.5);
  add("HiHat/hh_pedal_f_01.wav", { family: "hi-hat", instrument: HAT, articulation: "pedal" }, 100, 0.8);
  // a kick in two layers
  for (const l of [1, 2]) for (const r of [1, 2]) add(`Kick22/Kick22_v${l}_rr${r}.wav`, { family: "kick", instrument: KICK, articulation: "centre" }, layerVelocity(l, 2));
  // names that say little: two drums recorded as takes (sound only), one more take, and an ambiguous "bell"
  for (const [i, hz] of [[1, 160], [2, 160], [3, 100], [4, 100]] as const) {
    add(`Overdubs/take ${r2(i)}.wav`, { family: "tom", instrument: { diameterIn: hz > 120 ? 13 : 14, depthIn: 10, tuneHz: hz, floor: false }, articulation: "centre" }, 90 + i * 5);
  }
  add("Misc/take 07.wav", { family: "tom", instrument: { diameterIn: 13, depthIn: 10, tuneHz: 125, floor: false }, articulation: "centre" }, 100);
  add("Misc/bell hard 01.wav", { family: "cowbell", instrument: { lowHz: 560, highHz: 845 }, articulation: "hit" }, 120, 0.8);
  return out;
}

// ------------------------------------------------------------------ the run

let dir: string;
let ctx: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;
let worker: ChildProcess | null = null;
const log: string[] = [];
const files = folderSpec();

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "kw-agree-"));
  for (const f of files) {
    const chs = renderSound(f.sound, { sampleRate: 44_100, velocity: f.velocity, seed: f.path, channels: 1, seconds: f.seconds });
    fs.mkdirSync(path.join(dir, path.dirname(f.path)), { recursive: true });
    fs.writeFileSync(path.join(dir, f.path), encodeWav(chs, { sampleRate: 44_100, bits: 24 }));
  }
  ctx = await makeStudioWithRoles();
  const r = await call(libsRoute.POST, { params: { studioId: ctx.studio.id }, body: { name: uniq("Agreement") }, user: ctx.users.editor });
  libraryId = r.json.id;
  // the app's path: upload the same files with the same relative paths; the real worker measures and catalogues
  const { body, type } = await multipart(files.map((f) => ({ name: f.path, data: new Uint8Array(fs.readFileSync(path.join(dir, f.path))) })));
  const up = await call(uploadRoute.POST, { method: "POST", params: { studioId: ctx.studio.id, libraryId }, rawBody: body, headers: { "content-type": type }, user: ctx.users.editor });
  expect(up.status, JSON.stringify(up.json)).toBe(201);
  expect(up.json.counts).toEqual({ queued: files.length, duplicate: 0, refused: 0 });
  worker = startWorker(log);
  await waitForReady(log);
  const progress = () => call(progressRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer }).then((x) => x.json);
  await waitFor(progress, (p) => p.catalogued === files.length && p.pending === 0 && !p.cataloguing && p.healthComputedAt !== null, 180_000, "the worker to measure and sort the library");
}, 300_000);

afterAll(async () => {
  if (worker && worker.exitCode === null) {
    worker.kill("SIGTERM");
    await new Promise((r) => worker!.once("exit", r));
  }
  if (log.some((l) => /failed|could not/.test(l))) console.log(log.join("").slice(-3000));
  fs.rmSync(dir, { recursive: true, force: true });
  await db()("studios").whereIn("id", [ctx.studio.id, ctx.otherStudio.id]).delete();
  await closeQueues();
  await closeDb();
});

/** The library page's view of the library: its samples and instruments, through the routes the page calls. */
async function appCatalogue() {
  const s = await call(samplesRoute.GET, { path: "/api/test?pageSize=200&sort=path", params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
  expect(s.status).toBe(200);
  const i = await call(instrumentsRoute.GET, { params: { studioId: ctx.studio.id, libraryId }, user: ctx.users.viewer });
  expect(i.status).toBe(200);
  return { samples: s.json.rows as Record<string, unknown>[], instruments: i.json.instruments as { id: string; key: string; name: string; family: string; pitchHz: number | null; sampleCount: number }[] };
}

describe("the command line and the app give the same answers for the same files", () => {
  it("kitwright measure reads every file as the worker did", async () => {
    const r = await kitwright("measure", dir, "--json");
    expect(r.code, r.stderr).toBe(0);
    const records = JSON.parse(r.stdout) as { file: string; status: string; measurement: Record<string, unknown> }[];
    const stored = await db()("samples").where({ library_id: libraryId }).select("rel_path", "measurement");
    const byPath = new Map(stored.map((x) => [x.rel_path as string, typeof x.measurement === "string" ? JSON.parse(x.measurement) : x.measurement]));
    expect(records).toHaveLength(files.length);
    const diffs: string[] = [];
    for (const rec of records) {
      const rel = path.relative(dir, rec.file).split(path.sep).join("/");
      const app = byPath.get(rel);
      if (!app) {
        diffs.push(`${rel}: not in the app's library`);
        continue;
      }
      // the command line adds its cross-checks' warnings (music-metadata); the measured values must be equal
      const { warnings: _w1, ...cli } = rec.measurement;
      const { warnings: _w2, ...mine } = app as Record<string, unknown>;
      differences(cli, mine, `${rel}: measurement`, diffs);
    }
    expect(diffs).toEqual([]);
  }, 120_000);

  it("kitwright catalogue and the library page sort every file into the same family, articulation, instrument, layer and round robin; the instruments agree, pitch included", async () => {
    const r = await kitwright("catalogue", dir, "--json");
    expect(r.code, r.stderr).toBe(0);
    const cli = JSON.parse(r.stdout) as CliCatalogue;
    expect(cli.refused).toEqual([]);
    const app = await appCatalogue();
    expect(cli.samples.map((s) => s.path)).toEqual(files.map((f) => f.path).sort((a, b) => a.localeCompare(b)));
    const diffs = catalogueDifferences(cli, app);
    expect(diffs).toEqual([]);
    // the comparison had something to compare: several toms with a measured pitch, a snare with layers and round robins
    const toms = app.instruments.filter((i) => i.family === "tom" && i.pitchHz !== null);
    expect(toms.length).toBeGreaterThanOrEqual(3);
    const snare = app.samples.filter((s) => String(s.path).startsWith("Snare14/") && s.articulation === "centre");
    expect(new Set(snare.map((s) => s.layerCount))).toEqual(new Set([3]));
    expect(new Set(snare.map((s) => s.roundRobin))).toEqual(new Set([1, 2, 3]));
  }, 120_000);

  describe("kitwright audit and the app's audit of the five-piece trigger layout", () => {
    let serverAudit: AuditResult;
    let serverKit: Kit;
    let keyOf: Map<string, string>;

    beforeAll(async () => {
      const P = { studioId: ctx.studio.id };
      const l = await call(layoutsRoute.POST, { params: P, user: ctx.users.editor, body: { name: "Trigger five", template: "trigger-five" } });
      expect(l.status).toBe(201);
      // the app fills the kit from the studio's catalogue, as `kitwright audit` does when no kit is given
      const k = await call(kitsRoute.POST, { params: P, user: ctx.users.editor, body: { name: "Default kit", template: "trigger-five" } });
      expect(k.status).toBe(201);
      serverKit = k.json.kit.kit;
      const a = await call(auditsRoute.POST, { params: P, user: ctx.users.editor, body: { layoutId: l.json.layout.id, kitId: k.json.kit.id } });
      expect(a.status).toBe(201);
      serverAudit = a.json.audit.result;
      const rows = await db()("instruments").where({ library_id: libraryId }).select("id", "key");
      keyOf = new Map(rows.map((x) => [x.id as string, x.key as string]));
    });

    const compareAudits = (cliOut: string) => auditDifferences(cliOut, serverAudit, keyOf);

    it("with the kit each builds from its catalogue (toms by pitch): same kit, same findings", async () => {
      const r = await kitwright("audit", "--layout", "trigger-five", "--catalogue", dir, "--json");
      expect([0, 1]).toContain(r.code);
      expect(compareAudits(r.stdout)).toEqual([]);
      // the toms went somewhere: the layout's three tom slots were filled, high to low by the stored pitch
      const pitch = new Map((await db()("instruments").where({ library_id: libraryId }).select("id", "pitch_hz")).map((x) => [x.id as string, Number(x.pitch_hz)]));
      const tomPitches = ["tom-1", "tom-2", "tom-3"].map((id) => pitch.get(serverKit.slots.find((s) => s.id === id)?.instrumentId ?? "") ?? NaN);
      expect(tomPitches.every(Number.isFinite), JSON.stringify(tomPitches)).toBe(true);
      expect([...tomPitches].sort((a, b) => b - a)).toEqual(tomPitches);
    }, 120_000);

    it("with the app's kit given to the command line: same findings, pad by pad", async () => {
      const kitFile = path.join(dir, "..", `${path.basename(dir)}-kit.json`);
      const kit: Kit = { ...serverKit, slots: serverKit.slots.map((s) => ({ ...s, instrumentId: s.instrumentId ? keyOf.get(s.instrumentId) ?? s.instrumentId : null })) };
      fs.writeFileSync(kitFile, JSON.stringify(kitToFile(kit)));
      try {
        const r = await kitwright("audit", "--layout", "trigger-five", "--catalogue", dir, "--kit", kitFile, "--json");
        expect([0, 1]).toContain(r.code);
        expect(compareAudits(r.stdout)).toEqual([]);
      } finally {
        fs.rmSync(kitFile, { force: true });
      }
    }, 120_000);
  });
});
