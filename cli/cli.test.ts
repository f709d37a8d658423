// The command line as a person uses it: `kitwright measure | catalogue | audit` run as real processes on a
// folder of mixed good and broken files. Expected values come from how the files were built (RIFF layout
// for the broken ones; the generator's known instruments for the catalogue), not from earlier runs.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { kitwright } from "./run-kitwright";
import { parseLayoutFile } from "../lib/audit/schema";
import { encodeWav } from "../lib/audio/encode";
import { demoScenario } from "../lib/synth/scenario";
import { renderScenarioFile } from "../lib/synth/render";

let dir: string;


beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "kw-cli-"));
  // good: a 0.5 s 1 kHz tone burst, 48 kHz 24-bit
  const n = 24000;
  const tone = Float32Array.from({ length: n }, (_, i) => 0.5 * Math.sin((2 * Math.PI * 1000 * i) / 48000) * Math.exp(-i / 4000));
  fs.writeFileSync(path.join(dir, "tone.wav"), encodeWav([tone], { sampleRate: 48000, bits: 24 }));
  // broken: not RIFF at all; a header whose data chunk claims far more bytes than the file has; RF64
  fs.writeFileSync(path.join(dir, "notes.wav"), "this is a text file, not audio\n");
  const good = encodeWav([tone], { sampleRate: 48000, bits: 16 });
  fs.writeFileSync(path.join(dir, "truncated.wav"), good.subarray(0, 44 + 1000));
  const rf64 = Buffer.from(good);
  rf64.write("RF64", 0, "latin1");
  fs.writeFileSync(path.join(dir, "big.wav"), rf64);
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe("kitwright measure", () => {
  it("reports every file, lists refused ones with their reason, and exits 1 when any was refused", async () => {
    const r = await kitwright("measure", dir, "--json");
    expect(r.code).toBe(1);
    const records = JSON.parse(r.stdout) as { file: string; status: string; code?: string; reason?: string; measurement?: { samplePeakDbfs: number; format: { bitsPerSample: number } } }[];
    const byName = Object.fromEntries(records.map((x) => [path.basename(x.file), x]));
    expect(Object.keys(byName).sort()).toEqual(["big.wav", "notes.wav", "tone.wav", "truncated.wav"]);
    expect(byName["notes.wav"]).toMatchObject({ status: "refused", code: "not-riff" });
    expect(byName["big.wav"]).toMatchObject({ status: "refused", code: "rf64" });
    // a data chunk claiming 48,000 bytes with 1,000 present is far beyond "slightly truncated"
    expect(byName["truncated.wav"]).toMatchObject({ status: "refused", code: "data-missing" });
    expect(byName["truncated.wav"].reason).toMatch(/47[ ,]?000 bytes/);
    expect(byName["tone.wav"].status).toBe("measured");
  });

  it("CSV has one header and one row per file", async () => {
    const r = await kitwright("measure", dir, "--csv");
    const lines = r.stdout.trim().split("\n");
    expect(lines).toHaveLength(5);
    expect(lines[0]).toMatch(/^file,/);
  });
});

describe("kitwright catalogue and audit on a generated folder", () => {
  let lib: string;
  beforeAll(() => {
    lib = fs.mkdtempSync(path.join(os.tmpdir(), "kw-cat-"));
    const files = demoScenario().filter((f) => /^(Kick_22x18|Snare_Brass14)\//.test(f.path) && !f.duplicateOf && f.sampleRate === 48000);
    for (const f of files) {
      fs.mkdirSync(path.join(lib, path.dirname(f.path)), { recursive: true });
      fs.writeFileSync(path.join(lib, f.path), renderScenarioFile(f));
    }
  }, 120_000);
  afterAll(() => fs.rmSync(lib, { recursive: true, force: true }));

  it("catalogue sorts the kick and the snare into their families with layers", async () => {
    const r = await kitwright("catalogue", lib, "--json");
    expect(r.code).toBe(0);
    const cat = JSON.parse(r.stdout) as { samples: { path: string; family: string; articulation: string; layerIndex: number | null }[]; instruments: { family: string }[] };
    const fam = (p: RegExp) => new Set(cat.samples.filter((s) => p.test(s.path)).map((s) => s.family));
    expect(fam(/^Kick_22x18\//)).toEqual(new Set(["kick"]));
    expect(fam(/^Snare_Brass14\//)).toEqual(new Set(["snare"]));
    expect(cat.instruments.map((i) => i.family).sort()).toEqual(["kick", "snare"]);
    expect(cat.samples.every((s) => s.layerIndex !== null)).toBe(true);
  }, 120_000);

  it("audit of the trigger-five template exits 1 because the toms and cymbals are missing, and names them silent", async () => {
    const r = await kitwright("audit", "--layout", "trigger-five", "--catalogue", lib, "--json");
    expect(r.code).toBe(1);
    const audit = JSON.parse(r.stdout) as { schema: string; pads: { outcome: string }[] };
    expect(audit.schema).toBe("kitwright.audit/v3");
    const outcomes = new Set(audit.pads.map((p) => p.outcome));
    expect(outcomes.has("silent")).toBe(true);
    expect(outcomes.has("direct")).toBe(true);
  }, 120_000);
});

describe("kitwright suggest on a generated five-piece folder", () => {
  let kitDir: string;
  beforeAll(() => {
    kitDir = fs.mkdtempSync(path.join(os.tmpdir(), "kw-sug-"));
    // one take per layer and one microphone keep the folder small; every instrument and stroke stays
    const files = demoScenario().filter(
      (f) => /^(Kick_22x18|Snare_Brass14|Toms|HiHat|Cymbals)\//.test(f.path) && !f.duplicateOf && f.sampleRate === 48000 && !/([ _]0[2-9]|RR[2-9]|_OH|_Room)/i.test(f.path),
    );
    for (const f of files) {
      fs.mkdirSync(path.join(kitDir, path.dirname(f.path)), { recursive: true });
      fs.writeFileSync(path.join(kitDir, f.path), renderScenarioFile(f));
    }
  }, 120_000);
  afterAll(() => fs.rmSync(kitDir, { recursive: true, force: true }));

  it("prints a kitwright.layout/v2 file for a 4x6 grid, hats on both sides of the snare, every pad aimed, reasons on stderr", async () => {
    const r = await kitwright("suggest", "--surface", "4x6", "--catalogue", kitDir);
    expect([0, 1]).toContain(r.code);
    const file = parseLayoutFile(JSON.parse(r.stdout));
    expect(file.surface).toEqual({ kind: "grid", rows: 4, cols: 6 });
    expect(file.pads.length).toBeGreaterThan(12);
    expect(file.pads.every((p) => p.target !== null && p.row! >= 1 && p.row! <= 4 && p.col! >= 1 && p.col! <= 6)).toBe(true);
    const snare = file.pads.find((p) => p.note === 38)!;
    const hats = file.pads.filter((p) => p.note === 42);
    expect(hats.map((h) => [h.row, h.col! - snare.col!])).toEqual([[snare.row, -1], [snare.row, 1]]);
    expect(r.stderr).toMatch(/both sides of the snare/);
    // the layout it printed audits with no silent pad against the same folder
    const out = path.join(kitDir, "..", `${path.basename(kitDir)}-layout.json`);
    fs.writeFileSync(out, r.stdout);
    const audit = await kitwright("audit", "--layout", out, "--catalogue", kitDir, "--json");
    fs.rmSync(out);
    expect(audit.code).toBe(0);
  }, 240_000);

  it("refuses a surface it cannot read, with the usage", async () => {
    const r = await kitwright("suggest", "--surface", "four by six", "--catalogue", kitDir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/rows x columns/);
  });
});
