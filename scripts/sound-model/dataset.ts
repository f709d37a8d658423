// The rows the sound model learns from and is judged on: the open corpus of real recordings
// (scripts/corpus, npm run corpus) and our own generator's library (lib/synth), each file measured by
// lib/audio exactly as an upload is, then turned into the model's features (lib/catalogue/sound-features.ts).
// Training rows of the corpus are augmented (other gains, a few semitones of transposition, a noise floor, a
// shortened tail, a mono fold): a held-out recording is never augmented and its copies never train the fold
// that judges it.

import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { decodeWav, measureBytes, type Measurement } from "../../lib/audio";
import { soundFeatures } from "../../lib/catalogue/sound-features";
import type { TrainingRow } from "../../lib/catalogue/sound-model";
import { demoScenario } from "../../lib/synth/scenario";
import { renderScenarioFile } from "../../lib/synth/render";
import { renderVariety, varietyFiles } from "../../lib/synth/varieties";
import { encodeWav } from "../../lib/synth/wav";
import { corpusDir, readCorpus, type CorpusItem } from "../corpus/corpus";

export interface Row extends TrainingRow {
  id: string;
  source: "corpus" | "generator";
  /** the augmentation applied ("" for the file as it is) */
  augmentation: string;
  kitKind?: CorpusItem["kitKind"];
  key?: number;
  measurement: Measurement;
}

export const AUGMENTATIONS = ["gain -15 dB", "up 2 semitones", "down 2 semitones", "noise floor", "short tail", "mono"] as const;
type Augmentation = (typeof AUGMENTATIONS)[number];

function resample(x: Float32Array, ratio: number): Float32Array {
  const n = Math.floor(x.length / ratio);
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const p = i * ratio, k = Math.floor(p), f = p - k;
    out[i] = x[k]! + ((x[k + 1] ?? x[k]!) - x[k]!) * f;
  }
  return out;
}

/** A deterministic pseudo-random sequence (for the added noise), seeded by a string. */
function noise(seed: string, n: number): Float32Array {
  let s = createHash("sha256").update(seed).digest().readUInt32LE(0) || 1;
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    s ^= s << 13; s ^= s >>> 17; s ^= s << 5;
    out[i] = ((s >>> 0) / 4294967296 - 0.5) * 2;
  }
  return out;
}

export function augment(channels: Float32Array[], a: Augmentation, seed: string): Float32Array[] {
  switch (a) {
    case "gain -15 dB":
      return channels.map((c) => c.map((x) => x * 10 ** (-15 / 20)));
    case "up 2 semitones":
      return channels.map((c) => resample(c, 2 ** (2 / 12)));
    case "down 2 semitones":
      return channels.map((c) => resample(c, 2 ** (-2 / 12)));
    case "noise floor": {
      let peak = 0;
      for (const c of channels) for (const x of c) peak = Math.max(peak, Math.abs(x));
      const g = peak * 10 ** (-60 / 20);
      return channels.map((c, ch) => {
        const z = noise(`${seed}:${ch}`, c.length);
        return c.map((x, i) => x + g * z[i]!);
      });
    }
    case "short tail":
      // the last 60 % of the file faded out over its first half (an editor's shorter fade)
      return channels.map((c) => {
        const start = Math.floor(c.length * 0.4), len = Math.max(1, Math.floor(c.length * 0.3));
        return c.slice(0, start + len).map((x, i) => (i < start ? x : x * 0.5 * (1 + Math.cos((Math.PI * (i - start)) / len))));
      });
    case "mono": {
      if (channels.length === 1) return channels;
      const m = new Float32Array(channels[0]!.length);
      for (const c of channels) for (let i = 0; i < m.length; i++) m[i]! += c[i]! / channels.length;
      return [m];
    }
  }
}

export function corpusRows(opts: { augment: boolean; dir?: string } = { augment: false }): Row[] {
  const dir = opts.dir ?? corpusDir();
  const corpus = readCorpus(dir);
  if (!corpus) throw new Error(`no corpus in ${dir}: run npm run corpus first`);
  const rows: Row[] = [];
  for (const item of corpus.items) {
    if (item.excluded) continue;
    const bytes = new Uint8Array(readFileSync(path.join(dir, "wav", item.file)));
    const base = { family: item.family, articulation: item.articulation, group: `corpus:${item.group}`, source: "corpus" as const, kitKind: item.kitKind, key: item.key };
    const m = measureBytes(bytes);
    rows.push({ ...base, id: item.file, augmentation: "", features: soundFeatures(m), measurement: m });
    if (!opts.augment) continue;
    const decoded = decodeWav(bytes);
    for (const a of AUGMENTATIONS) {
      if (a === "mono" && decoded.channels.length === 1) continue;
      const chs = augment(decoded.channels as Float32Array[], a, item.file);
      const am = measureBytes(encodeWav(chs, { sampleRate: decoded.format.sampleRate, bits: 24 }));
      rows.push({ ...base, id: `${item.file}#${a}`, augmentation: a, features: soundFeatures(am), measurement: am });
    }
  }
  return rows;
}

/**
 * What our generator contributes: the demo library's scenario seeds and the training-variety seeds
 * (lib/synth/varieties.ts) with their scale (instruments per kind). Variety seeds [1, 2], with the features drawn
 * per node (sound-model.ts), lift the held-out corpus from 81.4 % / 69.0 % (family / stroke, mean over forest
 * seeds 7-12) to the figures in scripts/sound-model/README.md; `run.ts eval --no-varieties` leaves them out.
 */
export const GENERATOR: { demoSeeds: number[]; varietySeeds: number[]; varietyScale: number } = { demoSeeds: [1, 2], varietySeeds: [1, 2], varietyScale: 1 };

/** Our generator's rows: the demo library and the training varieties; each instrument is one group. */
export function generatorRows(opts = GENERATOR): Row[] {
  const rows: Row[] = [];
  for (const seed of opts.demoSeeds) {
    for (const f of demoScenario({ seed })) {
      if (f.duplicateOf || f.post) continue; // damaged files teach nothing about the sound
      const m = measureBytes(renderScenarioFile(f));
      rows.push({
        id: `gen${seed}:${f.path}`,
        source: "generator",
        augmentation: "",
        family: f.truth.family,
        articulation: f.truth.articulation,
        group: `generator:${f.truth.instrumentId}`,
        features: soundFeatures(m),
        measurement: m,
      });
    }
  }
  for (const seed of opts.varietySeeds) {
    for (const f of varietyFiles(seed, opts.varietyScale)) {
      const m = measureBytes(encodeWav(renderVariety(f), { sampleRate: f.sampleRate, bits: 24 }));
      rows.push({
        id: `variety:${f.id}`,
        source: "generator",
        augmentation: "",
        family: f.family,
        articulation: f.articulation,
        group: `generator:${f.instrument.id}`,
        features: soundFeatures(m),
        measurement: m,
      });
    }
  }
  return rows;
}

/** SHA-256 over the rows' ids, labels and features: the training data's fingerprint in the model file. */
export function dataHash(rows: Row[]): string {
  const h = createHash("sha256");
  for (const r of rows) h.update(`${r.id}|${r.family}|${r.articulation}|${r.features.map((x) => x.toFixed(6)).join(",")}\n`);
  return h.digest("hex");
}
