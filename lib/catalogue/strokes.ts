// A studio's own strokes: the built-in articulation list per family (taxonomy.ts, trade words) plus the strokes a
// studio adds — a name, the words a file name may use for it, the families it belongs to and its nearest
// neighbours with a closeness (edges of the fallback graph, so a missing stroke still finds a stand-in).
// Pure: the server stores the list per studio (studio_strokes), the command line reads it from a
// `kitwright.strokes/v1` file, and the name reader, the fallback graph and the schemas take it as an argument.

import { z } from "zod";
import { ARTICULATIONS, FAMILIES, FAMILY_ARTICULATIONS, isArticulation, type Family, type Stroke } from "./taxonomy";

export type { Stroke };

export const STROKES_SCHEMA = "kitwright.strokes/v1";

/** How close a neighbour sounds, in words, and the graph cost it stands for (the built-in graphs use 0.5 to 4). */
export const CLOSENESS = [
  { id: "very-close", label: "very close", cost: 0.5 },
  { id: "close", label: "close", cost: 1 },
  { id: "alike", label: "alike", cost: 2 },
  { id: "distant", label: "distant", cost: 3 },
] as const;
export type ClosenessId = (typeof CLOSENESS)[number]["id"];

/** The closeness word for a cost (the nearest step). */
export function closenessOf(cost: number): (typeof CLOSENESS)[number] {
  let best: (typeof CLOSENESS)[number] = CLOSENESS[0];
  for (const c of CLOSENESS) if (Math.abs(c.cost - cost) < Math.abs(best.cost - cost)) best = c;
  return best;
}

export interface StrokeEdge {
  /** The neighbour: a built-in articulation or another stroke of the studio. */
  to: Stroke;
  /** Graph cost (lower is closer): one of CLOSENESS's costs for strokes made in the app. */
  cost: number;
}

export interface StudioStroke {
  /** Lower-case, hyphenated; never a built-in id. Made from the name (strokeIdFromName). */
  id: Stroke;
  /** As people read it: "buzz rim shot". */
  name: string;
  /** The families whose instruments record it ("grab" for crash, ride, china and splash). */
  families: Family[];
  /** Words or phrases a file name may use for it ("buzz rim", "brs"); matched on whole tokens. */
  words: string[];
  neighbours: StrokeEdge[];
}

/** A studio's stroke list; an empty list is the built-ins only. */
export type StrokeList = readonly StudioStroke[];

export const MAX_STUDIO_STROKES = 200;
export const STROKE_ID_MAX = 40;
const STROKE_ID_RE = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

/** A stroke's id from its name: "Buzz rim shot" -> "buzz-rim-shot". */
export function strokeIdFromName(name: string): string {
  return name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, STROKE_ID_MAX)
    .replace(/-+$/g, "");
}

/** A stroke id's shape (built-in or studio): lower-case words joined by hyphens, 1 to 40 characters. */
export const strokeIdSchema = z
  .string()
  .min(1)
  .max(STROKE_ID_MAX)
  .regex(STROKE_ID_RE, "a stroke is lower-case words joined by hyphens (rim-shot, buzz-rim-shot)");

/**
 * A word a studio stroke answers to, split as the name reader (names.ts tokenise) splits a file name: at
 * separators, camelCase and letter/digit boundaries, lower case ("BuzzRim" -> "buzz rim", "rs2" -> "rs 2").
 */
export function normaliseWord(w: string): string {
  return w
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/([a-z])([A-Z])/g, "$1 $2")
    .replace(/([A-Z]+)([A-Z][a-z])/g, "$1 $2")
    .replace(/([A-Za-z])(\d)/g, "$1 $2")
    .replace(/(\d)([A-Za-z])/g, "$1 $2")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, " ")
    .trim();
}

const family = z.enum(FAMILIES);
export const strokeNameSchema = z
  .string()
  .trim()
  .min(1, "Name the stroke.")
  .max(60)
  .refine((n) => strokeIdFromName(n).length > 0, "A stroke's name needs a letter or a digit.");
export const strokeEdgeSchema = z.object({ to: strokeIdSchema, cost: z.number().positive().max(10) });
export const studioStrokeSchema = z.object({
  id: strokeIdSchema,
  name: strokeNameSchema,
  families: z.array(family).min(1).max(FAMILIES.length),
  words: z.array(z.string().trim().min(1).max(40)).max(20),
  neighbours: z.array(strokeEdgeSchema).max(20),
});
export const strokeFileSchema = z.object({ schema: z.literal(STROKES_SCHEMA), strokes: z.array(studioStrokeSchema).max(MAX_STUDIO_STROKES) });

/** Problems of a stroke list as a whole (ids clash with built-ins or each other, neighbours unknown), path by path. */
export function strokeListProblems(list: StrokeList): { path: (string | number)[]; message: string }[] {
  const out: { path: (string | number)[]; message: string }[] = [];
  const ids = new Set<string>();
  list.forEach((s, i) => {
    if (isArticulation(s.id)) out.push({ path: [i, "id"], message: `"${s.id}" is a built-in stroke; a studio's own stroke needs another name` });
    if (ids.has(s.id)) out.push({ path: [i, "id"], message: `two strokes are called "${s.id}"` });
    ids.add(s.id);
    if (strokeIdFromName(s.name) !== s.id) out.push({ path: [i, "id"], message: `the id of "${s.name}" is "${strokeIdFromName(s.name)}", not "${s.id}"` });
  });
  list.forEach((s, i) => {
    s.neighbours.forEach((e, j) => {
      if (e.to === s.id) out.push({ path: [i, "neighbours", j, "to"], message: `"${s.id}" cannot be its own neighbour` });
      else if (!isArticulation(e.to) && !ids.has(e.to)) out.push({ path: [i, "neighbours", j, "to"], message: `no stroke "${e.to}"` });
    });
  });
  return out;
}

/** Read a `kitwright.strokes/v1` document (the command line's --strokes file); throws with every problem. */
export function parseStrokeFile(doc: unknown): StudioStroke[] {
  const r = strokeFileSchema.safeParse(doc);
  if (!r.success) throw new Error(`not a ${STROKES_SCHEMA} document: ${r.error.issues.map((i) => `${i.path.join(".") || "(root)"}: ${i.message}`).join("; ")}`);
  const problems = strokeListProblems(r.data.strokes);
  if (problems.length) throw new Error(`stroke list: ${problems.map((p) => `strokes.${p.path.join(".")}: ${p.message}`).join("; ")}`);
  return r.data.strokes.map(tidyStroke);
}

/** The document the command line reads (and the app's "Download the stroke list" writes). */
export function strokeFile(list: StrokeList): { schema: typeof STROKES_SCHEMA; strokes: StudioStroke[] } {
  return { schema: STROKES_SCHEMA, strokes: list.map(tidyStroke) };
}

/** A stroke with its words normalised and deduplicated, families in FAMILIES order. */
export function tidyStroke(s: StudioStroke): StudioStroke {
  const words = [...new Set(s.words.map(normaliseWord).filter((w) => w.length > 0))];
  const families = FAMILIES.filter((f) => s.families.includes(f));
  const seen = new Set<string>();
  const neighbours = s.neighbours.filter((e) => !seen.has(e.to) && seen.add(e.to));
  return { id: s.id, name: s.name.trim(), families, words, neighbours: neighbours.map((e) => ({ to: e.to, cost: e.cost })) };
}

/** Several stroke lists as one: an id keeps the definition of the first list that has it. */
export function mergeStrokes(...lists: (StrokeList | null | undefined)[]): StudioStroke[] {
  const out: StudioStroke[] = [];
  const ids = new Set<string>();
  for (const s of lists.flatMap((l) => l ?? [])) {
    if (ids.has(s.id)) continue;
    ids.add(s.id);
    out.push(s);
  }
  return out;
}

/** A studio stroke by id. */
export function findStroke(list: StrokeList | null | undefined, id: string): StudioStroke | undefined {
  return list?.find((s) => s.id === id);
}

/** True for a built-in articulation or one of the list's strokes. */
export function isKnownStroke(id: string, list?: StrokeList | null): boolean {
  return isArticulation(id) || !!findStroke(list, id);
}

/** The strokes a family's instruments are recorded with: the built-ins (trade order), then the studio's own. */
export function familyStrokes(f: Family, list?: StrokeList | null): Stroke[] {
  const own = (list ?? []).filter((s) => s.families.includes(f)).map((s) => s.id);
  return [...FAMILY_ARTICULATIONS[f], ...own];
}

/** Every stroke, built-in first (taxonomy order), then the studio's. */
export function allStrokes(list?: StrokeList | null): Stroke[] {
  return [...ARTICULATIONS, ...(list ?? []).map((s) => s.id)];
}

/** Whose a stroke is. */
export function strokeOwner(id: string, list?: StrokeList | null): "built-in" | "studio" | "unknown" {
  return isArticulation(id) ? "built-in" : findStroke(list, id) ? "studio" : "unknown";
}

/** An edge of a family's fallback graph contributed by the studio: [a, b, cost]. */
export type StudioGraphEdge = readonly [Stroke, Stroke, number];

/**
 * The studio's edges in the graph of `f`: every neighbour edge of a stroke of the family whose other end is a
 * built-in stroke of the family's graph or another studio stroke of the family (an edge to a stroke the family
 * does not hold would lead nowhere the family's instruments record).
 */
export function studioEdges(f: Family, list: StrokeList | null | undefined, inFamilyGraph: (a: Stroke) => boolean): StudioGraphEdge[] {
  if (!list?.length) return [];
  const mine = new Set(list.filter((s) => s.families.includes(f)).map((s) => s.id));
  const out: StudioGraphEdge[] = [];
  for (const s of list) {
    if (!mine.has(s.id)) continue;
    for (const e of s.neighbours) if (mine.has(e.to) || inFamilyGraph(e.to)) out.push([s.id, e.to, e.cost]);
  }
  return out;
}

/** A stable signature of a list (memo keys of the fallback search). */
const signatures = new WeakMap<object, string>();
export function strokeListSignature(list: StrokeList | null | undefined): string {
  if (!list?.length) return "";
  const hit = signatures.get(list);
  if (hit !== undefined) return hit;
  const sig = JSON.stringify(list.map((s) => [s.id, s.families, s.neighbours.map((e) => [e.to, e.cost])]));
  signatures.set(list, sig);
  return sig;
}

/**
 * The studio stroke a file name's tokens name, if any: the stroke whose word (one token or a phrase of several)
 * appears in the tokens, longest phrase first; a stroke whose families do not include `f` (when known) is skipped.
 * Returns the stroke and the token positions it used.
 */
export function studioStrokeInTokens(
  tokens: readonly string[],
  list: StrokeList | null | undefined,
  f: Family | null,
): { stroke: StudioStroke; at: number[] } | null {
  if (!list?.length || tokens.length === 0) return null;
  // the word of most parts wins ("buzz rim" over "rim"), the first listed on a tie
  let best: { stroke: StudioStroke; at: number[]; parts: number } | null = null;
  for (const s of list) {
    if (f && !s.families.includes(f)) continue;
    for (const w of s.words) {
      const parts = w.split(" ").filter(Boolean);
      if (!parts.length || (best && best.parts >= parts.length)) continue;
      const glued = parts.join("");
      for (let i = 0; i < tokens.length; i++) {
        const at = parts.every((p, k) => tokens[i + k] === p) ? parts.map((_p, k) => i + k) : parts.length > 1 && tokens[i] === glued ? [i] : null;
        if (at) {
          best = { stroke: s, at, parts: parts.length };
          break;
        }
      }
    }
  }
  return best && { stroke: best.stroke, at: best.at };
}
