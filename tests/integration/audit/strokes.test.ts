// A studio's own strokes over the API: add (roles, refusals), aim pads at them, audit with a stand-in through the
// studio's edge, a conga in the snare slot with a stroke map, rename and remove a stroke in use (its samples, kits'
// maps and layouts' pads move; nothing is dropped), and layout files carrying the strokes into another studio.
// The strokes, instruments and samples are a scenario of our own.
import crypto from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../helpers";
import { addInstrument, makeLibrary } from "./helpers";
import * as strokesRoute from "@/app/api/studios/[studioId]/strokes/route";
import * as strokeRoute from "@/app/api/studios/[studioId]/strokes/[strokeId]/route";
import * as usesRoute from "@/app/api/studios/[studioId]/strokes/[strokeId]/uses/route";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import * as kitRoute from "@/app/api/studios/[studioId]/kits/[kitId]/route";
import * as layoutsRoute from "@/app/api/studios/[studioId]/layouts/route";
import * as layoutRoute from "@/app/api/studios/[studioId]/layouts/[layoutId]/route";
import * as layoutExport from "@/app/api/studios/[studioId]/layouts/[layoutId]/export/route";
import * as layoutImport from "@/app/api/studios/[studioId]/layouts/import/route";
import * as auditsRoute from "@/app/api/studios/[studioId]/audits/route";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;
const ids: Record<string, string> = {};
const P = () => ({ studioId: s.studio.id });

beforeAll(async () => {
  s = await makeStudioWithRoles();
  libraryId = await makeLibrary(db(), s.studio.id, "Percussion room");
  ids.snare = await addInstrument(db(), s.studio.id, libraryId, { key: "snare", name: "Snare 14", family: "snare", articulations: { centre: [3, 2], "rim-shot": [2, 2] } });
  ids.conga = await addInstrument(db(), s.studio.id, libraryId, { key: "conga", name: "Conga", family: "hand-drum", articulations: { "open-tone": [2, 2], slap: [2, 2], rim: [1, 1], mute: [1, 1] } });
  ids.cowbell = await addInstrument(db(), s.studio.id, libraryId, { key: "cowbell", name: "Cowbell", family: "cowbell", articulations: { tip: [2, 1], shank: [2, 1], throat: [1, 1] } });
  // three samples sorted into a stroke the studio is about to add (as the cataloguing writes them)
  await db()("samples").insert(["a", "b", "c"].map((n, i) => ({
    id: crypto.randomUUID(), studio_id: s.studio.id, library_id: libraryId, rel_path: `Snare/snare_buzzrim_${n}.wav`, path_key: `Snare/snare_buzzrim_${n}.wav`, file_name: `snare_buzzrim_${n}.wav`,
    sha256: crypto.randomBytes(32).toString("hex"), size_bytes: 100, storage_key: `t/${crypto.randomUUID()}`, state: "catalogued", family: "snare", articulation: "buzz-rim-shot",
    articulation_source: "name", uploaded_by: s.users.owner.id, ...(i === 0 ? { confirmed_articulation: "buzz-rim-shot" } : {}),
  })));
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

const buzz = { name: "Buzz rim shot", families: ["snare"], words: ["buzzrim", "buzz rim"], neighbours: [{ to: "rim-shot", cost: 0.5 }, { to: "buzz", cost: 1 }] };

describe("a studio's own strokes", () => {
  it("editors add strokes, viewers cannot; built-in names, unknown neighbours and clashes are refused with reasons", async () => {
    const viewer = await call(strokesRoute.POST, { params: P(), user: s.users.viewer, body: buzz });
    expect(viewer.status).toBe(403);
    const made = await call(strokesRoute.POST, { params: P(), user: s.users.editor, body: buzz });
    expect(made.status).toBe(201);
    expect(made.json.stroke).toEqual({ id: "buzz-rim-shot", name: "Buzz rim shot", families: ["snare"], words: ["buzzrim", "buzz rim"], neighbours: buzz.neighbours });
    expect((await call(strokesRoute.POST, { params: P(), user: s.users.editor, body: buzz })).status).toBe(409);
    const builtIn = await call(strokesRoute.POST, { params: P(), user: s.users.editor, body: { ...buzz, name: "Rim shot" } });
    expect(builtIn.status).toBe(422);
    expect(builtIn.json.error.message).toMatch(/built-in stroke/);
    const lost = await call(strokesRoute.POST, { params: P(), user: s.users.editor, body: { ...buzz, name: "Lost", neighbours: [{ to: "nowhere", cost: 1 }] } });
    expect(lost.status).toBe(422);
    expect(lost.json.error.message).toMatch(/no stroke "nowhere"/);
    const badCost = await call(strokesRoute.POST, { params: P(), user: s.users.editor, body: { ...buzz, name: "Odd", neighbours: [{ to: "centre", cost: 0.7 }] } });
    expect(badCost.status).toBe(422);
    expect((await call(strokesRoute.POST, { params: P(), user: s.users.editor, body: { name: "Throat", families: ["cowbell"], words: ["throat"], neighbours: [{ to: "shank", cost: 1 }] } })).status).toBe(201);

    const list = await call(strokesRoute.GET, { params: P(), user: s.users.viewer });
    expect(list.status).toBe(200);
    expect(list.json.builtIn.cowbell).toEqual(expect.arrayContaining(["tip", "shank"]));
    expect(list.json.builtIn["hand-drum"]).toEqual(expect.arrayContaining(["bass", "finger", "rim"]));
    expect(list.json.strokes.map((x: { id: string }) => x.id)).toEqual(["buzz-rim-shot", "throat"]);
    const file = await call(strokesRoute.GET, { params: P(), user: s.users.viewer, path: "/api/test?download=1" });
    expect(file.res.headers.get("content-disposition")).toContain("attachment");
    expect(file.json.schema).toBe("kitwright.strokes/v1");
    // another studio does not see them
    const other = await call(strokesRoute.GET, { params: { studioId: s.otherStudio.id }, user: s.users.outsider });
    expect(other.json.strokes).toEqual([]);
  });

  let layoutId = "";
  let kitId = "";
  it("pads aim at them, a stroke the studio lacks is refused, and the audit plays a stand-in through the studio's edge", async () => {
    const l = await call(layoutsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Hand kit", zones: 5 } });
    layoutId = l.json.layout.id;
    const pads = l.json.layout.layout.pads.map((p: { id: string }, i: number) => ({
      ...p,
      target: [{ slotId: "snare", articulation: "buzz-rim-shot" }, { slotId: "perc", articulation: "rim-shot" }, { slotId: "perc", articulation: "cross-stick" }, { slotId: "bell", articulation: "tip" }, { slotId: "bell", articulation: "throat" }][i],
    }));
    const layout = { ...l.json.layout.layout, pads };
    delete layout.id;
    const unknown = await call(layoutRoute.PATCH, { method: "PATCH", params: { ...P(), layoutId }, user: s.users.editor, body: { layout: { ...layout, pads: pads.map((p: { target: object }, i: number) => (i === 0 ? { ...p, target: { slotId: "snare", articulation: "ghost-drag" } } : p)) } } });
    expect(unknown.status).toBe(422);
    expect(unknown.json.error.message).toMatch(/No stroke “ghost-drag”/);
    expect((await call(layoutRoute.PATCH, { method: "PATCH", params: { ...P(), layoutId }, user: s.users.editor, body: { layout } })).status).toBe(200);

    const slots = [
      { id: "snare", name: "Snare", family: "snare", instrumentId: ids.snare },
      { id: "perc", name: "Snare 2", family: "snare", instrumentId: ids.conga },
      { id: "bell", name: "Cowbell", family: "cowbell", instrumentId: ids.cowbell },
    ];
    const k = await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Hand kit", slots } });
    expect(k.status).toBe(201);
    kitId = k.json.kit.id;

    const a = await call(auditsRoute.POST, { params: P(), user: s.users.editor, body: { layoutId, kitId } });
    expect(a.status).toBe(201);
    const pad = (i: number) => a.json.audit.result.pads[i];
    expect(pad(0)).toMatchObject({ requested: "buzz-rim-shot", plays: "rim-shot", outcome: "stand-in" });
    expect(pad(0).standIn.edges).toEqual([{ from: "buzz-rim-shot", to: "rim-shot", cost: 0.5, owner: "studio" }]);
    // the conga answers the snare's rim shot with its main stroke (no stroke map yet): foreign entry, cost 4
    expect(pad(1)).toMatchObject({ plays: "open-tone", standIn: { cost: 4, source: "graph" } });
    expect([pad(3).plays, pad(3).outcome, pad(4).plays, pad(4).outcome]).toEqual(["tip", "direct", "throat", "direct"]);
    expect(a.json.audit.result.strokes.map((x: { id: string }) => x.id)).toEqual(["buzz-rim-shot", "throat"]);

    // with a stroke map for the conga's slot, the rim shot pad plays the slap and the audit says so
    const mapped = slots.map((x) => (x.id === "perc" ? { ...x, standIns: { "rim-shot": "slap", "cross-stick": "rim", centre: "open-tone" } } : x));
    expect((await call(kitRoute.PATCH, { method: "PATCH", params: { ...P(), kitId }, user: s.users.editor, body: { slots: mapped } })).status).toBe(200);
    const b = await call(auditsRoute.POST, { params: P(), user: s.users.editor, body: { layoutId, kitId } });
    expect(b.json.audit.result.pads[1]).toMatchObject({ plays: "slap", standIn: { source: "override", cost: 0 } });
    expect(b.json.audit.result.pads[1].notes.join(" ")).toMatch(/stroke map: rim-shot → slap/);
    expect(b.json.audit.result.pads[2].plays).toBe("rim");
    expect(b.json.audit.result.score.value).toBeGreaterThan(a.json.audit.result.score.value);
  });

  it("renaming a stroke in use says what uses it, and with consent moves its samples, pads and maps", async () => {
    const u = await call(usesRoute.GET, { params: { ...P(), strokeId: "buzz-rim-shot" }, user: s.users.viewer });
    expect(u.json.uses).toMatchObject({ samples: [{ libraryName: "Percussion room", count: 3 }], layouts: [{ name: "Hand kit" }], total: 4 });
    const body = { ...buzz, name: "Buzz rim" };
    const refused = await call(strokeRoute.PATCH, { method: "PATCH", params: { ...P(), strokeId: "buzz-rim-shot" }, user: s.users.editor, body });
    expect(refused.status).toBe(409);
    expect(refused.json.error.message).toMatch(/3 samples, 1 layout/);
    expect(refused.json.error.details.moveTo).toBe("buzz-rim");
    const moved = await call(strokeRoute.PATCH, { method: "PATCH", params: { ...P(), strokeId: "buzz-rim-shot" }, user: s.users.editor, body: { ...body, moveUses: true } });
    expect(moved.status).toBe(200);
    const rows = await db()("samples").where({ library_id: libraryId }).orderBy("rel_path").select("articulation", "confirmed_articulation");
    expect(rows).toEqual([{ articulation: "buzz-rim", confirmed_articulation: "buzz-rim" }, { articulation: "buzz-rim", confirmed_articulation: null }, { articulation: "buzz-rim", confirmed_articulation: null }]);
    const l = await call(layoutRoute.GET, { params: { ...P(), layoutId }, user: s.users.viewer });
    expect(l.json.layout.layout.pads[0].target.articulation).toBe("buzz-rim");
    expect((await call(usesRoute.GET, { params: { ...P(), strokeId: "buzz-rim-shot" }, user: s.users.viewer })).json.uses.total).toBe(0);
  });

  it("removing a stroke in use asks where its uses go; with moveTo they move and the samples keep it as a member's label", async () => {
    const kit = await call(kitRoute.GET, { params: { ...P(), kitId }, user: s.users.viewer });
    const slots = kit.json.kit.kit.slots.map((x: { id: string }) => (x.id === "perc" ? { ...x, standIns: { "buzz-rim": "slap", "rim-shot": "slap" } } : x));
    expect((await call(kitRoute.PATCH, { method: "PATCH", params: { ...P(), kitId }, user: s.users.editor, body: { slots } })).status).toBe(200);
    const refused = await call(strokeRoute.DELETE, { method: "DELETE", params: { ...P(), strokeId: "buzz-rim" }, user: s.users.editor });
    expect(refused.status).toBe(409);
    expect(refused.json.error.details.uses.kits).toEqual([{ id: kitId, name: "Hand kit", slots: ["Snare 2"] }]);
    const nowhere = await call(strokeRoute.DELETE, { method: "DELETE", params: { ...P(), strokeId: "buzz-rim" }, user: s.users.editor, path: "/api/test?moveTo=buzz-rim" });
    expect(nowhere.status).toBe(422);
    const gone = await call(strokeRoute.DELETE, { method: "DELETE", params: { ...P(), strokeId: "buzz-rim" }, user: s.users.editor, path: "/api/test?moveTo=rim-shot" });
    expect(gone.status).toBe(200);
    expect(gone.json.moved).toBe(5); // three samples, a kit and a layout
    const rows = await db()("samples").where({ library_id: libraryId }).select("articulation", "confirmed_articulation", "articulation_source");
    expect(rows.every((r) => r.articulation === "rim-shot" && r.confirmed_articulation === "rim-shot" && r.articulation_source === "person")).toBe(true);
    expect((await call(layoutRoute.GET, { params: { ...P(), layoutId }, user: s.users.viewer })).json.layout.layout.pads[0].target.articulation).toBe("rim-shot");
    expect((await call(kitRoute.GET, { params: { ...P(), kitId }, user: s.users.viewer })).json.kit.kit.slots[1].standIns).toEqual({ "rim-shot": "slap" });
    expect((await call(strokesRoute.GET, { params: P(), user: s.users.viewer })).json.strokes.map((x: { id: string }) => x.id)).toEqual(["throat"]);
  });

  it("a layout file carries the studio's strokes it aims at; another studio importing it adopts them", async () => {
    const ex = await call(layoutExport.GET, { params: { ...P(), layoutId }, user: s.users.viewer });
    expect(ex.json.schema).toBe("kitwright.layout/v2");
    expect(ex.json.layout.strokes.map((x: { id: string }) => x.id)).toEqual(["throat"]);
    const im = await call(layoutImport.POST, { params: { studioId: s.otherStudio.id }, user: s.users.outsider, body: ex.json });
    expect(im.status).toBe(201);
    const theirs = await call(strokesRoute.GET, { params: { studioId: s.otherStudio.id }, user: s.users.outsider });
    expect(theirs.json.strokes).toEqual([{ id: "throat", name: "Throat", families: ["cowbell"], words: ["throat"], neighbours: [{ to: "shank", cost: 1 }] }]);
    // a file naming a stroke nobody defines is refused, naming the pad
    const bare = { ...ex.json, layout: { ...ex.json.layout, strokes: undefined } };
    delete bare.layout.strokes;
    const bad = await call(layoutImport.POST, { params: P(), user: s.users.editor, body: { ...bare, layout: { ...bare.layout, pads: bare.layout.pads.map((p: { target: object }, i: number) => (i === 4 ? { ...p, target: { slotId: "bell", articulation: "mouth-tone" } } : p)) } } });
    expect(bad.status).toBe(422);
    expect(bad.json.error.message).toMatch(/mouth-tone/);
  });
});
