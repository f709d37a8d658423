// The server's catalogue for the auditor: instruments + layer_groups rows read through the same converter as the
// command line's catalogues (lib/audit/catalogue-input.ts), so damaged rows are clamped and reported one way.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/lib/server/db";
import { readStudioCatalogue } from "@/lib/server/kits/catalogue-for-audit";
import { makeStudioWithRoles } from "../helpers";
import { addInstrument, addLayerGroup, makeLibrary } from "./helpers";

let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;

beforeAll(async () => {
  s = await makeStudioWithRoles();
});
afterAll(async () => {
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
});

describe("readStudioCatalogue", () => {
  it("reads the cataloguing's rows with the shared converter: velocities clamped to 1-127 and reported, unknown words left out and named", async () => {
    const k = db();
    const libraryId = await makeLibrary(k, s.studio.id);
    const tom = await addInstrument(k, s.studio.id, libraryId, { key: "tom:10in", name: "Tom 10in", family: "tom", pitchHz: 182.56, articulations: {} });
    // a damaged group: the first layer starts at 0 (note-off in MIDI 1.0), the second ends above 127
    await addLayerGroup(k, s.studio.id, libraryId, "tom:10in", "centre", [
      { index: 0, velocityLow: 0, velocityHigh: 60, meanStrikeLufs: -40, sampleIds: ["a", "b"] },
      { index: 1, velocityLow: 61, velocityHigh: 130, meanStrikeLufs: -25, sampleIds: ["c"] },
    ]);
    await addLayerGroup(k, s.studio.id, libraryId, "tom:10in", "whack", []);
    await addInstrument(k, s.studio.id, libraryId, { key: "bongo:main", name: "Bongo", family: "bongo", articulations: {} });

    const r = await readStudioCatalogue({ studioId: s.studio.id });
    expect(r.instruments).toEqual([
      {
        id: tom, name: "Tom 10in", family: "tom", pitchHz: 182.56, libraryId,
        articulations: [{
          articulation: "centre", mic: "close", layers: [
            { index: 0, velocityLow: 1, velocityHigh: 60, meanStrikeLufs: -40, sampleIds: ["a", "b"] },
            { index: 1, velocityLow: 61, velocityHigh: 127, meanStrikeLufs: -25, sampleIds: ["c"] },
          ],
        }],
      },
    ]);
    const bongo = await k("instruments").where({ library_id: libraryId, key: "bongo:main" }).first("id");
    expect(r.problems.sort()).toEqual([
      `groups[0].layers[0]: velocityLow 0 read as 1 (velocities are whole numbers 1-127)`,
      `groups[0].layers[1]: velocityHigh 130 read as 127 (velocities are whole numbers 1-127)`,
      `groups[1]: unknown articulation "whack"`,
      `instrument ${bongo.id}: unknown family "bongo"`,
    ].sort());

    // only the instruments asked for, and only their groups
    expect(await readStudioCatalogue({ studioId: s.studio.id, instrumentIds: [bongo.id] })).toEqual({ instruments: [], problems: [`instrument ${bongo.id}: unknown family "bongo"`] });
    expect(await readStudioCatalogue({ studioId: s.otherStudio.id })).toEqual({ instruments: [], problems: [] });
  });
});
