// Kits and layouts over the API: CRUD, strict validation (422, nothing half-written), roles (viewer 403 on
// writes) and studio isolation (404 for another studio's ids).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../helpers";
import { smallCatalogue } from "./helpers";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import * as kitRoute from "@/app/api/studios/[studioId]/kits/[kitId]/route";
import * as kitCopy from "@/app/api/studios/[studioId]/kits/[kitId]/copy/route";
import * as kitExport from "@/app/api/studios/[studioId]/kits/[kitId]/export/route";
import * as kitImport from "@/app/api/studios/[studioId]/kits/import/route";
import * as instrumentsRoute from "@/app/api/studios/[studioId]/kits/instruments/route";
import * as layoutsRoute from "@/app/api/studios/[studioId]/layouts/route";
import * as layoutRoute from "@/app/api/studios/[studioId]/layouts/[layoutId]/route";
import * as layoutCopy from "@/app/api/studios/[studioId]/layouts/[layoutId]/copy/route";
import * as layoutExport from "@/app/api/studios/[studioId]/layouts/[layoutId]/export/route";
import * as layoutImport from "@/app/api/studios/[studioId]/layouts/import/route";
import { GM_PERCUSSION } from "@/lib/audit/templates";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let cat: Awaited<ReturnType<typeof smallCatalogue>>;
const P = () => ({ studioId: s.studio.id });

beforeAll(async () => {
  s = await makeStudioWithRoles();
  cat = await smallCatalogue(db(), s.studio.id);
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

const countRows = async (table: string) => Number((await db()(table).where({ studio_id: s.studio.id }).count({ n: "*" }))[0]!.n);

describe("kits", () => {
  it("creates, renames, changes slots, copies, exports, imports and deletes a kit; logs each change", async () => {
    const slots = [
      { id: "snare", name: "Snare A", family: "snare", instrumentId: cat.snare },
      { id: "tom-1", name: "Tom 1", family: "tom", instrumentId: cat.tomHigh },
      // a slot may hold an instrument of another family (the audit uses its own articulations)
      { id: "perc", name: "Perc", family: "snare", instrumentId: cat.cowbell, standIns: { "half-edge": "hit" } },
    ];
    const c = await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Room kit", slots } });
    expect(c.status).toBe(201);
    const kitId = c.json.kit.id as string;
    expect(c.json.kit.kit.slots.map((x: { id: string }) => x.id)).toEqual(["snare", "tom-1", "perc"]);
    expect(c.json.kit.kit.slots[2].standIns).toEqual({ "half-edge": "hit" });

    const r = await call(kitRoute.PATCH, { method: "PATCH", params: { ...P(), kitId }, user: s.users.owner, body: { name: "Room kit B" } });
    expect(r.status).toBe(200);
    expect(r.json.kit.name).toBe("Room kit B");
    expect(r.json.kit.kit.slots).toHaveLength(3);

    const cp = await call(kitCopy.POST, { params: { ...P(), kitId }, user: s.users.editor, body: {} });
    expect(cp.status).toBe(201);
    expect(cp.json.kit.name).toBe("Room kit B (copy)");
    expect(cp.json.kit.id).not.toBe(kitId);

    const ex = await call(kitExport.GET, { params: { ...P(), kitId }, user: s.users.viewer });
    expect(ex.status).toBe(200);
    expect(ex.res.headers.get("content-disposition")).toContain("attachment");
    expect(ex.json.schema).toBe("kitwright.kit/v2");
    expect(ex.json.kit.slots[0]).toEqual(slots[0]);

    const im = await call(kitImport.POST, { params: P(), user: s.users.editor, body: ex.json });
    expect(im.status).toBe(201);
    expect(im.json.kit.kit.slots).toEqual(ex.json.kit.slots);

    const list = await call(kitsRoute.GET, { params: P(), user: s.users.viewer });
    expect(list.json.kits.filter((k: { name: string }) => k.name.startsWith("Room kit B"))).toHaveLength(3);

    const d = await call(kitRoute.DELETE, { method: "DELETE", params: { ...P(), kitId }, user: s.users.editor });
    expect(d.status).toBe(204);
    expect((await call(kitRoute.GET, { params: { ...P(), kitId }, user: s.users.owner })).status).toBe(404);
    const actions = (await db()("activity").where({ studio_id: s.studio.id, subject_type: "kit" }).select("action")).map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(["kit.created", "kit.renamed", "kit.deleted"]));
  });

  it("refuses unknown fields, bad families, duplicate slot ids, another studio's instrument and bad JSON with 422, writing nothing", async () => {
    const before = await countRows("kits");
    const bad = [
      { name: "x", colour: "red" },
      { name: "x", slots: [{ id: "a", name: "A", family: "gong", instrumentId: null }] },
      { name: "x", slots: [{ id: "a", name: "A", family: "kick", instrumentId: null }, { id: "a", name: "B", family: "kick", instrumentId: null }] },
      { name: "x", slots: [{ id: "a", name: "A", family: "kick", instrumentId: null, extra: 1 }] },
      { name: "x", slots: [{ id: "a", name: "A", family: "kick", instrumentId: "not-an-instrument-here" }] },
      { name: "" },
    ];
    for (const body of bad) {
      const r = await call(kitsRoute.POST, { params: P(), user: s.users.editor, body });
      expect(r.status, JSON.stringify(body)).toBe(422);
      expect(r.json.error.code).toBe("invalid-input");
    }
    const raw = await call(kitsRoute.POST, { params: P(), user: s.users.editor, rawBody: "{ not json", headers: { "content-type": "application/json" } });
    expect(raw.status).toBe(422);
    const wrongSchema = await call(kitImport.POST, { params: P(), user: s.users.editor, body: { schema: "kitwright.kit/v9", kit: { id: "k", name: "k", slots: [] } } });
    expect(wrongSchema.status).toBe(422);
    expect(await countRows("kits")).toBe(before);
  });

  it("fills a kit from the catalogue for a template, toms high to low by measured pitch", async () => {
    const r = await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "From grid", template: "grid-24" } });
    expect(r.status).toBe(201);
    const slots = r.json.kit.kit.slots as Array<{ id: string; instrumentId: string | null }>;
    const by = Object.fromEntries(slots.map((x) => [x.id, x.instrumentId]));
    expect(by["snare"]).toBe(cat.snare);
    expect(by["kick"]).toBe(cat.kick);
    // common practice, no published source: toms are numbered from high to low pitch (196 Hz before 82 Hz)
    expect(by["tom-1"]).toBe(cat.tomHigh);
    expect(by["tom-2"]).toBe(cat.tomLow);
    expect(by["crash-1"]).toBeNull();
  });

  it("lists the studio's instruments with family, library and sample counts", async () => {
    const r = await call(instrumentsRoute.GET, { params: P(), user: s.users.viewer });
    expect(r.status).toBe(200);
    const kick = r.json.instruments.find((i: { id: string }) => i.id === cat.kick);
    expect(kick).toMatchObject({ family: "kick", libraryName: "Test room kit", sampleCount: 12, articulations: ["centre"] });
  });
});

describe("layouts", () => {
  it("creates from each kind (template, grid, zones), renames, saves pads, copies, exports, imports, deletes", async () => {
    const gm = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body: { name: "GM", template: "gm-percussion" } });
    expect(gm.status).toBe(201);
    // General MIDI Level 1 percussion map: 47 notes, 35-81, channel 10 (MMA GM Level 1 specification)
    expect(gm.json.layout.layout.pads.map((p: { note: number }) => p.note)).toEqual(GM_PERCUSSION.map((g) => g.note));
    expect(gm.json.layout.layout.pads.every((p: { channel: number }) => p.channel === 10)).toBe(true);

    const grid = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Blank 2x4", grid: { rows: 2, cols: 4 } } });
    expect(grid.status).toBe(201);
    const lay = grid.json.layout.layout;
    expect(lay.surface).toEqual({ kind: "grid", rows: 2, cols: 4 });
    expect(lay.pads).toHaveLength(8);
    const layoutId = grid.json.layout.id as string;

    const zones = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Zones", zones: 3 } });
    expect(zones.json.layout.layout.pads).toHaveLength(3);

    // save: two pads sharing a note, a target, a pedal
    const pads = lay.pads.map((p: Record<string, unknown>, i: number) => ({ ...p, note: i < 2 ? 38 : p.note, target: i < 2 ? { slotId: "snare", articulation: "centre" } : null }));
    const hiHatPedal = { controller: 4, channel: 10, slotId: "hi-hat", closedAt: "high", zones: [{ low: 0, high: 63, articulation: "open" }, { low: 64, high: 127, articulation: "closed" }], chickNote: 44 };
    const { id: _id, ...content } = { ...lay, pads, hiHatPedal };
    const sv = await call(layoutRoute.PATCH, { method: "PATCH", params: { ...P(), layoutId }, user: s.users.editor, body: { layout: content } });
    expect(sv.status).toBe(200);
    expect(sv.json.layout.layout.pads[1].target).toEqual({ slotId: "snare", articulation: "centre" });
    expect(sv.json.layout.layout.hiHatPedal.zones).toHaveLength(2);

    const rn = await call(layoutRoute.PATCH, { method: "PATCH", params: { ...P(), layoutId }, user: s.users.owner, body: { name: "Strip" } });
    expect(rn.json.layout.name).toBe("Strip");
    expect(rn.json.layout.layout.pads[0].note).toBe(38);

    const cp = await call(layoutCopy.POST, { params: { ...P(), layoutId }, user: s.users.editor, body: { name: "Strip 2" } });
    expect(cp.status).toBe(201);
    expect(cp.json.layout.layout.pads).toEqual(rn.json.layout.layout.pads);

    const ex = await call(layoutExport.GET, { params: { ...P(), layoutId }, user: s.users.viewer });
    expect(ex.json.schema).toBe("kitwright.layout/v2");
    const im = await call(layoutImport.POST, { params: P(), user: s.users.editor, body: ex.json });
    expect(im.status).toBe(201);
    expect(im.json.layout.layout.hiHatPedal).toEqual(ex.json.layout.hiHatPedal);

    expect((await call(layoutRoute.DELETE, { method: "DELETE", params: { ...P(), layoutId }, user: s.users.editor })).status).toBe(204);
    expect((await call(layoutRoute.GET, { params: { ...P(), layoutId }, user: s.users.editor })).status).toBe(404);
  });

  it("refuses bad layouts with 422 and keeps the stored one unchanged", async () => {
    const before = await countRows("layouts");
    for (const body of [
      { name: "x", grid: { rows: 8, cols: 9 } }, // 72 pads > 64
      { name: "x", template: "no-such" },
      { name: "x", grid: { rows: 2, cols: 2 }, template: "grid-24" },
      { name: "x", grid: { rows: 2, cols: 2 }, shape: "round" },
    ]) {
      const r = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body });
      expect(r.status, JSON.stringify(body)).toBe(422);
    }
    expect(await countRows("layouts")).toBe(before);

    const g = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Keep", grid: { rows: 1, cols: 2 } } });
    const layoutId = g.json.layout.id;
    const lay = g.json.layout.layout;
    const { id: _i, ...content } = lay;
    const variants = [
      { ...content, pads: [{ ...lay.pads[0], note: 128 }, lay.pads[1]] },
      { ...content, pads: [{ ...lay.pads[0], channel: 0 }, lay.pads[1]] },
      { ...content, pads: [{ ...lay.pads[0], col: 2 }, lay.pads[1]] }, // two pads in one cell
      { ...content, pads: [{ ...lay.pads[0], velocity: 3 }, lay.pads[1]] },
      { ...content, pads: [{ ...lay.pads[0], target: { slotId: "snare", articulation: "thwack" } }, lay.pads[1]] },
      { ...content, hiHatPedal: { controller: 120, channel: 10, slotId: "hh", closedAt: "high", zones: [{ low: 0, high: 127, articulation: "closed" }], chickNote: null } },
    ];
    for (const v of variants) {
      const r = await call(layoutRoute.PATCH, { method: "PATCH", params: { ...P(), layoutId }, user: s.users.editor, body: { layout: v } });
      expect(r.status).toBe(422);
    }
    const after = await call(layoutRoute.GET, { params: { ...P(), layoutId }, user: s.users.viewer });
    expect(after.json.layout.layout).toEqual(lay);
  });
});

describe("roles and studio isolation", () => {
  it("viewers read and export but cannot write (403); another studio's member gets 404 for every id", async () => {
    const k = await call(kitsRoute.POST, { params: P(), user: s.users.owner, body: { name: "Iso kit" } });
    const l = await call(layoutsRoute.POST, { params: P(), user: s.users.owner, body: { name: "Iso layout", zones: 1 } });
    const kitId = k.json.kit.id;
    const layoutId = l.json.layout.id;
    const v = s.users.viewer;
    expect((await call(kitsRoute.POST, { params: P(), user: v, body: { name: "no" } })).status).toBe(403);
    expect((await call(kitRoute.PATCH, { method: "PATCH", params: { ...P(), kitId }, user: v, body: { name: "no" } })).status).toBe(403);
    expect((await call(kitRoute.DELETE, { method: "DELETE", params: { ...P(), kitId }, user: v })).status).toBe(403);
    expect((await call(kitCopy.POST, { params: { ...P(), kitId }, user: v, body: {} })).status).toBe(403);
    expect((await call(layoutsRoute.POST, { params: P(), user: v, body: { name: "no", zones: 1 } })).status).toBe(403);
    expect((await call(layoutRoute.DELETE, { method: "DELETE", params: { ...P(), layoutId }, user: v })).status).toBe(403);
    expect((await call(kitRoute.GET, { params: { ...P(), kitId }, user: v })).status).toBe(200);
    expect((await call(layoutExport.GET, { params: { ...P(), layoutId }, user: v })).status).toBe(200);

    // the outsider owns another studio: our ids under their studio are 404, and our studio is 404 to them
    const other = { studioId: s.otherStudio.id };
    const o = s.users.outsider;
    expect((await call(kitRoute.GET, { params: { ...other, kitId }, user: o })).status).toBe(404);
    expect((await call(kitRoute.PATCH, { method: "PATCH", params: { ...other, kitId }, user: o, body: { name: "x" } })).status).toBe(404);
    expect((await call(kitExport.GET, { params: { ...other, kitId }, user: o })).status).toBe(404);
    expect((await call(layoutRoute.GET, { params: { ...other, layoutId }, user: o })).status).toBe(404);
    expect((await call(layoutCopy.POST, { params: { ...other, layoutId }, user: o, body: {} })).status).toBe(404);
    expect((await call(layoutRoute.DELETE, { method: "DELETE", params: { ...other, layoutId }, user: o })).status).toBe(404);
    expect((await call(kitRoute.GET, { params: { ...P(), kitId }, user: o })).status).toBe(404);
    // another studio's instrument cannot be put into a kit
    const r = await call(kitsRoute.POST, { params: other, user: o, body: { name: "steal", slots: [{ id: "a", name: "A", family: "snare", instrumentId: cat.snare }] } });
    expect(r.status).toBe(422);
  });
});
