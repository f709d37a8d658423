// JSON import/export of layouts, kits and catalogues in Kitwright's own versioned schemas (see SCHEMA.md).
//   kitwright.layout/v1    { schema, layout }
//   kitwright.kit/v1       { schema, kit }
//   kitwright.catalogue/v1 { schema, instruments }
// Parsing returns the plain types of types.ts or throws SchemaError with every problem, path by path.

import { z } from "zod";
import { ARTICULATIONS, FAMILIES } from "../catalogue/taxonomy";
import type { CatalogueInstrument, Kit, Layout } from "./types";

export const LAYOUT_SCHEMA = "kitwright.layout/v1";
export const KIT_SCHEMA = "kitwright.kit/v1";
export const CATALOGUE_SCHEMA = "kitwright.catalogue/v1";

export const MAX_GRID_PADS = 64;
/** A trigger-zone list may carry one pad per MIDI note. */
export const MAX_ZONE_PADS = 128;

const id = z.string().min(1).max(128);
const name = z.string().min(1).max(200);
const articulation = z.enum(ARTICULATIONS);
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

export const layoutFileSchema = z.object({ schema: z.literal(LAYOUT_SCHEMA), layout: layoutBodySchema });

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
          standIns: z.partialRecord(articulation, articulation).optional(),
        }),
      )
      .max(256),
  })
  .superRefine((k, ctx) => {
    const ids = new Set<string>();
    k.slots.forEach((s, i) => {
      if (ids.has(s.id)) ctx.addIssue({ code: "custom", path: ["slots", i, "id"], message: `duplicate slot id "${s.id}"` });
      ids.add(s.id);
    });
  });

export const kitFileSchema = z.object({ schema: z.literal(KIT_SCHEMA), kit: kitBodySchema });

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

/** Parse a layout file (JSON text or parsed value) of schema kitwright.layout/v1. */
export function parseLayoutFile(input: unknown): Layout {
  const data = parseWith(layoutFileSchema, `${LAYOUT_SCHEMA} file`, fromText(input, `${LAYOUT_SCHEMA} file`));
  return data.layout as Layout;
}

/** Parse a kit file (JSON text or parsed value) of schema kitwright.kit/v1. */
export function parseKitFile(input: unknown): Kit {
  return parseWith(kitFileSchema, `${KIT_SCHEMA} file`, fromText(input, `${KIT_SCHEMA} file`)).kit as Kit;
}

/** Parse a catalogue file (JSON text or parsed value) of schema kitwright.catalogue/v1. */
export function parseCatalogueFile(input: unknown): CatalogueInstrument[] {
  return parseWith(catalogueFileSchema, `${CATALOGUE_SCHEMA} file`, fromText(input, `${CATALOGUE_SCHEMA} file`)).instruments as CatalogueInstrument[];
}

export function layoutToFile(layout: Layout): { schema: typeof LAYOUT_SCHEMA; layout: Layout } {
  return { schema: LAYOUT_SCHEMA, layout };
}
export function kitToFile(kit: Kit): { schema: typeof KIT_SCHEMA; kit: Kit } {
  return { schema: KIT_SCHEMA, kit };
}
export function catalogueToFile(instruments: readonly CatalogueInstrument[]): { schema: typeof CATALOGUE_SCHEMA; instruments: CatalogueInstrument[] } {
  return { schema: CATALOGUE_SCHEMA, instruments: [...instruments] };
}
