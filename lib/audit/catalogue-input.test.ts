import { describe, expect, it } from "vitest";
import { readCatalogue } from "./catalogue-input";
import { catalogueToFile } from "./schema";
import { testCatalogue } from "./test-catalogue";

describe("reading catalogues for the audit", () => {
  it("reads a kitwright.catalogue/v1 document as is", () => {
    const cat = testCatalogue();
    expect(readCatalogue(JSON.parse(JSON.stringify(catalogueToFile(cat))))).toEqual({ instruments: cat, problems: [] });
  });

  it("reads the cataloguer's shape: instruments (key, displayName) plus layer groups", () => {
    const layer = (i: number, lo: number, hi: number, ids: string[]) => ({ index: i, velocityLow: lo, velocityHigh: hi, meanStrikeLufs: -30 + i, sampleIds: ids, spreadDb: 1 });
    const input = {
      samples: [],
      instruments: [
        { key: "snare:brass", family: "snare", displayName: "Snare Brass", descriptors: ["brass"], sampleIds: ["a", "b", "c"], mergedFrom: [] },
        { key: "tom:10in", family: "tom", displayName: "Tom 10in", descriptors: [], sampleIds: ["t"], mergedFrom: [] },
      ],
      groups: [
        { key: "g1", instrumentKey: "snare:brass", articulation: "centre", mic: "close", layers: [layer(0, 1, 63, ["a"]), layer(1, 64, 127, ["b", "c"])] },
        { key: "g2", instrumentKey: "tom:10in", articulation: "centre", mic: null, layers: [layer(0, 1, 127, ["t"])] },
        { key: "g3", instrumentKey: "tom:missing", articulation: "centre", mic: null, layers: [] },
        { key: "g4", instrumentKey: "tom:10in", articulation: "whack", mic: null, layers: [] },
      ],
    };
    const r = readCatalogue(input);
    expect(r.instruments.map((i) => [i.id, i.name, i.family, i.articulations.map((a) => [a.articulation, a.mic, a.layers.length])])).toEqual([
      ["snare:brass", "Snare Brass", "snare", [["centre", "close", 2]]],
      ["tom:10in", "Tom 10in", "tom", [["centre", null, 1]]],
    ]);
    expect(r.instruments[0]!.articulations[0]!.layers[1]).toEqual({ index: 1, velocityLow: 64, velocityHigh: 127, meanStrikeLufs: -29, sampleIds: ["b", "c"] });
    expect(r.problems).toEqual(['groups[2]: instrument "tom:missing" is not in the list', 'groups[3]: unknown articulation "whack"']);
  });

  it("says what it cannot read", () => {
    expect(readCatalogue({ foo: 1 }).problems).toEqual(["no instruments list found"]);
    expect(readCatalogue([{ id: "x", family: "bongo" }]).problems).toEqual(['instrument x: unknown family "bongo"']);
  });
});
