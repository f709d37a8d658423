// A studio's own strokes through the audit: sorted from names, aimed at by pads, audited with a stand-in through a
// studio edge; a conga in a snare slot with and without a stroke map; layout and kit files carrying the strokes.
// The strokes, words and edges are a scenario of our own; the graph rules are common practice (fallback.ts).
import { describe, expect, it } from "vitest";
import { parseName, parseNames } from "../catalogue/names";
import { parseStrokeFile, strokeFile, strokeIdFromName, strokeListProblems, type StudioStroke } from "../catalogue/strokes";
import { runAudit } from "./audit";
import { readCatalogue } from "./catalogue-input";
import { CSV_COLUMNS, auditToCsv } from "./export";
import { FOREIGN_ENTRY_COST, graphEdges, resolveArticulation } from "./fallback";
import { kitToFile, layoutToFile, parseKitFile, parseLayoutFile, SchemaError } from "./schema";
import { proposeStrokeMap, strokeMapOverrides } from "./stroke-map";
import { readZone } from "./suggest-zones";
import { instrument } from "./test-catalogue";
import type { Kit, Layout } from "./types";

const buzzRim: StudioStroke = { id: "buzz-rim-shot", name: "buzz rim shot", families: ["snare"], words: ["buzz rim", "brs"], neighbours: [{ to: "rim-shot", cost: 0.5 }, { to: "buzz", cost: 1 }] };
const tight: StudioStroke = { id: "tight", name: "tight", families: ["hi-hat"], words: ["tight", "tite"], neighbours: [{ to: "closed", cost: 0.5 }] };
const grab: StudioStroke = { id: "grab", name: "grab", families: ["crash", "ride", "china", "splash"], words: ["grab"], neighbours: [{ to: "choke", cost: 0.5 }] };
const throat: StudioStroke = { id: "throat", name: "throat", families: ["cowbell"], words: ["throat"], neighbours: [{ to: "shank", cost: 1 }] };
const studio = [buzzRim, tight, grab, throat];

describe("a studio's stroke list", () => {
  it("ids come from names; built-in ids, clashes and unknown neighbours are refused", () => {
    expect(strokeIdFromName("Buzz rim shot")).toBe("buzz-rim-shot");
    expect(strokeIdFromName("  Cajón  Bass ")).toBe("cajon-bass");
    expect(strokeListProblems(studio)).toEqual([]);
    const bad = strokeListProblems([{ ...tight, id: "closed", name: "closed" }, buzzRim, { ...buzzRim }, { ...grab, neighbours: [{ to: "nowhere", cost: 1 }] }]);
    expect(bad.map((p) => p.message)).toEqual([
      '"closed" is a built-in stroke; a studio\'s own stroke needs another name',
      'two strokes are called "buzz-rim-shot"',
      '"closed" cannot be its own neighbour',
      'no stroke "nowhere"',
    ]);
  });

  it("the stroke file reads back what it wrote, and says what is wrong with a bad one", () => {
    const file = JSON.parse(JSON.stringify(strokeFile(studio)));
    expect(file.schema).toBe("kitwright.strokes/v1");
    expect(parseStrokeFile(file)).toEqual(studio);
    expect(() => parseStrokeFile({ schema: "kitwright.strokes/v1", strokes: [{ ...tight, families: [] }] })).toThrow(/strokes\.0\.families/);
    expect(() => parseStrokeFile({ schema: "kitwright.strokes/v1", strokes: [{ ...tight, id: "open", name: "open" }] })).toThrow(/built-in/);
  });
});

describe("the name reader sorts files into the studio's strokes", () => {
  it("a studio word wins over the built-in words and does not name the instrument", () => {
    expect(parseName("Snare 14/snare_buzz_rim_v2.wav").articulation).toBe("buzz"); // built-ins alone: the first word
    const n = parseName("Snare 14/snare_buzz_rim_v2.wav", studio);
    expect(n).toMatchObject({ family: "snare", articulation: "buzz-rim-shot", articulationFrom: "file" });
    expect(n.stem).toEqual(["snare", "14in"]);
    expect(parseName("Hats/hh_tite_03.wav", studio)).toMatchObject({ family: "hi-hat", articulation: "tight" });
    // an unknown word would name the instrument; as a studio word it is the stroke, so both takes share a stem
    const [tip, thr] = parseNames(["Bells/cowbell_tip_1.wav", "Bells/cowbell_throat_1.wav"], studio);
    expect([tip!.articulation, thr!.articulation]).toEqual(["tip", "throat"]);
    expect(thr!.stem).toEqual(tip!.stem);
    // a studio stroke of another family is not read on this one
    expect(parseName("Hats/hh_grab.wav", studio).articulation).toBe("choke");
    expect(parseName("Crash 18/crash_grab.wav", studio).articulation).toBe("grab");
  });

  it("new built-in strokes are read from names (common practice of drum libraries)", () => {
    expect(parseName("Conga/conga_bass_v1.wav")).toMatchObject({ family: "hand-drum", articulation: "bass" });
    expect(parseName("Conga/conga_bass_v1.wav").stem).not.toContain("kick");
    expect(parseName("Conga/conga_rim.wav").articulation).toBe("rim");
    expect(parseName("Djembe/djembe_finger_2.wav").articulation).toBe("finger");
    expect(parseName("Snare/snare_brush_sweep.wav").articulation).toBe("sweep");
    expect(parseName("Snare/snare_brush_v3.wav").articulation).toBe("brush");
    expect(parseName("Cowbell/cowbell_shank.wav")).toMatchObject({ family: "cowbell", articulation: "shank" });
    expect(parseName("Kick/bass_drum_22.wav").family).toBe("kick");
  });
});

describe("the fallback graph takes the studio's edges", () => {
  it("a missing studio stroke finds its stand-in through the studio's edge, and says whose edge it was", () => {
    const r = resolveArticulation("snare", "buzz-rim-shot", ["centre", "rim-shot"], null, studio);
    expect(r).toMatchObject({ outcome: "stand-in", plays: "rim-shot", path: ["buzz-rim-shot", "rim-shot"], cost: 0.5 });
    expect(r.edges).toEqual([{ from: "buzz-rim-shot", to: "rim-shot", cost: 0.5, owner: "studio" }]);
    // without the studio's list the stroke is foreign to the graph: it enters at the main stroke
    expect(resolveArticulation("snare", "buzz-rim-shot", ["centre", "rim-shot"])).toMatchObject({ plays: "centre", cost: FOREIGN_ENTRY_COST, edges: [] });
  });

  it("a path may use built-in and studio edges; each names its owner", () => {
    const r = resolveArticulation("hi-hat", "tight", ["quarter-open", "open"], null, studio);
    expect(r.path).toEqual(["tight", "closed", "quarter-open"]);
    expect(r.edges.map((e) => e.owner)).toEqual(["studio", "built-in"]);
    expect(r.cost).toBe(1.5);
  });

  it("the studio's edges reach other families' graphs only where the stroke belongs", () => {
    expect(graphEdges("ride", studio).filter((e) => e.owner === "studio")).toEqual([{ from: "choke", to: "grab", cost: 0.5, owner: "studio" }]);
    expect(graphEdges("snare", studio).some((e) => e.from === "grab" || e.to === "grab")).toBe(false);
  });
});

// A small kit of our own: snare with centre and rim shot, hats with open strokes, a conga with four strokes.
const catalogue = [
  instrument("sn", "Snare", "snare", [["centre", 3, 2], ["rim-shot", 2, 2]]),
  instrument("hh", "Hats", "hi-hat", [["closed", 2, 2], ["tight", 2, 1]]),
  instrument("cg", "Conga", "hand-drum", [["open-tone", 3, 2], ["slap", 2, 2], ["mute", 1, 2], ["rim", 1, 1]]),
  instrument("cb", "Cowbell", "cowbell", [["tip", 2, 2], ["shank", 2, 2]]),
];
const pad = (id: string, note: number, slotId: string, articulation: string) => ({ id, label: id, note, channel: 10, target: { slotId, articulation } });

describe("auditing with the studio's strokes", () => {
  const layout: Layout = {
    id: "l", name: "Studio strokes", surface: { kind: "zones" }, hiHatPedal: null,
    pads: [pad("buzz", 38, "snare", "buzz-rim-shot"), pad("tight", 42, "hat", "tight"), pad("tip", 56, "bell", "tip"), pad("shank", 57, "bell", "shank")],
  };
  const kit: Kit = { id: "k", name: "Kit", slots: [
    { id: "snare", name: "Snare", family: "snare", instrumentId: "sn" },
    { id: "hat", name: "Hats", family: "hi-hat", instrumentId: "hh" },
    { id: "bell", name: "Cowbell", family: "cowbell", instrumentId: "cb" },
  ] };

  it("custom strokes aimed at are played, or stand in through the studio's edge", () => {
    const a = runAudit(layout, kit, catalogue, { strokes: studio });
    const by = Object.fromEntries(a.pads.map((p) => [p.padId, p]));
    expect(by.tight).toMatchObject({ outcome: "direct", plays: "tight" });
    expect(by.buzz).toMatchObject({ outcome: "stand-in", plays: "rim-shot", standIn: { source: "graph", cost: 0.5 } });
    expect(by.buzz!.standIn!.edges).toEqual([{ from: "buzz-rim-shot", to: "rim-shot", cost: 0.5, owner: "studio" }]);
    expect(by.buzz!.notes.join(" ")).toMatch(/studio's own edge buzz-rim-shot–rim-shot/);
    expect([by.tip!.plays, by.shank!.plays]).toEqual(["tip", "shank"]);
    expect(a.strokes.map((s) => s.id)).toEqual(["buzz-rim-shot", "tight"]);
  });
});

describe("a conga in the snare slot", () => {
  const layout: Layout = {
    id: "l2", name: "Snare pads", surface: { kind: "zones" }, hiHatPedal: null,
    pads: [pad("head", 38, "snare", "centre"), pad("rim", 40, "snare", "rim-shot"), pad("xs", 37, "snare", "cross-stick")],
  };
  const conga = catalogue[2]!;
  const recorded = conga.articulations.map((a) => a.articulation);

  it("without a stroke map the rim shot pad falls to the conga's main stroke at the foreign-entry cost", () => {
    const kit: Kit = { id: "k", name: "Kit", slots: [{ id: "snare", name: "Snare", family: "snare", instrumentId: "cg" }] };
    const a = runAudit(layout, kit, catalogue);
    const rim = a.pads.find((p) => p.padId === "rim")!;
    expect(rim).toMatchObject({ plays: "open-tone", standIn: { source: "graph", cost: FOREIGN_ENTRY_COST, path: ["rim-shot", "open-tone"] } });
  });

  it("Kitwright proposes a map by the part each stroke plays: rim shot → slap, cross-stick → rim, centre → open tone", () => {
    const entries = proposeStrokeMap("snare", "hand-drum", recorded);
    const m = Object.fromEntries(entries.map((e) => [e.requested, e]));
    expect(m["rim-shot"]).toMatchObject({ plays: "slap", how: "part" });
    expect(m["cross-stick"]).toMatchObject({ plays: "rim", how: "part" });
    expect(m.centre).toMatchObject({ plays: "open-tone", how: "part" });
    expect(m.mute).toMatchObject({ plays: "mute", how: "recorded" });
    expect(entries.map((e) => e.requested).slice(0, 3)).toEqual(["centre", "half-edge", "edge"]);
    expect(strokeMapOverrides(entries)).not.toHaveProperty("mute");
  });

  it("with the map the audit plays the slap for the rim shot, and says it followed the map", () => {
    const standIns = strokeMapOverrides(proposeStrokeMap("snare", "hand-drum", recorded));
    const kit: Kit = { id: "k", name: "Kit", slots: [{ id: "snare", name: "Snare", family: "snare", instrumentId: "cg", standIns }] };
    const a = runAudit(layout, kit, catalogue);
    const rim = a.pads.find((p) => p.padId === "rim")!;
    expect(rim).toMatchObject({ outcome: "stand-in", plays: "slap", standIn: { source: "override", cost: 0, path: ["rim-shot", "slap"] } });
    expect(rim.notes.join(" ")).toMatch(/stroke map: rim-shot → slap/);
    expect(a.pads.find((p) => p.padId === "xs")!.plays).toBe("rim");
    expect(a.score.value).toBeGreaterThan(runAudit(layout, { ...kit, slots: [{ ...kit.slots[0]!, standIns: undefined }] }, catalogue).score.value);
  });
});

describe("layout and kit files carry the studio's strokes (kitwright.layout/v2, kitwright.kit/v2)", () => {
  const layout: Layout = { id: "l", name: "L", surface: { kind: "zones" }, hiHatPedal: null, pads: [pad("a", 38, "snare", "buzz-rim-shot"), pad("b", 42, "hat", "closed")] };

  it("a layout file round-trips with the strokes it names (and no others)", () => {
    const file = JSON.parse(JSON.stringify(layoutToFile(layout, studio)));
    expect(file.schema).toBe("kitwright.layout/v2");
    expect(file.layout.strokes.map((s: StudioStroke) => s.id)).toEqual(["buzz-rim-shot"]);
    const back = parseLayoutFile(file);
    expect(back.pads).toEqual(layout.pads);
    expect(back.strokes).toEqual([buzzRim]);
  });

  it("a stroke no one defines is refused with its path; a v1 file of built-ins is still read", () => {
    const bare = { schema: "kitwright.layout/v2", layout };
    expect(() => parseLayoutFile(bare)).toThrow(SchemaError);
    expect(() => parseLayoutFile(bare)).toThrow(/pads\.0\.target\.articulation: no stroke "buzz-rim-shot"/);
    expect(parseLayoutFile(bare, { strokes: studio }).pads[0]!.target!.articulation).toBe("buzz-rim-shot");
    const v1 = { schema: "kitwright.layout/v1", layout: { ...layout, pads: [pad("b", 42, "hat", "closed")] } };
    expect(parseLayoutFile(v1).pads).toHaveLength(1);
  });

  it("a kit's stroke map naming a studio stroke travels with its definition and what it leans on", () => {
    const kit: Kit = { id: "k", name: "K", slots: [{ id: "s", name: "Snare", family: "snare", instrumentId: "cg", standIns: { "buzz-rim-shot": "slap" } }] };
    const file = JSON.parse(JSON.stringify(kitToFile(kit, studio)));
    expect(file.schema).toBe("kitwright.kit/v2");
    expect(file.kit.strokes.map((s: StudioStroke) => s.id)).toEqual(["buzz-rim-shot"]);
    expect(parseKitFile(file).slots[0]!.standIns).toEqual({ "buzz-rim-shot": "slap" });
    const chained = [{ ...throat, neighbours: [{ to: "tight-tip", cost: 1 }] }, { id: "tight-tip", name: "tight tip", families: ["cowbell" as const], words: [], neighbours: [{ to: "tip", cost: 1 }] }];
    const k2: Kit = { id: "k2", name: "K2", slots: [{ id: "b", name: "Bell", family: "cowbell", instrumentId: "cb", standIns: { throat: "shank" } }] };
    expect(kitToFile(k2, chained).kit.strokes!.map((s) => s.id)).toEqual(["throat", "tight-tip"]);
  });
});

describe("the studio's strokes in the audit's inputs and exports", () => {
  it("a catalogue's layer groups may name the studio's strokes; unknown ones are still refused", () => {
    const layer = { index: 0, velocityLow: 1, velocityHigh: 127, meanStrikeLufs: -20, sampleIds: ["a"] };
    const input = {
      instruments: [{ id: "sn", name: "Snare", family: "snare" }],
      groups: [{ instrumentId: "sn", articulation: "buzz-rim-shot", mic: null, layers: [layer] }, { instrumentId: "sn", articulation: "whack", mic: null, layers: [layer] }],
    };
    expect(readCatalogue(input).instruments[0]!.articulations).toEqual([]);
    const r = readCatalogue(input, studio);
    expect(r.instruments[0]!.articulations.map((a) => a.articulation)).toEqual(["buzz-rim-shot"]);
    expect(r.problems).toEqual(['groups[1]: unknown articulation "whack"']);
  });

  it("the CSV's edges column names each edge of a stand-in's path and whose it is", () => {
    const layout: Layout = { id: "l", name: "L", surface: { kind: "zones" }, hiHatPedal: null, pads: [pad("buzz", 38, "snare", "buzz-rim-shot"), pad("tight", 42, "hat", "tight")] };
    const kit: Kit = { id: "k", name: "K", slots: [{ id: "snare", name: "Snare", family: "snare", instrumentId: "sn" }, { id: "hat", name: "Hats", family: "hi-hat", instrumentId: "hx" }] };
    const hats = instrument("hx", "Hats", "hi-hat", [["quarter-open", 2, 1]]);
    const rows = auditToCsv(runAudit(layout, kit, [catalogue[0]!, hats], { strokes: studio })).trimEnd().split("\r\n").map((l) => l.split(","));
    const edges = CSV_COLUMNS.indexOf("edges");
    expect(rows[0]![edges]).toBe("edges");
    expect(rows.find((r) => r[1] === "buzz")![edges]).toBe("buzz-rim-shot>rim-shot studio");
    // tight -> closed is the studio's edge (0.5), closed -> quarter-open the built-in one (1)
    expect(rows.find((r) => r[1] === "tight")![edges]).toBe("tight>closed studio; closed>quarter-open built-in");
  });

  it("a trigger zone named with a studio stroke's words aims at it", () => {
    expect(readZone("snare buzz rim")).toMatchObject({ family: "snare", articulation: "buzz" });
    expect(readZone("snare buzz rim", studio)).toMatchObject({ family: "snare", articulation: "buzz-rim-shot" });
  });
});
