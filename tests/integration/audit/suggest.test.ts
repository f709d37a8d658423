// Suggest a layout over the API: a viewer may ask (nothing is written), the answer places the kit's recorded
// strokes with a reason each (toms high to low from left to right), an editor keeps it through the layout
// import, an empty kit or a bad surface answers 422 and another studio's kit 404.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../helpers";
import { smallCatalogue } from "./helpers";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import * as suggestRoute from "@/app/api/studios/[studioId]/layouts/suggest/route";
import * as layoutImport from "@/app/api/studios/[studioId]/layouts/import/route";
import { LAYOUT_SCHEMA } from "@/lib/audit/schema";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let cat: Awaited<ReturnType<typeof smallCatalogue>>;
let kitId: string;
let emptyKitId: string;
const P = () => ({ studioId: s.studio.id });
const count = async (table: string) => Number((await db()(table).where({ studio_id: s.studio.id }).count({ n: "*" }))[0]!.n);

beforeAll(async () => {
  s = await makeStudioWithRoles();
  cat = await smallCatalogue(db(), s.studio.id);
  const slots = [
    { id: "kick", name: "Kick", family: "kick", instrumentId: cat.kick },
    { id: "snare", name: "Snare", family: "snare", instrumentId: cat.snare },
    // the low tom first: the suggestion orders toms by measured pitch, not by slot order
    { id: "tom-low", name: "Floor tom", family: "tom", instrumentId: cat.tomLow },
    { id: "tom-high", name: "Rack tom", family: "tom", instrumentId: cat.tomHigh },
    { id: "ride", name: "Ride", family: "ride", instrumentId: cat.ride },
    { id: "cowbell", name: "Cowbell", family: "cowbell", instrumentId: cat.cowbell },
  ];
  kitId = (await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Room kit", slots } })).json.kit.id;
  emptyKitId = (await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Empty", slots: [{ id: "snare", name: "Snare", family: "snare", instrumentId: null }] } })).json.kit.id;
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

describe("POST /layouts/suggest", () => {
  it("answers a viewer with every recorded stroke placed and a reason for each, writing nothing", async () => {
    const layoutsBefore = await count("layouts");
    const r = await call(suggestRoute.POST, { params: P(), user: s.users.viewer, body: { kitId, surface: { kind: "grid", rows: 3, cols: 4 } } });
    expect(r.status).toBe(200);
    const pads = r.json.layout.pads as { id: string; row: number; col: number; note: number; target: { slotId: string; articulation: string } }[];
    const targets = pads.map((p) => `${p.target.slotId}/${p.target.articulation}`);
    // recorded: kick centre, snare centre + edge, two toms, ride bow; the cowbell recorded nothing
    for (const t of ["kick/centre", "snare/centre", "snare/edge", "tom-low/centre", "tom-high/centre", "ride/bow"]) expect(targets).toContain(t);
    expect(targets.some((t) => t.startsWith("cowbell/"))).toBe(false);
    const col = (slot: string) => pads.find((p) => p.target.slotId === slot)!.col;
    expect(col("tom-high")).toBeLessThan(col("tom-low"));
    expect(r.json.placements).toHaveLength(pads.length);
    expect(r.json.placements.every((p: { reason: string }) => p.reason.length > 20)).toBe(true);
    expect(r.json.kitName).toBe("Room kit");
    expect(await count("layouts")).toBe(layoutsBefore);
  });

  it("lets an editor keep the suggestion as a layout through the import", async () => {
    const r = await call(suggestRoute.POST, { params: P(), user: s.users.editor, body: { kitId, surface: { kind: "zones", zones: ["kick head", "snare head", "snare rim", "ride bell"] }, name: "Trigger set" } });
    expect(r.status).toBe(200);
    expect(r.json.placements.find((p: { padId: string }) => p.padId === "snare-rim")).toMatchObject({ standIn: true });
    const kept = await call(layoutImport.POST, { params: P(), user: s.users.editor, body: { schema: LAYOUT_SCHEMA, layout: r.json.layout } });
    expect(kept.status).toBe(201);
    expect(kept.json.layout.name).toBe("Trigger set");
    expect(kept.json.layout.layout.pads.map((p: { zone: string }) => p.zone)).toEqual(["kick head", "snare head", "snare rim", "ride bell"]);
  });

  it("answers 422 for a kit with nothing recorded, a grid over 64 pads or no zones, and 404 for another studio's kit", async () => {
    const empty = await call(suggestRoute.POST, { params: P(), user: s.users.viewer, body: { kitId: emptyKitId, surface: { kind: "grid", rows: 2, cols: 2 } } });
    expect(empty.status).toBe(422);
    expect(empty.json.error.message).toMatch(/no recorded instrument/);
    const big = await call(suggestRoute.POST, { params: P(), user: s.users.viewer, body: { kitId, surface: { kind: "grid", rows: 9, cols: 8 } } });
    expect(big.status).toBe(422);
    const none = await call(suggestRoute.POST, { params: P(), user: s.users.viewer, body: { kitId, surface: { kind: "zones", zones: [] } } });
    expect(none.status).toBe(422);
    const other = await call(suggestRoute.POST, { params: { studioId: s.otherStudio.id }, user: s.users.outsider, body: { kitId, surface: { kind: "grid", rows: 2, cols: 2 } } });
    expect(other.status).toBe(404);
  });
});
