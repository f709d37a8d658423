// Audits over the API: run on catalogue rows written like the cataloguing job writes them, exact outcomes,
// the saved audit re-read, comparison after new samples arrive, exports, roles and studio isolation.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseMidi } from "midi-file";
import { db } from "@/lib/server/db";
import { NextRequest } from "next/server";
import { env } from "@/lib/server/env";
import { call, makeStudioWithRoles, sessionCookie } from "../helpers";
import { addLayerGroup, evenLayers, smallCatalogue } from "./helpers";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import * as layoutsRoute from "@/app/api/studios/[studioId]/layouts/route";
import * as layoutRoute from "@/app/api/studios/[studioId]/layouts/[layoutId]/route";
import * as auditsRoute from "@/app/api/studios/[studioId]/audits/route";
import * as auditRoute from "@/app/api/studios/[studioId]/audits/[auditId]/route";
import * as exportRoute from "@/app/api/studios/[studioId]/audits/[auditId]/export/route";
import * as soundsRoute from "@/app/api/studios/[studioId]/audits/[auditId]/sounds/route";
import * as compareRoute from "@/app/api/studios/[studioId]/audits/compare/route";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let cat: Awaited<ReturnType<typeof smallCatalogue>>;
let kitId: string;
let layoutId: string;
let firstAuditId: string;
const P = () => ({ studioId: s.studio.id });

const pad = (id: string, label: string, row: number, col: number, note: number, slotId: string, articulation: string) => ({ id, label, row, col, note, channel: 10, target: { slotId, articulation } });

beforeAll(async () => {
  s = await makeStudioWithRoles();
  cat = await smallCatalogue(db(), s.studio.id);
  const k = await call(kitsRoute.POST, {
    params: P(), user: s.users.editor, body: {
      name: "Audit kit", slots: [
        { id: "snare", name: "Snare A", family: "snare", instrumentId: cat.snare },
        { id: "kick", name: "Kick", family: "kick", instrumentId: cat.kick },
        { id: "ride", name: "Ride", family: "ride", instrumentId: cat.ride },
        { id: "cowbell", name: "Cowbell", family: "cowbell", instrumentId: cat.cowbell },
        { id: "crash", name: "Crash", family: "crash", instrumentId: null },
      ],
    },
  });
  kitId = k.json.kit.id;
  const l = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Audit strip", grid: { rows: 2, cols: 3 } } });
  layoutId = l.json.layout.id;
  const pads = [
    pad("r1c1", "Snare", 1, 1, 38, "snare", "centre"),
    pad("r1c2", "Snare half-edge", 1, 2, 88, "snare", "half-edge"),
    pad("r1c3", "Kick", 1, 3, 36, "kick", "centre"),
    pad("r2c1", "Ride bell", 2, 1, 53, "ride", "bell"),
    pad("r2c2", "Cowbell", 2, 2, 56, "cowbell", "hit"),
    pad("r2c3", "Crash", 2, 3, 49, "crash", "crash-hit"),
  ];
  const r = await call(layoutRoute.PATCH, { method: "PATCH", params: { ...P(), layoutId }, user: s.users.editor, body: { layout: { name: "Audit strip", surface: { kind: "grid", rows: 2, cols: 3 }, pads, hiHatPedal: null } } });
  expect(r.status).toBe(200);
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

describe("running an audit", () => {
  it("finds direct, stand-in and silent pads exactly, saves the audit and reads it back", async () => {
    const r = await call(auditsRoute.POST, { params: P(), user: s.users.editor, body: { layoutId, kitId } });
    expect(r.status).toBe(201);
    const a = r.json.audit;
    firstAuditId = a.id;
    const by = Object.fromEntries(a.result.pads.map((p: { padId: string }) => [p.padId, p]));
    expect(by.r1c1).toMatchObject({ outcome: "direct", plays: "centre", minRoundRobins: 2, velocityGaps: [] });
    expect(by.r1c1.layers.map((l: { velocityLow: number; velocityHigh: number }) => [l.velocityLow, l.velocityHigh])).toEqual([[1, 42], [43, 84], [85, 127]]);
    // common practice, no published source (SCHEMA.md weights): half-edge is 1 from centre and 1 from edge; ties go to the
    // family's first articulation, so a missing half-edge plays the centre hit
    expect(by.r1c2).toMatchObject({ outcome: "stand-in", plays: "centre", standIn: { path: ["half-edge", "centre"], cost: 1, source: "graph" } });
    expect(by.r1c3).toMatchObject({ outcome: "direct", plays: "centre", minRoundRobins: 3 });
    // common practice, no published source: a ride with no bell recorded answers the bell pad with its bow (bell 2 from bow)
    expect(by.r2c1).toMatchObject({ outcome: "stand-in", plays: "bow", standIn: { path: ["bell", "bow"], cost: 2 } });
    expect(by.r2c2).toMatchObject({ outcome: "silent", plays: null });
    expect(by.r2c3).toMatchObject({ outcome: "silent", plays: null });
    expect(a.result.summary).toMatchObject({ pads: 6, direct: 2, standIn: 2, silent: 2 });
    // the empty slot is told once, apart from the conflicts (SCHEMA.md "kitwright.audit/v3")
    expect(a.result.conflicts).toEqual([]);
    expect(a.result.emptySlots.map((g: { padIds: string[] }) => g.padIds)).toEqual([["r2c3"]]);
    // SCHEMA.md score: 100 * (1 + 0.9 + 1 + 0.8 + 0 + 0) / 6 = 61.67 -> 62
    expect(a.result.score.value).toBe(62);
    expect(a.score).toBe(62);
    expect(a.silentPads).toBe(2);

    const back = await call(auditRoute.GET, { params: { ...P(), auditId: a.id }, user: s.users.viewer });
    expect(back.status).toBe(200);
    expect(back.json.audit.result).toEqual(a.result);
    const list = await call(auditsRoute.GET, { params: P(), path: `/api/x?layoutId=${layoutId}`, user: s.users.viewer });
    expect(list.json.audits.map((x: { id: string }) => x.id)).toEqual([a.id]);
  });

  it("gives audition the layers and sample ids of the instruments the findings name", async () => {
    const r = await call(soundsRoute.GET, { params: { ...P(), auditId: firstAuditId }, user: s.users.viewer });
    expect(r.status).toBe(200);
    const ids = r.json.instruments.map((i: { id: string }) => i.id).sort();
    expect(ids).toEqual([cat.snare, cat.kick, cat.ride, cat.cowbell].sort());
    const snare = r.json.instruments.find((i: { id: string }) => i.id === cat.snare);
    expect(snare.libraryId).toBe(cat.libraryId);
    expect(snare.articulations.find((x: { articulation: string }) => x.articulation === "centre").layers[0].sampleIds).toHaveLength(2);
  });

  it("compares with a later audit after new samples arrived", async () => {
    // the cowbell's hits are catalogued now
    await addLayerGroup(db(), s.studio.id, cat.libraryId, "cowbell", "hit", evenLayers(2, 4));
    const r = await call(auditsRoute.POST, { params: P(), user: s.users.owner, body: { layoutId, kitId } });
    const after = r.json.audit;
    expect(after.result.pads.find((p: { padId: string }) => p.padId === "r2c2")).toMatchObject({ outcome: "direct", plays: "hit", minRoundRobins: 4 });
    expect(after.silentPads).toBe(1);
    const c = await call(compareRoute.GET, { params: P(), path: `/api/x?before=${firstAuditId}&after=${after.id}`, user: s.users.viewer });
    expect(c.status).toBe(200);
    const change = c.json.diff.changes.find((x: { id: string }) => x.id === "pad:r2c2");
    expect(change.change).toBe("changed");
    expect(change.details).toContain("outcome silent -> direct");
    // (1+0.9+1+0.8+1+0)/6*100 = 78.33 -> 78
    expect(c.json.diff.scoreAfter).toBe(78);
    expect(c.json.diff.scoreDelta).toBe(16);
    expect(c.json.diff.changes.map((x: { id: string }) => x.id)).toEqual(["pad:r2c2"]);
  });

  it("reads an audit stored in the earlier shape (v1) on today's scale, and upgrades the row once", async () => {
    const row = await db()("audits").where({ id: firstAuditId }).first();
    const now = typeof row.result === "string" ? JSON.parse(row.result) : structuredClone(row.result);
    // as version 1 stored it: the empty slot also a conflict, 5 points off per conflict
    const { emptySlots: _e, ...rest } = now;
    const v1 = {
      ...rest,
      conflicts: [{ kind: "empty-slot", message: 'slot "Crash" is empty', padIds: ["r2c3"], note: null, channel: null }],
      summary: { ...now.summary, conflicts: 1 },
      score: { value: 56.7, formula: "score = clamp(100 * sum(item) / items - 5 * conflicts, 0, 100)", items: 6, itemSum: 3.7, conflictPenalty: 5 },
    };
    const id = "00000000-0000-4000-8000-0000000000a1";
    await db()("audits").insert({ ...row, id, score: 56.7, conflicts: 1, result: JSON.stringify(v1), result_version: 1, created_at: new Date("2026-01-01T00:00:00Z") });
    const one = await call(auditRoute.GET, { params: { ...P(), auditId: id }, user: s.users.viewer });
    expect(one.json.audit.result.score).toMatchObject({ value: 62, outOf: 100 });
    expect(one.json.audit.result.conflicts).toEqual([]);
    expect(one.json.audit.result.emptySlots).toEqual([{ slotId: "crash", slotName: "Crash", padIds: ["r2c3"], labels: ["Crash"] }]);
    expect(one.json.audit.score).toBe(62);
    const list = await call(auditsRoute.GET, { params: P(), path: `/api/x?layoutId=${layoutId}`, user: s.users.viewer });
    expect(list.json.audits.find((x: { id: string }) => x.id === id)).toMatchObject({ score: 62, conflicts: 0 });
    const after = await db()("audits").where({ id }).first("score", "conflicts", "result_version");
    expect([Number(after.score), Number(after.conflicts), Number(after.result_version)]).toEqual([62, 0, 3]);
    await db()("audits").where({ id }).delete();
  });

  it("refuses to compare audits of two different layouts (422)", async () => {
    const l2 = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Other", template: "grid-2x8" } });
    const a2 = await call(auditsRoute.POST, { params: P(), user: s.users.editor, body: { layoutId: l2.json.layout.id, kitId } });
    expect(a2.status).toBe(201);
    const c = await call(compareRoute.GET, { params: P(), path: `/api/x?before=${firstAuditId}&after=${a2.json.audit.id}`, user: s.users.viewer });
    expect(c.status).toBe(422);
  });

  it("refuses bad run requests with 422 / 404 and saves nothing", async () => {
    const before = Number((await db()("audits").where({ studio_id: s.studio.id }).count({ n: "*" }))[0]!.n);
    expect((await call(auditsRoute.POST, { params: P(), user: s.users.editor, body: { layoutId, kitId, extra: true } })).status).toBe(422);
    expect((await call(auditsRoute.POST, { params: P(), user: s.users.editor, body: { layoutId: "nope", kitId } })).status).toBe(422);
    expect((await call(auditsRoute.POST, { params: P(), user: s.users.editor, body: { layoutId, kitId: "00000000-0000-4000-8000-000000000000" } })).status).toBe(404);
    expect(Number((await db()("audits").where({ studio_id: s.studio.id }).count({ n: "*" }))[0]!.n)).toBe(before);
  });
});

describe("exports", () => {
  it("CSV: RFC 4180 header row of SCHEMA.md, conflicts first, one row per pad", async () => {
    const r = await call(exportRoute.GET, { params: { ...P(), auditId: firstAuditId }, path: "/api/x?format=csv", user: s.users.viewer });
    expect(r.status).toBe(200);
    expect(r.res.headers.get("content-type")).toContain("text/csv");
    expect(r.res.headers.get("content-disposition")).toMatch(/^attachment; filename=".*\.csv"/);
    const lines = (r.json as string).split("\r\n");
    expect(lines[0]).toBe("kind,id,label,note,channel,row,col,zone,slot,instrument,requested,outcome,plays,path,cost,layers,velocity_gaps,min_round_robins,reason,edges");
    expect(lines[1]!.startsWith("empty-slot,")).toBe(true);
    expect(lines.filter((l) => l.startsWith("pad,"))).toHaveLength(6);
    expect(lines.find((l) => l.startsWith("pad,r1c2,"))).toContain("half-edge>centre");
  });

  it("JSON carries the kitwright.audit/v3 schema id and the findings", async () => {
    const r = await call(exportRoute.GET, { params: { ...P(), auditId: firstAuditId }, path: "/api/x?format=json", user: s.users.viewer });
    expect(r.status).toBe(200);
    expect(r.json.schema).toBe("kitwright.audit/v3");
    expect(r.json.pads).toHaveLength(6);
    expect(r.json.score.formula).toContain("score =");
  });

  it("Standard MIDI File: starts with MThd, audio/midi attachment, parsed back by midi-file", async () => {
    const r = await call(exportRoute.GET, { params: { ...P(), auditId: firstAuditId }, path: "/api/x?format=midi", user: s.users.viewer });
    expect(r.status).toBe(200);
    expect(r.res.headers.get("content-type")).toBe("audio/midi");
    expect(r.res.headers.get("content-disposition")).toMatch(/filename=".*\.mid"/);
    // the call helper read the body as text; ask again for the raw bytes
    const cookie = (await sessionCookie(s.users.viewer))!;
    const r2 = await exportRoute.GET(new NextRequest(new URL("/api/x?format=midi", env().KW_APP_URL), { headers: { cookie, host: new URL(env().KW_APP_URL).host } }), { params: Promise.resolve({ ...P(), auditId: firstAuditId }) });
    const bytes = new Uint8Array(await r2.arrayBuffer());
    // SMF 1.0: header chunk "MThd", length 6, format 1
    expect(String.fromCharCode(...bytes.slice(0, 4))).toBe("MThd");
    const midi = parseMidi(bytes);
    expect(midi.header.format).toBe(1);
    const notes = midi.tracks[1]!.filter((e) => e.type === "noteOn") as Array<{ channel: number; noteNumber: number; velocity: number }>;
    // sounding pads only: snare 3 layers, half-edge 3, kick 4, ride bell 2 -> 12 notes on channel 10 (0-based 9)
    expect(notes).toHaveLength(12);
    expect(notes.every((n) => n.channel === 9)).toBe(true);
    // middle velocity floor((1 + 42) / 2) = 21 for the snare's softest layer
    expect(notes[0]).toMatchObject({ noteNumber: 38, velocity: 21 });
  });

  it("viewers open and export but cannot run audits; other studios get 404 for every id", async () => {
    expect((await call(auditsRoute.POST, { params: P(), user: s.users.viewer, body: { layoutId, kitId } })).status).toBe(403);
    for (const format of ["csv", "json", "midi"]) {
      expect((await call(exportRoute.GET, { params: { ...P(), auditId: firstAuditId }, path: `/api/x?format=${format}`, user: s.users.viewer })).status).toBe(200);
    }
    const other = { studioId: s.otherStudio.id };
    const o = s.users.outsider;
    expect((await call(auditRoute.GET, { params: { ...other, auditId: firstAuditId }, user: o })).status).toBe(404);
    expect((await call(exportRoute.GET, { params: { ...other, auditId: firstAuditId }, path: "/api/x?format=csv", user: o })).status).toBe(404);
    expect((await call(soundsRoute.GET, { params: { ...other, auditId: firstAuditId }, user: o })).status).toBe(404);
    expect((await call(compareRoute.GET, { params: other, path: `/api/x?before=${firstAuditId}&after=${firstAuditId}`, user: o })).status).toBe(404);
    expect((await call(auditsRoute.POST, { params: other, user: o, body: { layoutId, kitId } })).status).toBe(404);
    expect((await call(auditsRoute.GET, { params: other, path: `/api/x?layoutId=${layoutId}`, user: o })).status).toBe(404);
    expect((await call(auditRoute.GET, { params: { ...P(), auditId: firstAuditId }, user: o })).status).toBe(404);
  });
});
