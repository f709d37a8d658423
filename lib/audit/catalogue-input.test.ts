import { describe, expect, it } from "vitest";
import { catalogueSamples, type CatalogueSampleInput } from "../catalogue/catalogue";
import { measurement } from "../catalogue/test-helpers";
import { readCatalogue, readLayers } from "./catalogue-input";
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

  it("reads a studio's own stroke when the studio's list is given", () => {
    const layer = { index: 0, velocityLow: 1, velocityHigh: 127, meanStrikeLufs: -30, sampleIds: ["w"] };
    const input = { instruments: [{ key: "tom", family: "tom", displayName: "Tom" }], groups: [{ instrumentKey: "tom", articulation: "whack", mic: null, layers: [layer] }] };
    const whack = { id: "whack", name: "whack", families: ["tom" as const], words: [], neighbours: [{ to: "centre", cost: 1 }] };
    expect(readCatalogue(input, [whack]).instruments[0]!.articulations.map((a) => a.articulation)).toEqual(["whack"]);
    expect(readCatalogue(input).problems).toEqual(['groups[0]: unknown articulation "whack"']);
  });

  it("says what it cannot read", () => {
    expect(readCatalogue({ foo: 1 }).problems).toEqual(["no instruments list found"]);
    expect(readCatalogue([{ id: "x", family: "bongo" }]).problems).toEqual(['instrument x: unknown family "bongo"']);
  });

  it("reads catalogueSamples()' output as it is: keys as ids, display names, pitch, every group's layers", () => {
    const lib: CatalogueSampleInput[] = [];
    const tom = { pitchHz: 140, bodyCentroidHz: 300, strikeCentroidHz: 1000, strikeFlatness: 0.03, bodyFlatness: 0.02, decaySec: 0.8 };
    for (const [v, lufs] of [[1, -30], [2, -18]] as const) for (const rr of [1, 2]) lib.push({ id: `t${v}${rr}`, path: `Toms/Tom1_Center_v${v}_rr${rr}.wav`, measurement: measurement(tom, { strikeLufs: lufs + rr / 10 }) });
    const cat = catalogueSamples(lib);
    const r = readCatalogue(JSON.parse(JSON.stringify(cat)));
    expect(r.problems).toEqual([]);
    expect(r.instruments).toEqual([
      {
        id: "tom:1", name: "Tom 1", family: "tom", pitchHz: 140,
        articulations: [{ articulation: "centre", mic: null, layers: cat.groups[0]!.layers.map(({ index, velocityLow, velocityHigh, meanStrikeLufs, sampleIds }) => ({ index, velocityLow, velocityHigh, meanStrikeLufs, sampleIds })) }],
      },
    ]);
    expect(r.instruments[0]!.articulations[0]!.layers.map((l) => l.sampleIds)).toEqual([["t11", "t12"], ["t21", "t22"]]);
  });

  it("layers: velocities are whole numbers 1-127 (MIDI 1.0 note-on; 0 is note-off): rounded, clamped, each change reported", () => {
    const problems: string[] = [];
    const layers = readLayers(
      [
        { velocityLow: 0, velocityHigh: 40.6, sampleIds: ["a"] },
        { index: 1, velocityLow: 42, velocityHigh: 300, meanStrikeLufs: -20, sampleIds: ["b", 7, "c"] },
        { velocityLow: 90, velocityHigh: 80, sampleIds: ["d"] },
        { velocityLow: "10", velocityHigh: 20, sampleIds: ["e"] },
        { velocityLow: 1, velocityHigh: 2 },
        "layer",
      ],
      "g",
      problems,
    );
    expect(layers).toEqual([
      { index: 0, velocityLow: 1, velocityHigh: 41, meanStrikeLufs: NaN, sampleIds: ["a"] },
      { index: 1, velocityLow: 42, velocityHigh: 127, meanStrikeLufs: -20, sampleIds: ["b", "c"] },
    ]);
    expect(problems).toEqual([
      "g.layers[0]: velocityLow 0 read as 1 (velocities are whole numbers 1-127)",
      "g.layers[0]: velocityHigh 40.6 read as 41 (velocities are whole numbers 1-127)",
      "g.layers[1]: velocityHigh 300 read as 127 (velocities are whole numbers 1-127)",
      "g.layers[2]: velocityLow 90 is above velocityHigh 80; layer left out",
      "g.layers[3]: needs velocityLow, velocityHigh and sampleIds",
      "g.layers[4]: needs velocityLow, velocityHigh and sampleIds",
      "g.layers[5]: not an object",
    ]);
  });

  it("an instrument listed twice keeps the first; a pitch that is not a positive number is read as none", () => {
    const r = readCatalogue([
      { id: "t", family: "tom", name: "First", pitchHz: 0 },
      { id: "t", family: "tom", name: "Second", pitchHz: 120 },
    ]);
    expect(r.instruments).toEqual([{ id: "t", name: "First", family: "tom", pitchHz: null, articulations: [] }]);
    expect(r.problems).toEqual(["instrument t: pitchHz 0 is not a positive number; read as none", "instrument t: listed twice; the first is kept"]);
  });
});
