// The corpus of real drum recordings on disk: where it lives and what each labels.json item says.
// Shared by the builder, the training and evaluation scripts and the tests that read the corpus.

import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import type { Articulation, Family } from "../../lib/catalogue/taxonomy";

/** Bump when the rendering or the labels change: the corpus is then rebuilt. */
export const CORPUS_BUILDER_VERSION = 2;

export interface CorpusItem {
  /** Opaque file name under wav/ (says nothing of the sound). */
  file: string;
  /** One physical recording: its stereo halves, velocity layers, transpositions and stacked layers. */
  group: string;
  /** Bank 128 program of the kit where it was first found. */
  program: number;
  kitKind: "acoustic" | "electronic" | "brush";
  /** General MIDI key (35-81) and its name in the GM Level 1 map. */
  key: number;
  gmName: string;
  velocity: number;
  family: Family;
  /** null where the key map does not name a stroke of ours (brush strokes). */
  articulation: Articulation | null;
  channels: number;
  durationSec: number;
  /** Other kits and keys that play exactly this render. */
  alsoAt: { program: number; key: number; velocity: number }[];
  /** Set when the item is kept out of training and evaluation, with the reason. */
  excluded?: string;
  note?: string;
}

export interface CorpusFile {
  builderVersion: number;
  source: { package: string; licence: string; file: string; sha256: string; keyMap: string };
  items: CorpusItem[];
}

export function corpusDir(): string {
  return process.env.KW_CORPUS_DIR ?? path.resolve(__dirname, "../../.data/corpus/fluid-gm");
}

/** The corpus's labels, or null when it has not been built (`npm run corpus`). */
export function readCorpus(dir = corpusDir()): CorpusFile | null {
  const p = path.join(dir, "labels.json");
  if (!existsSync(p)) return null;
  return JSON.parse(readFileSync(p, "utf8")) as CorpusFile;
}
