// Shared layouts and the kit matrix over the API: an editor publishes a layout; anyone with the link reads it
// with no account, and it carries nothing of the studio (no studio, kit, instrument, sample or person); views
// count on the page only; a new link retires the old one; revoking makes the link 404 at once; a signed-in
// person imports it into a studio they edit. The kit matrix audits the layout against every kit.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../helpers";
import { smallCatalogue } from "./helpers";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import * as layoutsRoute from "@/app/api/studios/[studioId]/layouts/route";
import * as shareRoute from "@/app/api/studios/[studioId]/layouts/[layoutId]/share/route";
import * as matrixRoute from "@/app/api/studios/[studioId]/layouts/[layoutId]/kit-matrix/route";
import * as importRoute from "@/app/api/studios/[studioId]/shared-layouts/import/route";
import * as publicRoute from "@/app/api/shared/[token]/route";
import { getShare, viewSharedLayout } from "@/lib/server/kits/shares";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let cat: Awaited<ReturnType<typeof smallCatalogue>>;
let layoutId: string;
let fullKit: string;
const P = () => ({ studioId: s.studio.id, layoutId });

beforeAll(async () => {
  s = await makeStudioWithRoles();
  cat = await smallCatalogue(db(), s.studio.id);
  layoutId = (await call(layoutsRoute.POST, { params: { studioId: s.studio.id }, user: s.users.editor, body: { name: "Pad strip", template: "grid-2x8" } })).json.layout.id;
  const slot = (id: string, family: string, instrumentId: string | null) => ({ id, name: id, family, instrumentId });
  fullKit = (await call(kitsRoute.POST, { params: { studioId: s.studio.id }, user: s.users.editor, body: { name: "Secret room kit", slots: [slot("kick", "kick", cat.kick), slot("snare", "snare", cat.snare), slot("tom-1", "tom", cat.tomHigh), slot("tom-2", "tom", cat.tomLow), slot("ride-1", "ride", cat.ride)] } })).json.kit.id;
  await call(kitsRoute.POST, { params: { studioId: s.studio.id }, user: s.users.editor, body: { name: "Bare kit", slots: [slot("kick", "kick", cat.kick)] } });
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

describe("shared layouts", () => {
  let token: string;

  it("an editor publishes; a viewer sees the link; a viewer cannot publish", async () => {
    expect((await call(shareRoute.GET, { params: P(), user: s.users.viewer })).json.share).toBeNull();
    const pub = await call(shareRoute.PUT, { method: "PUT", params: P(), user: s.users.editor, body: { description: "Two rows, cymbals on top." } });
    expect(pub.status).toBe(200);
    token = pub.json.share.token;
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(pub.json.share.path).toBe(`/shared/${token}`);
    expect((await call(shareRoute.GET, { params: P(), user: s.users.viewer })).json.share.token).toBe(token);
    expect((await call(shareRoute.PUT, { method: "PUT", params: P(), user: s.users.viewer, body: { description: "x" } })).status).toBe(403);
  });

  it("anyone with the link reads the layout alone, with no account, and nothing of the studio leaks", async () => {
    const r = await call(publicRoute.GET, { params: { token } });
    expect(r.status).toBe(200);
    expect(r.json.name).toBe("Pad strip");
    expect(r.json.description).toBe("Two rows, cymbals on top.");
    expect(r.json.layout.pads).toHaveLength(16);
    const text = JSON.stringify(r.json);
    for (const secret of [s.studio.id, s.studio.name, layoutId, "Secret room kit", fullKit, cat.kick, cat.snare, "Snare 14x6.5", "Test room kit", s.users.editor.email, s.users.owner.email]) {
      expect(text, secret).not.toContain(secret);
    }
    const file = await call(publicRoute.GET, { params: { token }, path: "/api/test?download=1" });
    expect(file.res.headers.get("content-disposition")).toMatch(/attachment; filename="Pad-strip.layout.json"/);
    expect(file.json.schema).toBe("kitwright.layout/v2");
    expect((await call(publicRoute.GET, { params: { token: "A".repeat(43) } })).status).toBe(404);
  });

  it("counts views of the page, not of the API", async () => {
    const before = (await getShare({ studioId: s.studio.id, layoutId }))!.views;
    await viewSharedLayout(token, { count: true });
    await viewSharedLayout(token, { count: true });
    await call(publicRoute.GET, { params: { token } });
    expect((await getShare({ studioId: s.studio.id, layoutId }))!.views).toBe(before + 2);
  });

  it("imports into a studio the person edits, never into one they only view", async () => {
    const ok = await call(importRoute.POST, { params: { studioId: s.otherStudio.id }, user: s.users.outsider, body: { token } });
    expect(ok.status).toBe(201);
    expect(ok.json.layout.name).toBe("Pad strip");
    expect(ok.json.layout.layout.pads).toHaveLength(16);
    expect(await db()("layouts").where({ studio_id: s.otherStudio.id }).count({ n: "*" }).then((r) => Number(r[0]!.n))).toBe(1);
    expect((await call(importRoute.POST, { params: { studioId: s.studio.id }, user: s.users.viewer, body: { token } })).status).toBe(403);
    expect((await call(importRoute.POST, { params: { studioId: s.otherStudio.id }, user: s.users.outsider, body: { token: "not a token" } })).status).toBe(422);
  });

  it("a new link retires the old one; revoking makes the link 404 at once", async () => {
    const fresh = await call(shareRoute.PUT, { method: "PUT", params: P(), user: s.users.owner, body: { description: "Two rows.", newLink: true } });
    const newToken = fresh.json.share.token as string;
    expect(newToken).not.toBe(token);
    expect((await call(publicRoute.GET, { params: { token } })).status).toBe(404);
    expect((await call(publicRoute.GET, { params: { token: newToken } })).status).toBe(200);
    expect((await call(shareRoute.DELETE, { method: "DELETE", params: P(), user: s.users.editor })).status).toBe(204);
    expect((await call(publicRoute.GET, { params: { token: newToken } })).status).toBe(404);
    const actions = (await db()("activity").where({ studio_id: s.studio.id }).select("action")).map((a) => a.action);
    expect(actions).toEqual(expect.arrayContaining(["layout.published", "layout.unpublished"]));
  });
});

describe("kit matrix", () => {
  it("audits the layout against every kit, best first, for a viewer", async () => {
    const r = await call(matrixRoute.GET, { params: P(), user: s.users.viewer });
    expect(r.status).toBe(200);
    expect(r.json.kits.map((k: { kitName: string }) => k.kitName)).toEqual(["Secret room kit", "Bare kit"]);
    const [full, bare] = r.json.kits;
    expect(full.pads).toBe(16);
    expect(full.direct + full.standIn + full.silent).toBe(16);
    // the bare kit has only a kick: the two kick pads play, the other 14 pads of the strip stay silent
    expect(bare).toMatchObject({ pads: 16, direct: 1, silent: 15 });
    expect(full.score).toBeGreaterThan(bare.score);
  });
});
