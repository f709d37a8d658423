// The velocity response over the API: a library's layer groups against its curve (DLS by default, Dannenberg
// on request), the trims, and the CSV / JSON downloads; groups of one layer are left out; another studio 404.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../helpers";
import { addInstrument, makeLibrary } from "../audit/helpers";
import * as route from "@/app/api/studios/[studioId]/libraries/[libraryId]/velocity-response/route";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;
const P = () => ({ studioId: s.studio.id, libraryId });

beforeAll(async () => {
  s = await makeStudioWithRoles();
  libraryId = await makeLibrary(db(), s.studio.id, "Velocity room");
  // evenLayers: 3 layers over 1-42, 43-84, 85-127 at -40, -34, -28 LUFS; the ride has one layer only
  await addInstrument(db(), s.studio.id, libraryId, { key: "snare", name: "Snare 14 brass", family: "snare", articulations: { centre: [3, 2] } });
  await addInstrument(db(), s.studio.id, libraryId, { key: "ride", name: "Ride 20", family: "ride", articulations: { bow: [1, 2] } });
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

describe("GET /velocity-response", () => {
  it("measures every group of two or more layers against the library's curve (DLS square law) for a viewer", async () => {
    const r = await call(route.GET, { params: P(), user: s.users.viewer });
    expect(r.status).toBe(200);
    expect(r.json.curve).toEqual({ kind: "dls" });
    expect(r.json.groups).toHaveLength(1);
    const g = r.json.groups[0];
    expect(g).toMatchObject({ instrument: "Snare 14 brass", articulation: "centre", mic: "close" });
    // by hand: 40 log10(127/42) = 19.222, 40 log10(127/84) = 7.181; measured -12, -6, 0 against the top layer
    expect(g.response.layers.map((l: { measuredDb: number }) => l.measuredDb)).toEqual([-12, -6, 0]);
    expect(g.response.layers.map((l: { targetDb: number }) => l.targetDb)).toEqual([-19.22, -7.18, 0]);
    expect(g.response.layers.map((l: { trimDb: number }) => l.trimDb)).toEqual([-7.22, -1.18, 0]);
    expect(g.takes).toHaveLength(3);
    expect(g.takes.every((t: { sampleId: string | null }) => typeof t.sampleId === "string")).toBe(true);
  });

  it("uses Dannenberg's curve with a chosen range when asked", async () => {
    // range 40 dB: level(v) = 40 log10((v + 13)/140) (m = 1/140, b = 13/140); v = 42: 40 log10(55/140) = -16.235; v = 84: 40 log10(97/140) = -6.373
    const r = await call(route.GET, { params: P(), user: s.users.viewer, path: "/api/test?curve=dannenberg&rangeDb=40" });
    expect(r.status).toBe(200);
    expect(r.json.groups[0].response.layers.map((l: { targetDb: number }) => l.targetDb)).toEqual([-16.23, -6.37, 0]);
  });

  it("downloads the trims as CSV and as kitwright.velocity-trims/v1 JSON", async () => {
    const csv = await call(route.GET, { params: P(), user: s.users.viewer, path: "/api/test?format=csv" });
    expect(csv.status).toBe(200);
    expect(csv.res.headers.get("content-type")).toMatch(/text\/csv/);
    expect(csv.res.headers.get("content-disposition")).toMatch(/attachment; filename="velocity-trims-Velocity-room.csv"/);
    const lines = (csv.json as string).trim().split("\r\n");
    expect(lines[0]).toBe("instrument,articulation,mic,layer,velocity_low,velocity_high,measured_db,target_db,trim_db,flags");
    expect(lines[1]).toBe("Snare 14 brass,centre,close,1,1,42,-12,-19.22,-7.22,");
    const json = await call(route.GET, { params: P(), user: s.users.viewer, path: "/api/test?format=json" });
    const doc = json.json;
    expect(doc.schema).toBe("kitwright.velocity-trims/v1");
    expect(doc.groups[0].layers[0].trimDb).toBe(-7.22);
  });

  it("refuses a range out of bounds (422) and another studio's library (404)", async () => {
    expect((await call(route.GET, { params: P(), user: s.users.viewer, path: "/api/test?curve=dannenberg&rangeDb=500" })).status).toBe(422);
    expect((await call(route.GET, { params: { studioId: s.otherStudio.id, libraryId }, user: s.users.outsider })).status).toBe(404);
  });
});
