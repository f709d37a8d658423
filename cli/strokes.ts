// `--strokes <strokes.json>`: a studio's own strokes for `kitwright catalogue`, `audit` and `suggest`, read from a
// kitwright.strokes/v1 file (lib/catalogue/strokes.ts parseStrokeFile), and how the commands combine that list with
// the strokes a layout or kit file carries (the file's own definition wins over the --strokes one).

import { readFile } from "node:fs/promises";
import { STROKES_SCHEMA, parseStrokeFile, type StudioStroke } from "../lib/catalogue/strokes";
import type { StrokeEdgeUsed } from "../lib/audit/fallback";

export const STROKES_USAGE = "--strokes <strokes.json>";
export const STROKES_HELP = `  --strokes     a studio's own strokes (a ${STROKES_SCHEMA} file): file names using their words sort into them,
                pads may aim at them, and their edges give stand-ins`;

/** A --strokes file that cannot be used; the message names the file and the problem. */
export class StrokeFileError extends Error {
  constructor(file: string, problem: string) {
    super(`--strokes ${file}: ${problem}`);
    this.name = "StrokeFileError";
  }
}

/** Read and check a kitwright.strokes/v1 file; throws StrokeFileError saying what is wrong. */
export async function readStrokeFile(file: string): Promise<StudioStroke[]> {
  let text: string;
  try {
    text = await readFile(file, "utf8");
  } catch (e) {
    throw new StrokeFileError(file, `cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`);
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    throw new StrokeFileError(file, `not JSON: ${(e as Error).message}`);
  }
  try {
    return parseStrokeFile(doc);
  } catch (e) {
    throw new StrokeFileError(file, (e as Error).message);
  }
}

/** The edges a stand-in's path used, in words with whose each is: "the studio's edge tight–closed". */
export function edgesInWords(edges: readonly StrokeEdgeUsed[]): string {
  return edges.map((e) => `${e.owner === "studio" ? "the studio's" : "the built-in"} edge ${e.from}–${e.to}`).join(", ");
}
