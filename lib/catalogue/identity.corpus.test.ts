// Instrument identity on real recordings: the open corpus built from Debian's fluid-soundfont-gm (wav/*.wav with
// opaque names, labels.json with one item per file; items of one `group` are copies or transpositions of one
// recording). Files are measured through lib/audio, as the server measures them.
//
// The corpus is read from KW_CORPUS_DIR (default <repo>/.data/corpus/fluid-gm). Without it the tests are skipped
// with a message, except in CI (CI=true), where a missing corpus fails them: the test command builds it first.
import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { decodeWav, encodeWav, measureBytes } from "../audio";
import type { Measurement } from "../audio/types";
import { catalogueSamples, type Catalogue, type CatalogueSampleInput } from "./catalogue";
import { shuffled } from "./test-helpers";

const CORPUS = process.env.KW_CORPUS_DIR ?? path.resolve(import.meta.dirname, "../../.data/corpus/fluid-gm");
const present = fs.existsSync(path.join(CORPUS, "labels.json")) && fs.existsSync(path.join(CORPUS, "wav"));
const inCi = process.env.CI === "true";
if (!present && !inCi) console.warn(`identity.corpus.test.ts skipped: no corpus at ${CORPUS} (set KW_CORPUS_DIR or build the fluid-gm corpus)`);

interface Item { file: string; group: string; family: string; excluded?: boolean }
interface Recording { group: string; file: string; bytes: Uint8Array; m: Measurement; mono: { x: Float32Array; fs: number } }

/** Mono mix of a decoded file. */
function mono(bytes: Uint8Array): { x: Float32Array; fs: number } {
  const d = decodeWav(bytes);
  const n = d.channels[0]!.length;
  const x = new Float32Array(n);
  for (const c of d.channels) for (let i = 0; i < n; i++) x[i]! += c[i]! / d.channels.length;
  return { x, fs: d.format.sampleRate };
}

/**
 * Largest normalised cross-correlation of two files' first 250 ms after their onsets, at lags within +-1.5 ms.
 * Some different sample records of the font hold one recording edited twice (cut shorter, faded): those
 * correlate at 0.9 or more and are one recording, not two drums.
 */
function sameRecordingScore(a: Recording, b: Recording): number {
  const A = a.mono;
  const B = b.mono;
  if (A.fs !== B.fs) return 0;
  const len = Math.round(0.25 * A.fs);
  const lagMax = Math.round(0.0015 * A.fs);
  const oa = Math.round((a.m.onsetMs / 1000) * A.fs);
  const ob = Math.round((b.m.onsetMs / 1000) * B.fs);
  let best = 0;
  for (let lag = -lagMax; lag <= lagMax; lag++) {
    let s = 0, ea = 0, eb = 0;
    for (let i = 0; i < len; i++) {
      const va = A.x[oa + i] ?? 0;
      const vb = B.x[ob + i + lag] ?? 0;
      s += va * vb;
      ea += va * va;
      eb += vb * vb;
    }
    if (ea > 0 && eb > 0) best = Math.max(best, s / Math.sqrt(ea * eb));
  }
  return best;
}

/** One file per distinct recording of a family (the first file of each group; groups holding an edit of an earlier group dropped). */
function recordingsOf(items: Item[], family: string): { kept: Recording[]; edits: string[] } {
  const first = new Map<string, Item>();
  for (const it of [...items].sort((a, b) => a.group.localeCompare(b.group) || a.file.localeCompare(b.file))) {
    if (it.family === family && !it.excluded && !first.has(it.group)) first.set(it.group, it);
  }
  const kept: Recording[] = [];
  const edits: string[] = [];
  for (const it of first.values()) {
    const bytes = new Uint8Array(fs.readFileSync(path.join(CORPUS, "wav", it.file)));
    const r: Recording = { group: it.group, file: it.file, bytes, m: measureBytes(bytes), mono: mono(bytes) };
    const same = kept.find((k) => sameRecordingScore(k, r) >= 0.9);
    if (same) edits.push(`${r.group} = ${same.group}`);
    else kept.push(r);
  }
  return { kept, edits };
}

/** The recording at another level, re-encoded at 24 bits (so it differs from the original by level alone), measured. */
function atLevel(r: Recording, gainDb: number): Measurement {
  const d = decodeWav(r.bytes);
  const g = 10 ** (gainDb / 20);
  return measureBytes(encodeWav(d.channels.map((c) => c.map((x) => x * g)), { sampleRate: d.format.sampleRate, bits: 24 }));
}


/** Instruments of a catalogue as sorted lists of sample ids, sorted. */
const partition = (cat: Catalogue) => cat.instruments.map((i) => [...i.sampleIds].sort()).sort((a, b) => a[0]!.localeCompare(b[0]!));

describe.skipIf(!present && !inCi)("instrument identity on real recordings (fluid-soundfont-gm corpus)", () => {
  const fams: Record<string, { kept: Recording[]; edits: string[] }> = {};
  beforeAll(() => {
    if (!present) throw new Error(`CI=true and no corpus at ${CORPUS}: build the fluid-gm corpus before the unit tests`);
    const items = (JSON.parse(fs.readFileSync(path.join(CORPUS, "labels.json"), "utf8")) as { items: Item[] }).items;
    for (const f of ["kick", "snare"]) fams[f] = recordingsOf(items, f);
    console.log(`corpus: ${fams.kick!.kept.length} distinct kick and ${fams.snare!.kept.length} distinct snare recordings; edits of one recording kept once: ${[...fams.kick!.edits, ...fams.snare!.edits].join(", ") || "none"}`);
  }, 60_000);

  for (const family of ["kick", "snare"]) {
    it(`distinct ${family}s, one hit each, in one folder named ${family}_01 .. : one instrument each`, () => {
      const recs = fams[family]!.kept;
      expect(recs.length, "the corpus should hold a dozen or more distinct recordings").toBeGreaterThanOrEqual(12);
      const samples: CatalogueSampleInput[] = shuffled(recs, 7).map((r, i) => ({ id: r.group, path: `${family}s/${family}_${String(i + 1).padStart(2, "0")}.wav`, measurement: r.m }));
      const cat = catalogueSamples(samples);
      expect(cat.samples.every((s) => s.family === family && s.familySource === "name")).toBe(true);
      expect(partition(cat)).toEqual(recs.map((r) => [r.group]).sort((a, b) => a[0]!.localeCompare(b[0]!)));
    });

    it(`distinct ${family}s in a folder named for the family, file names that say nothing: one instrument each`, () => {
      const recs = fams[family]!.kept;
      const folder = `${family.charAt(0).toUpperCase()}${family.slice(1)}s`;
      const samples: CatalogueSampleInput[] = recs.map((r) => ({ id: r.group, path: `${folder}/${r.file}`, measurement: r.m }));
      const cat = catalogueSamples(samples);
      expect(cat.samples.every((s) => s.family === family && s.name.roundRobin === null && s.name.velocity === null)).toBe(true);
      expect(partition(cat)).toEqual(recs.map((r) => [r.group]).sort((a, b) => a[0]!.localeCompare(b[0]!)));
    });

    it(`each ${family} with copies at -6 and -18 dB: one instrument per recording, its copies three layers, softest first`, () => {
      const recs = fams[family]!.kept;
      const takes = recs.flatMap((r) => [0, -6, -18].map((g) => ({ id: `${r.group}@${g}`, m: g === 0 ? r.m : atLevel(r, g) })));
      const samples: CatalogueSampleInput[] = shuffled(takes, 11).map((t, i) => ({ id: t.id, path: `${family}s/${family}_${String(i + 1).padStart(2, "0")}.wav`, measurement: t.m }));
      const cat = catalogueSamples(samples);
      expect(partition(cat)).toEqual(recs.map((r) => [`${r.group}@-18`, `${r.group}@-6`, `${r.group}@0`].sort()).sort((a, b) => a[0]!.localeCompare(b[0]!)));
      for (const r of recs) {
        const mine = cat.samples.filter((s) => s.id.startsWith(`${r.group}@`));
        expect(new Set(mine.map((s) => s.groupKey)).size, `${r.group}: one layer group`).toBe(1);
        expect(mine.sort((a, b) => a.strikeLufs - b.strikeLufs).map((s) => [s.id, s.layerIndex])).toEqual([[`${r.group}@-18`, 0], [`${r.group}@-6`, 1], [`${r.group}@0`, 2]]);
      }
    }, 30_000);
  }
});
