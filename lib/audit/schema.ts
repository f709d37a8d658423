// JSON import/export of layouts, kits and catalogues in Kitwright's own versioned schemas (see SCHEMA.md).
//   kitwright.layout/v2    { schema, layout }       (v1 still read: built-in strokes only, no `strokes`)
//   kitwright.kit/v2       { schema, kit }          (v1 still read)
//   kitwright.catalogue/v1 { schema, instruments }
// v2 documents name strokes by id, built-in or a studio's own, and carry the definitions of the studio's own
// strokes they use (`strokes`), so another studio or the command line can read them.
// Parsing returns the plain types of types.ts or throws SchemaError with every problem, path by path.

import { z } from "zod";
import { FAMILIES } from "../catalogue/taxonomy";
import { findStroke, isKnownStroke, MAX_STUDIO_STROKES, mergeStrokes, strokeIdSchema, strokeListProblems, studioStrokeSchema, tidyStroke, type StrokeList, type StudioStroke } from "../catalogue/strokes";
import type { CatalogueInstrument, Kit, Layout } from "./types";

export const LAYOUT_SCHEMA = "kitwright.layout/v2";
export const KIT_SCHEMA = "kitwright.kit/v2";
/** Earlier tags still read (their strokes are built-ins; they carry no `strokes`). */
export const OLDER_LAYOUT_SCHEMAS = ["kitwright.layout/v1"] as const;
export const OLDER_KIT_SCHEMAS = ["kitwright.kit/v1"] as const;
export const LAYOUT_SCHEMAS = [LAYOUT_SCHEMA, ...OLDER_LAYOUT_SCHEMAS] as const;
export const KIT_SCHEMAS = [KIT_SCHEMA, ...OLDER_KIT_SCHEMAS] as const;
export const CATALOGUE_SCHEMA = "kitwright.catalogue/v1";

export const MAX_GRID_PADS = 64;
/** A trigger-zone list may carry one pad per MIDI note. */
export const MAX_ZONE_PADS = 128;

const id = z.string().min(1).max(128);
const name = z.string().min(1).max(200);
const articulation = strokeIdSchema;
/** The studio strokes a v2 file carries (their definitions; checked as a list by strokeListProblems). */
export const strokesField = z.array(studioStrokeSchema).max(MAX_STUDIO_STROKES).optional();
const family = z.enum(FAMILIES);
const midi7 = z.number().int().min(0).max(127);
const channel = z.number().int().min(1).max(16);

/** One pad (lenient object: file import); lib/validation/kit.ts builds the strict API form from its shape. */
export const padSchema = z.object({
  id,
  label: z.string().max(200),
  row: z.number().int().min(1).max(64).optional(),
  col: z.number().int().min(1).max(64).optional(),
  zone: z.string().max(200).optional(),
  note: midi7,
  channel,
  target: z.object({ slotId: id, articulation }).nullable(),
});

const pedalSchema = z.object({
  controller: z.number().int().min(0).max(119).default(4),
  channel: channel.default(10),
  slotId: id,
  closedAt: z.enum(["low", "high"]),
  zones: z
    .array(z.object({ low: midi7, high: midi7, articulation }).refine((zz) => zz.low <= zz.high, { message: "low must not exceed high" }))
    .min(1)
    .max(16),
  chickNote: midi7.nullable().default(null),
});

export const layoutBodySchema = z
  .object({
    id,
    name,
    surface: z.discriminatedUnion("kind", [
      z.object({ kind: z.literal("grid"), rows: z.number().int().min(1).max(64), cols: z.number().int().min(1).max(64) }),
      z.object({ kind: z.literal("zones") }),
    ]),
    pads: z.array(padSchema).min(1).max(MAX_ZONE_PADS),
    hiHatPedal: pedalSchema.nullable().default(null),
    slots: z.array(z.object({ id, name, family })).optional(),
    strokes: strokesField,
  })
  .superRefine((l, ctx) => {
    if (l.surface.kind === "grid") {
      const { rows, cols } = l.surface;
      if (rows * cols > MAX_GRID_PADS) ctx.addIssue({ code: "custom", path: ["surface"], message: `a grid holds 1 to ${MAX_GRID_PADS} pads (got ${rows} x ${cols})` });
      if (l.pads.length > rows * cols) ctx.addIssue({ code: "custom", path: ["pads"], message: `${l.pads.length} pads do not fit a ${rows} x ${cols} grid` });
      const cells = new Set<string>();
      l.pads.forEach((p, i) => {
        if (p.row === undefined || p.col === undefined) {
          ctx.addIssue({ code: "custom", path: ["pads", i], message: "a grid pad needs row and col" });
        } else if (p.row > rows || p.col > cols) {
          ctx.addIssue({ code: "custom", path: ["pads", i], message: `row ${p.row}, col ${p.col} is outside the ${rows} x ${cols} grid` });
        } else if (cells.has(`${p.row},${p.col}`)) {
          ctx.addIssue({ code: "custom", path: ["pads", i], message: `two pads on row ${p.row}, col ${p.col}` });
        } else cells.add(`${p.row},${p.col}`);
      });
    }
    const ids = new Set<string>();
    l.pads.forEach((p, i) => {
      if (ids.has(p.id)) ctx.addIssue({ code: "custom", path: ["pads", i, "id"], message: `duplicate pad id "${p.id}"` });
      ids.add(p.id);
    });
  });

export const layoutFileSchema = z.object({ schema: z.enum(LAYOUT_SCHEMAS), layout: layoutBodySchema });

export const kitBodySchema = z
  .object({
    id,
    name,
    slots: z
      .array(
        z.object({
          id,
          name,
          family,
          instrumentId: id.nullable(),
          standIns: z.record(articulation, articulation).optional(),
        }),
      )
      .max(256),
    strokes: strokesField,
  })
  .superRefine((k, ctx) => {
    const ids = new Set<string>();
    k.slots.forEach((s, i) => {
      if (ids.has(s.id)) ctx.addIssue({ code: "custom", path: ["slots", i, "id"], message: `duplicate slot id "${s.id}"` });
      ids.add(s.id);
    });
  });

export const kitFileSchema = z.object({ schema: z.enum(KIT_SCHEMAS), kit: kitBodySchema });

const layerSchema = z.object({
  index: z.number().int().min(0),
  velocityLow: z.number().int().min(1).max(127),
  velocityHigh: z.number().int().min(1).max(127),
  meanStrikeLufs: z.number(),
  sampleIds: z.array(z.string()),
});

export const instrumentSchema = z.object({
  id,
  name,
  family,
  pitchHz: z.number().positive().nullable().optional(),
  articulations: z.array(z.object({ articulation, mic: z.string().nullable().optional(), layers: z.array(layerSchema) })),
});

export const catalogueFileSchema = z.object({ schema: z.literal(CATALOGUE_SCHEMA), instruments: z.array(instrumentSchema) });

export class SchemaError extends Error {
  constructor(
    what: string,
    readonly issues: string[],
  ) {
    super(`not a valid ${what}:\n  ${issues.join("\n  ")}`);
    this.name = "SchemaError";
  }
}

function parseWith<T>(schema: z.ZodType<T>, what: string, input: unknown): T {
  const r = schema.safeParse(input);
  if (!r.success) {
    throw new SchemaError(
      what,
      r.error.issues.map((i) => `${i.path.length ? i.path.join(".") : "(root)"}: ${i.message}`),
    );
  }
  return r.data;
}

function fromText(input: unknown, what: string): unknown {
  if (typeof input !== "string") return input;
  try {
    return JSON.parse(input);
  } catch (e) {
    throw new SchemaError(what, [`not JSON: ${(e as Error).message}`]);
  }
}

/** Where a reader looks a stroke up: the document's own `strokes`, then the studio's (or the --strokes file). */
export interface StrokeContext {
  strokes?: StrokeList | null;
}

/** Every stroke a layout names (pads and pedal zones), with where. */
export function layoutStrokeUses(l: Pick<Layout, "pads" | "hiHatPedal">): { stroke: string; path: (string | number)[] }[] {
  const out: { stroke: string; path: (string | number)[] }[] = [];
  l.pads.forEach((p, i) => p.target && out.push({ stroke: p.target.articulation, path: ["pads", i, "target", "articulation"] }));
  l.hiHatPedal?.zones.forEach((z, i) => out.push({ stroke: z.articulation, path: ["hiHatPedal", "zones", i, "articulation"] }));
  return out;
}

/** Every stroke a kit's stroke maps name, with where. */
export function kitStrokeUses(k: Pick<Kit, "slots">): { stroke: string; path: (string | number)[] }[] {
  const out: { stroke: string; path: (string | number)[] }[] = [];
  k.slots.forEach((s, i) => {
    for (const [req, play] of Object.entries(s.standIns ?? {})) {
      out.push({ stroke: req, path: ["slots", i, "standIns", req] });
      if (play) out.push({ stroke: play, path: ["slots", i, "standIns", req] });
    }
  });
  return out;
}

/** The strokes a document may name: its own list (checked as a list) over the context's. */
function knownStrokes(what: string, tag: string, own: StudioStroke[] | undefined, ctx: StrokeContext): StudioStroke[] {
  if (own?.length && tag !== LAYOUT_SCHEMA && tag !== KIT_SCHEMA) throw new SchemaError(what, [`strokes: ${tag} documents carry no strokes (use the v2 schema)`]);
  const problems = strokeListProblems(own ?? []);
  if (problems.length) throw new SchemaError(what, problems.map((p) => `strokes.${p.path.join(".")}: ${p.message}`));
  return mergeStrokes((own ?? []).map(tidyStroke), ctx.strokes);
}

function checkUses(what: string, uses: { stroke: string; path: (string | number)[] }[], known: StrokeList): void {
  const bad = uses.filter((u) => !isKnownStroke(u.stroke, known));
  if (bad.length) throw new SchemaError(what, bad.map((u) => `${u.path.join(".")}: no stroke "${u.stroke}" (neither built-in nor among the file's or the studio's strokes)`));
}

/** Parse a v2 (or v1) file whose document carries strokes: the schema, then every stroke it names (see below). */
function parseStrokeDoc<D extends { strokes?: StudioStroke[] }>(
  input: unknown,
  ctx: StrokeContext,
  what: string,
  schema: z.ZodType<{ schema: string } & Record<string, unknown>>,
  key: string,
  uses: (doc: D) => { stroke: string; path: (string | number)[] }[],
): D {
  const data = parseWith(schema, what, fromText(input, what));
  const doc = data[key] as D;
  checkUses(what, uses(doc), knownStrokes(what, data.schema, doc.strokes, ctx));
  if (doc.strokes) doc.strokes = doc.strokes.map(tidyStroke);
  return doc;
}

/**
 * Parse a layout file (JSON text or parsed value) of schema kitwright.layout/v2 (or v1). Every stroke it names
 * must be built-in, one of the file's own `strokes` or one of `ctx.strokes`; the layout keeps the file's own list.
 */
export function parseLayoutFile(input: unknown, ctx: StrokeContext = {}): Layout {
  return parseStrokeDoc<Layout>(input, ctx, `${LAYOUT_SCHEMA} file`, layoutFileSchema, "layout", layoutStrokeUses);
}

/** Parse a kit file (JSON text or parsed value) of schema kitwright.kit/v2 (or v1); strokes checked as for layouts. */
export function parseKitFile(input: unknown, ctx: StrokeContext = {}): Kit {
  return parseStrokeDoc<Kit>(input, ctx, `${KIT_SCHEMA} file`, kitFileSchema, "kit", kitStrokeUses);
}

/**
 * The studio strokes a document must carry: those it names and, through their neighbours, every studio stroke
 * they lean on (so the file's list passes strokeListProblems on its own).
 */
export function strokesToCarry(named: Iterable<string>, list: StrokeList | null | undefined): StudioStroke[] {
  if (!list?.length) return [];
  const want = new Set<string>();
  const queue = [...named].filter((id) => findStroke(list, id));
  while (queue.length) {
    const id = queue.pop()!;
    if (want.has(id)) continue;
    want.add(id);
    for (const e of findStroke(list, id)?.neighbours ?? []) if (findStroke(list, e.to) && !want.has(e.to)) queue.push(e.to);
  }
  return list.filter((s) => want.has(s.id)).map(tidyStroke);
}

/** Parse a catalogue file (JSON text or parsed value) of schema kitwright.catalogue/v1. */
export function parseCatalogueFile(input: unknown): CatalogueInstrument[] {
  return parseWith(catalogueFileSchema, `${CATALOGUE_SCHEMA} file`, fromText(input, `${CATALOGUE_SCHEMA} file`)).instruments as CatalogueInstrument[];
}

/** A layout file; with the studio's strokes, it carries the ones the layout names (strokesToCarry). */
export function layoutToFile(layout: Layout, strokes?: StrokeList | null): { schema: typeof LAYOUT_SCHEMA; layout: Layout } {
  const { strokes: _own, ...rest } = layout;
  const carry = strokesToCarry(layoutStrokeUses(layout).map((u) => u.stroke), strokes ?? layout.strokes);
  return { schema: LAYOUT_SCHEMA, layout: carry.length ? { ...rest, strokes: carry } : rest };
}
/** A kit file; with the studio's strokes, it carries the ones its stroke maps name. */
export function kitToFile(kit: Kit, strokes?: StrokeList | null): { schema: typeof KIT_SCHEMA; kit: Kit } {
  const { strokes: _own, ...rest } = kit;
  const carry = strokesToCarry(kitStrokeUses(kit).map((u) => u.stroke), strokes ?? kit.strokes);
  return { schema: KIT_SCHEMA, kit: carry.length ? { ...rest, strokes: carry } : rest };
}
export function catalogueToFile(instruments: readonly CatalogueInstrument[]): { schema: typeof CATALOGUE_SCHEMA; instruments: CatalogueInstrument[] } {
  return { schema: CATALOGUE_SCHEMA, instruments: [...instruments] };
}
