import { mkdtempSync, readFileSync, readdirSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { benchFile, generateBenchSet } from "../bench/generate";
import { generateDemoLibrary } from "./generate-demo-library";

const dirs: string[] = [];
const tmp = () => {
  const d = mkdtempSync(path.join(tmpdir(), "kitwright-synth-"));
  dirs.push(d);
  return d;
};
afterAll(() => dirs.forEach((d) => rmSync(d, { recursive: true, force: true })));

describe("generateDemoLibrary", () => {
  it("writes the selected files in their folders, with the duplicate byte-identical to its original", () => {
    const out = tmp();
    const s = generateDemoLibrary(out, { filter: (f) => f.path.startsWith("HiHat/hh_closed_mf") || f.path.startsWith("Percussion/") });
    expect(s.files).toBe(4 + 9);
    const hat = readdirSync(path.join(out, "HiHat")).sort();
    expect(hat).toEqual(["hh_closed_mf_01.wav", "hh_closed_mf_02.wav", "hh_closed_mf_03.wav", "hh_closed_mf_04.wav"]);
    const a = readFileSync(path.join(out, "HiHat/hh_closed_mf_02.wav"));
    const b = readFileSync(path.join(out, "HiHat/hh_closed_mf_04.wav"));
    expect(a.equals(b)).toBe(true);
    expect(s.faults.map((f) => f.kind).sort()).toEqual(["duplicate", "missing-layer"]);
    const total = s.written.reduce((n, w) => n + w.bytes, 0);
    expect(total).toBe(s.bytes);
    // a mono 24-bit 48 kHz cowbell of 1 s: 44-byte header + 48000 * 3 bytes
    expect(statSync(path.join(out, "Percussion/Cowbell/cowbell_hit_med_1.wav")).size).toBe(44 + 48000 * 3);
  });
});

describe("generateBenchSet", () => {
  it("is deterministic, every file different, in the requested format", () => {
    const o = { seconds: 0.25, sampleRate: 48000, bits: 24 as const, channels: 2 as const };
    const r = generateBenchSet(tmp(), 4, o);
    expect(r.files).toHaveLength(4);
    const bytes = r.files.map((f) => readFileSync(f));
    expect(new Set(bytes.map((b) => b.toString("base64"))).size).toBe(4);
    expect(Buffer.from(benchFile(2, o).bytes).equals(bytes[2])).toBe(true);
    const dv = new DataView(bytes[0].buffer, bytes[0].byteOffset);
    expect(dv.getUint16(22, true)).toBe(2);
    expect(dv.getUint32(24, true)).toBe(48000);
    expect(dv.getUint16(34, true)).toBe(24);
    expect(bytes[0].length).toBe(44 + Math.round(0.25 * 48000) * 6);
  });
});
