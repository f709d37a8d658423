// Filling a new kit for a kit template over the API: from the chosen library only, never two slots of one name
// (case ignored), the library checked against the studio (another studio's is 404 and writes nothing); and
// what the studio's next step reads (lib/server/next-step.ts) as the studio fills up.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../helpers";
import { addInstrument, makeLibrary } from "./helpers";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import { studioProgress } from "@/lib/server/next-step";
import { nextStep } from "@/lib/next-step";
import { slotNameKey } from "@/lib/audit/kit-fill";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libA: string;
let libB: string;
let otherLib: string;
const ids: Record<string, string> = {};
const P = () => ({ studioId: s.studio.id });
type Slot = { id: string; name: string; family: string; instrumentId: string | null };

beforeAll(async () => {
  s = await makeStudioWithRoles();
  libA = await makeLibrary(db(), s.studio.id, "Room A");
  libB = await makeLibrary(db(), s.studio.id, "Room B");
  otherLib = await makeLibrary(db(), s.otherStudio.id, "Not yours");
  // Room A: two kicks both named "Kick", a hat spelled like the template's slot but in another case, a snare, two toms
  ids.kick1 = await addInstrument(db(), s.studio.id, libA, { key: "kick-a", name: "Kick", family: "kick", articulations: { centre: [3, 2] } });
  ids.kick2 = await addInstrument(db(), s.studio.id, libA, { key: "kick-b", name: "Kick", family: "kick", articulations: { centre: [2, 1] } });
  ids.hat = await addInstrument(db(), s.studio.id, libA, { key: "hat", name: "Hi-Hat", family: "hi-hat", articulations: { closed: [2, 2], open: [1, 1] } });
  ids.hat2 = await addInstrument(db(), s.studio.id, libA, { key: "hat-2", name: "Hi-hat", family: "hi-hat", articulations: { closed: [1, 1] } });
  ids.snareA = await addInstrument(db(), s.studio.id, libA, { key: "snare", name: "Snare 14", family: "snare", articulations: { centre: [3, 2] } });
  ids.tomLow = await addInstrument(db(), s.studio.id, libA, { key: "tom-16", name: "Tom 16", family: "tom", pitchHz: 82, articulations: { centre: [2, 1] } });
  ids.tomHigh = await addInstrument(db(), s.studio.id, libA, { key: "tom-10", name: "Tom 10", family: "tom", pitchHz: 196, articulations: { centre: [2, 1] } });
  // Room B: a richer snare and a ride, which must stay out of a kit filled from Room A
  ids.snareB = await addInstrument(db(), s.studio.id, libB, { key: "snare", name: "Snare 13 piccolo", family: "snare", articulations: { centre: [4, 3], edge: [2, 2], "rim-shot": [2, 1] } });
  ids.ride = await addInstrument(db(), s.studio.id, libB, { key: "ride", name: "Ride 20", family: "ride", articulations: { bow: [2, 2] } });
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

const instrumentIds = (slots: Slot[]) => slots.map((x) => x.instrumentId).filter((x): x is string => !!x);

describe("filling a kit for a kit template", () => {
  it("takes only the chosen library's instruments and never repeats a slot name", async () => {
    const r = await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "From room A", template: "trigger-five", libraryId: libA } });
    expect(r.status).toBe(201);
    const slots = r.json.kit.kit.slots as Slot[];
    const held = instrumentIds(slots);
    expect(new Set(held)).toEqual(new Set([ids.kick1, ids.kick2, ids.hat, ids.hat2, ids.snareA, ids.tomLow, ids.tomHigh]));
    expect(held).not.toContain(ids.snareB);
    expect(new Set(slots.map((x) => slotNameKey(x.name))).size).toBe(slots.length);
    const byInst = Object.fromEntries(slots.filter((x) => x.instrumentId).map((x) => [x.instrumentId!, x]));
    // the template's slots, numbered where an instrument of the same name was added beside them
    expect(slots.find((x) => x.id === "kick")!.name).toBe("Kick 1");
    expect(slots.filter((x) => slotNameKey(x.name).startsWith("kick")).map((x) => x.name)).toEqual(["Kick 1", "Kick 2"]);
    expect(slots.filter((x) => slotNameKey(x.name).startsWith("hi-hat")).map((x) => x.name)).toEqual(["Hi-hat 1", "Hi-hat 2"]);
    // toms high to low, the template's ride slot empty (Room B's ride is not offered)
    expect(byInst[ids.tomHigh]!.id).toBe("tom-1");
    expect(byInst[ids.tomLow]!.id).toBe("tom-2");
    expect(slots.find((x) => x.id === "ride-1")!.instrumentId).toBeNull();
    const act = await db()("activity").where({ studio_id: s.studio.id, subject_id: r.json.kit.id }).first("details");
    expect(typeof act.details === "string" ? JSON.parse(act.details) : act.details).toMatchObject({ template: "trigger-five", libraryId: libA });
  });

  it("without a library takes every library's instruments (the richer snare wins the snare slot)", async () => {
    const r = await call(kitsRoute.POST, { params: P(), user: s.users.owner, body: { name: "From everything", template: "trigger-five" } });
    expect(r.status).toBe(201);
    const slots = r.json.kit.kit.slots as Slot[];
    expect(slots.find((x) => x.id === "snare")!.instrumentId).toBe(ids.snareB);
    expect(slots.find((x) => x.id === "ride-1")!.instrumentId).toBe(ids.ride);
    expect(instrumentIds(slots)).toHaveLength(9);
  });

  it("refuses another studio's library (404), a library without a template (422) and a viewer (403), writing nothing", async () => {
    const before = Number((await db()("kits").where({ studio_id: s.studio.id }).count({ n: "*" }))[0]!.n);
    const other = await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Sneaky", template: "trigger-five", libraryId: otherLib } });
    expect(other.status).toBe(404);
    expect(other.json.error.code).toBe("not-found");
    const noTemplate = await call(kitsRoute.POST, { params: P(), user: s.users.editor, body: { name: "Odd", libraryId: libA } });
    expect(noTemplate.status).toBe(422);
    expect(JSON.stringify(noTemplate.json.error)).toContain("libraryId");
    const viewer = await call(kitsRoute.POST, { params: P(), user: s.users.viewer, body: { name: "Mine", template: "trigger-five", libraryId: libA } });
    expect(viewer.status).toBe(403);
    expect(Number((await db()("kits").where({ studio_id: s.studio.id }).count({ n: "*" }))[0]!.n)).toBe(before);
  });
});

describe("the studio's next step as its rows say", () => {
  it("reads libraries, instruments, kits, layouts and audits of this studio only", async () => {
    const base = `/s/${s.otherStudio.id}`;
    // the other studio has one library and nothing else: its next step is to add samples
    const other = await studioProgress({ studioId: s.otherStudio.id });
    expect(other).toEqual({ libraries: [{ id: otherLib, name: "Not yours", samples: 0, pending: 0, instruments: 0, sorting: false }], kits: [], layouts: [], latestAudit: null });
    expect(nextStep(other, { base, canWrite: true }).key).toBe("samples");
    // this studio: instruments and the two kits made above, no layout yet
    const mine = await studioProgress({ studioId: s.studio.id });
    expect(mine.libraries.map((l) => [l.name, l.instruments])).toEqual([["Room A", 7], ["Room B", 2]]);
    expect(mine.kits.map((k) => k.name).sort()).toEqual(["From everything", "From room A"]);
    expect(mine.kits.find((k) => k.name === "From room A")!.filled).toBe(7);
    expect(nextStep(mine, { base: `/s/${s.studio.id}`, canWrite: true })).toMatchObject({ key: "layout" });
  });
});
