// `--strokes <strokes.json>` as a person uses it: `kitwright catalogue | audit | suggest` run as real processes on
// snare folders from our own synthesizer (lib/synth), with a studio stroke of our own ("buzz rim shot", its words
// and its edge to the rim shot are a scenario, not a published list). Expected values come from how the folders
// and files were built: which strokes were recorded, which stroke the layout asks for, which edge the studio gave.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { kitwright } from "./run-kitwright";
import { isArticulation } from "../lib/catalogue/taxonomy";
import { strokeFile, type StudioStroke } from "../lib/catalogue/strokes";
import { layoutToFile, parseLayoutFile } from "../lib/audit/schema";
import { CSV_COLUMNS } from "../lib/audit/export";
import type { Kit, Layout } from "../lib/audit/types";
import { runAudit } from "../lib/audit/audit";
import { FOREIGN_ENTRY_COST } from "../lib/audit/fallback";
import { instrument } from "../lib/audit/test-catalogue";
import { formatText } from "./audit";
import { snare } from "../lib/synth/drums";
import { encodeWav } from "../lib/synth/wav";

const buzzRim: StudioStroke = { id: "buzz-rim-shot", name: "buzz rim shot", families: ["snare"], words: ["buzzrim", "buzz rim"], neighbours: [{ to: "rim-shot", cost: 0.5 }] };

let root: string;
let withBuzz: string; // centre, rim shot and buzz rim shot recorded
let noBuzz: string; // centre and rim shot only
let strokesJson: string;
const at = (name: string) => path.join(root, name);

/** A snare folder: two strengths of centre hits and rim shots, named the way a library is; `extra` adds files. */
function writeSnares(dir: string, extra: [name: string, articulation: "rim-shot" | "centre", velocity: number][] = []) {
  const spec = { diameterIn: 14, depthIn: 6.5, tuneHz: 190, shell: "brass" } as const;
  const files: [string, "rim-shot" | "centre", number][] = [
    ["snare_centre_v1.wav", "centre", 60],
    ["snare_centre_v2.wav", "centre", 115],
    ["snare_rimshot_v1.wav", "rim-shot", 60],
    ["snare_rimshot_v2.wav", "rim-shot", 115],
    ...extra,
  ];
  fs.mkdirSync(path.join(dir, "Snare"), { recursive: true });
  for (const [name, a, velocity] of files) {
    const wav = encodeWav(snare(spec, a, { sampleRate: 44_100, velocity, seed: name, seconds: 0.6 }), { sampleRate: 44_100, bits: 16 });
    fs.writeFileSync(path.join(dir, "Snare", name), wav);
  }
}

// one pad on the snare's centre, one aimed at the studio's stroke the noBuzz folder never recorded
const layout: Layout = {
  id: "studio-pads",
  name: "Studio pads",
  surface: { kind: "zones" },
  hiHatPedal: null,
  slots: [{ id: "snare", name: "Snare", family: "snare" }],
  pads: [
    { id: "head", label: "Head", zone: "snare head", note: 38, channel: 10, target: { slotId: "snare", articulation: "centre" } },
    { id: "buzz", label: "Buzz rim", zone: "snare buzz rim", note: 40, channel: 10, target: { slotId: "snare", articulation: "buzz-rim-shot" } },
  ],
};

beforeAll(() => {
  root = fs.mkdtempSync(path.join(os.tmpdir(), "kw-strokes-"));
  withBuzz = at("with-buzz");
  noBuzz = at("no-buzz");
  writeSnares(withBuzz, [["snare_buzzrim_v1.wav", "rim-shot", 90]]);
  writeSnares(noBuzz);
  strokesJson = at("strokes.json");
  fs.writeFileSync(strokesJson, JSON.stringify(strokeFile([buzzRim])));
  // a v2 layout naming the studio's stroke without carrying it (it relies on --strokes)
  fs.writeFileSync(at("bare-layout.json"), JSON.stringify({ schema: "kitwright.layout/v2", layout }));
}, 120_000);
afterAll(() => fs.rmSync(root, { recursive: true, force: true }));

type Sample = { path: string; family: string; articulation: string; articulationSource: string };
type Finding = { padId: string; outcome: string; requested: string; plays: string | null; standIn: { path: string[]; cost: number; edges: { from: string; to: string; cost: number; owner: string }[] } | null };

describe("kitwright catalogue --strokes", () => {
  it("sorts a file named with a studio stroke's words into that stroke; without --strokes it stays a built-in", async () => {
    const plain = await kitwright("catalogue", withBuzz, "--json");
    expect(plain.code).toBe(0);
    const before = (JSON.parse(plain.stdout) as { samples: Sample[] }).samples.find((s) => s.path === "Snare/snare_buzzrim_v1.wav")!;
    expect(before.family).toBe("snare");
    expect(isArticulation(before.articulation)).toBe(true);

    const r = await kitwright("catalogue", withBuzz, "--json", "--strokes", strokesJson);
    expect(r.code).toBe(0);
    const samples = (JSON.parse(r.stdout) as { samples: Sample[] }).samples;
    const by = Object.fromEntries(samples.map((s) => [s.path, s]));
    expect(by["Snare/snare_buzzrim_v1.wav"]).toMatchObject({ family: "snare", articulation: "buzz-rim-shot", articulationSource: "name" });
    // the built-in words still read as before
    expect([by["Snare/snare_centre_v1.wav"]!.articulation, by["Snare/snare_rimshot_v2.wav"]!.articulation]).toEqual(["centre", "rim-shot"]);
    // the CSV keeps the stroke's id too
    const csv = await kitwright("catalogue", withBuzz, "--csv", "--strokes", strokesJson);
    const header = csv.stdout.split("\n")[0]!.split(",");
    const row = csv.stdout.split("\n").find((l) => l.startsWith("Snare/snare_buzzrim_v1.wav,"))!.split(",");
    expect(row[header.indexOf("articulation")]).toBe("buzz-rim-shot");
  }, 120_000);
});

describe("kitwright audit --strokes", () => {
  it("a pad aimed at a studio stroke the kit never recorded stands in through the studio's edge, and says whose edge", async () => {
    const r = await kitwright("audit", "--layout", at("bare-layout.json"), "--catalogue", noBuzz, "--strokes", strokesJson, "--json");
    expect(r.code).toBe(0);
    const audit = JSON.parse(r.stdout) as { pads: Finding[]; strokes: StudioStroke[] };
    const buzz = audit.pads.find((p) => p.padId === "buzz")!;
    expect(buzz).toMatchObject({ outcome: "stand-in", requested: "buzz-rim-shot", plays: "rim-shot" });
    expect(buzz.standIn).toMatchObject({ path: ["buzz-rim-shot", "rim-shot"], cost: 0.5 });
    expect(buzz.standIn!.edges).toEqual([{ from: "buzz-rim-shot", to: "rim-shot", cost: 0.5, owner: "studio" }]);
    expect(audit.pads.find((p) => p.padId === "head")).toMatchObject({ outcome: "direct", plays: "centre" });
    expect(audit.strokes.map((s) => s.id)).toEqual(["buzz-rim-shot"]);

    const text = await kitwright("audit", "--layout", at("bare-layout.json"), "--catalogue", noBuzz, "--strokes", strokesJson);
    expect(text.stdout).toContain("via buzz-rim-shot > rim-shot cost 0.5, over the studio's edge buzz-rim-shot–rim-shot");
    expect(text.stdout).toMatch(/The studio's own strokes\n {2}buzz-rim-shot \("buzz rim shot", snare\): near rim-shot 0\.5/);

    const csv = await kitwright("audit", "--layout", at("bare-layout.json"), "--catalogue", noBuzz, "--strokes", strokesJson, "--csv");
    const rows = csv.stdout.trimEnd().split("\r\n").map((l) => l.split(","));
    const row = rows.find((x) => x[0] === "pad" && x[1] === "buzz")!;
    const col = (c: (typeof CSV_COLUMNS)[number]) => row[CSV_COLUMNS.indexOf(c)];
    expect([col("requested"), col("plays"), col("path"), col("edges")]).toEqual(["buzz-rim-shot", "rim-shot", "buzz-rim-shot>rim-shot", "buzz-rim-shot>rim-shot studio"]);
  }, 120_000);

  it("with the stroke recorded the pad plays it as recorded; without the list the layout is refused by name", async () => {
    const r = await kitwright("audit", "--layout", at("bare-layout.json"), "--catalogue", withBuzz, "--strokes", strokesJson, "--json");
    expect(r.code).toBe(0);
    expect((JSON.parse(r.stdout) as { pads: Finding[] }).pads.find((p) => p.padId === "buzz")).toMatchObject({ outcome: "direct", plays: "buzz-rim-shot" });

    const bare = await kitwright("audit", "--layout", at("bare-layout.json"), "--catalogue", noBuzz, "--json");
    expect(bare.code).toBe(2);
    expect(bare.stdout).toBe("");
    expect(bare.stderr).toContain('pads.1.target.articulation: no stroke "buzz-rim-shot"');
  }, 120_000);

  it("a layout file carrying its own strokes needs no --strokes, and its definition wins over the --strokes one", async () => {
    const own = at("own-layout.json");
    fs.writeFileSync(own, JSON.stringify(layoutToFile(layout, [buzzRim])));
    const r = await kitwright("audit", "--layout", own, "--catalogue", noBuzz, "--json");
    expect(r.code).toBe(0);
    const buzz = (JSON.parse(r.stdout) as { pads: Finding[] }).pads.find((p) => p.padId === "buzz")!;
    expect(buzz.standIn!.edges).toEqual([{ from: "buzz-rim-shot", to: "rim-shot", cost: 0.5, owner: "studio" }]);

    // the layout's buzz rim shot leans on the centre; the --strokes file's on the rim shot: the layout's is used
    const leansOnCentre = { ...buzzRim, neighbours: [{ to: "centre", cost: 1 }] };
    fs.writeFileSync(own, JSON.stringify(layoutToFile(layout, [leansOnCentre])));
    const m = await kitwright("audit", "--layout", own, "--catalogue", noBuzz, "--strokes", strokesJson, "--json");
    expect(m.code).toBe(0);
    const merged = (JSON.parse(m.stdout) as { pads: Finding[] }).pads.find((p) => p.padId === "buzz")!;
    expect(merged).toMatchObject({ plays: "centre", standIn: { path: ["buzz-rim-shot", "centre"], cost: 1 } });
    expect(merged.standIn!.edges).toEqual([{ from: "buzz-rim-shot", to: "centre", cost: 1, owner: "studio" }]);
  }, 120_000);
});

describe("kitwright suggest --strokes", () => {
  it("places the recorded studio stroke and the layout it prints carries the stroke's definition", async () => {
    const r = await kitwright("suggest", "--surface", "2x4", "--catalogue", withBuzz, "--strokes", strokesJson);
    expect([0, 1]).toContain(r.code);
    const file = JSON.parse(r.stdout) as { schema: string; layout: { strokes?: StudioStroke[] } };
    expect(file.schema).toBe("kitwright.layout/v2");
    expect(file.layout.strokes).toEqual([buzzRim]);
    // read back with no stroke list given: the file is enough
    const back = parseLayoutFile(file);
    expect(back.pads.filter((p) => p.target?.articulation === "buzz-rim-shot")).toHaveLength(1);
  }, 120_000);
});

describe("a bad --strokes file", () => {
  const bad = (name: string, content: string) => {
    fs.writeFileSync(at(name), content);
    return at(name);
  };

  it("audit: exit 2, the file and the problem named, no output and no file written", async () => {
    const f = bad("clash.json", JSON.stringify({ schema: "kitwright.strokes/v1", strokes: [{ id: "closed", name: "closed", families: ["hi-hat"], words: [], neighbours: [] }] }));
    const mid = at("out.mid");
    const r = await kitwright("audit", "--layout", at("bare-layout.json"), "--catalogue", noBuzz, "--strokes", f, "--json", "--smf", mid);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toContain(`kitwright audit: --strokes ${f}: stroke list: strokes.0.id: "closed" is a built-in stroke`);
    expect(fs.existsSync(mid)).toBe(false);
  });

  it("catalogue and suggest: not JSON, or the wrong document, is refused the same way", async () => {
    const notJson = bad("not-json.json", "{ strokes: ");
    const c = await kitwright("catalogue", withBuzz, "--json", "--strokes", notJson);
    expect(c.code).toBe(2);
    expect(c.stdout).toBe("");
    expect(c.stderr).toMatch(new RegExp(`^kitwright catalogue: --strokes ${notJson.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}: not JSON`));

    const layoutInstead = bad("wrong.json", JSON.stringify({ schema: "kitwright.layout/v2", layout }));
    const s = await kitwright("suggest", "--surface", "2x4", "--catalogue", noBuzz, "--strokes", layoutInstead);
    expect(s.code).toBe(2);
    expect(s.stdout).toBe("");
    expect(s.stderr).toContain(`kitwright suggest: --strokes ${layoutInstead}: not a kitwright.strokes/v1 document: schema: `);

    const missing = await kitwright("audit", "--layout", "trigger-five", "--catalogue", noBuzz, "--strokes", at("nowhere.json"));
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain(`--strokes ${at("nowhere.json")}: cannot read the file (ENOENT)`);
  });
});

describe("the audit's text names every stand-in's way", () => {
  it("studio and built-in edges by owner, the entry of a stroke the graph lacks, and the kit's stroke map", () => {
    const tight: StudioStroke = { id: "tight", name: "tight", families: ["hi-hat"], words: ["tight"], neighbours: [{ to: "closed", cost: 0.5 }] };
    const cat = [instrument("hh", "Hats", "hi-hat", [["quarter-open", 2, 1]]), instrument("cg", "Conga", "hand-drum", [["open-tone", 2, 1], ["slap", 2, 1]])];
    const pad = (id: string, note: number, slotId: string, articulation: string) => ({ id, label: id, note, channel: 10, target: { slotId, articulation } });
    const l: Layout = { id: "l", name: "L", surface: { kind: "zones" }, hiHatPedal: null, pads: [pad("tight", 42, "hat", "tight"), pad("xs", 37, "snare", "cross-stick"), pad("rim", 40, "snare", "rim-shot")] };
    const kit: Kit = { id: "k", name: "K", slots: [{ id: "hat", name: "Hats", family: "hi-hat", instrumentId: "hh" }, { id: "snare", name: "Snare", family: "snare", instrumentId: "cg", standIns: { "rim-shot": "slap" } }] };
    const text = formatText(runAudit(l, kit, cat, { strokes: [tight] }));
    // tight -> closed is the studio's edge (0.5), closed -> quarter-open the built-in one (1): fallback.ts
    expect(text).toContain("via tight > closed > quarter-open cost 1.5, over the studio's edge tight–closed, the built-in edge closed–quarter-open");
    // the hand-drum graph has no cross-stick: it enters at the conga's main stroke at the foreign-entry cost
    expect(text).toContain(`via cross-stick > open-tone cost ${FOREIGN_ENTRY_COST}, entering at the main stroke`);
    expect(text).toContain("via rim-shot > slap cost 0, by the kit's stroke map");
  });
});
