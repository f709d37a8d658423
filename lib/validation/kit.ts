// Shared zod schemas for kits, layouts and audits (forms and route handlers use the same ones).
// Bodies are strict (unknown fields are refused with 422); the document shapes follow lib/audit/schema.ts
// (kitwright.kit/v2, kitwright.layout/v2), whose own refinements (grid cells, duplicate ids) run on top.
import { z } from "zod";
import { FAMILIES } from "@/lib/catalogue/taxonomy";
import { strokeIdSchema } from "@/lib/catalogue/strokes";
import { KIT_SCHEMAS, LAYOUT_SCHEMAS, strokesField as carriedStrokes, kitBodySchema, layoutBodySchema, MAX_GRID_PADS, MAX_ZONE_PADS, padSchema as auditPadSchema } from "@/lib/audit/schema";
import { TEMPLATE_NAMES } from "@/lib/audit/templates";
import { EXPORT_FORMAT_IDS } from "@/lib/audit/export-formats";
import { idParam } from "./studio";

const name = z.string().trim().min(1, "Give it a name.").max(160);
const sid = z.string().min(1).max(128);
/** A stroke id (built-in or the studio's own; the server checks it names one the studio knows). */
const articulation = strokeIdSchema;

const family = z.enum(FAMILIES);
const midi7 = z.number().int().min(0).max(127);
const channel = z.number().int().min(1).max(16);

/** Forward the issues of a lib/audit schema (its cross-field checks) onto a strict schema. */
function alsoCheck<T>(schema: z.ZodType<T>) {
  return (value: unknown, ctx: z.RefinementCtx) => {
    const r = schema.safeParse(value);
    if (!r.success) for (const i of r.error.issues) ctx.addIssue({ code: "custom", path: i.path as (string | number)[], message: i.message });
  };
}

export const kitSlotSchema = z.strictObject({
  id: sid,
  name: z.string().trim().min(1, "Name the slot.").max(200),
  family,
  instrumentId: sid.nullable(),
  standIns: z.record(articulation, articulation).optional(),
});
export const kitSlotsSchema = z.array(kitSlotSchema).max(256);

export const kitDocSchema = z.strictObject({ id: sid, name: z.string().min(1).max(200), slots: kitSlotsSchema, strokes: carriedStrokes }).superRefine(alsoCheck(kitBodySchema));
export const kitFileStrictSchema = z.strictObject({ schema: z.enum(KIT_SCHEMAS), kit: kitDocSchema });

export const createKitSchema = z
  .strictObject({
    name,
    slots: kitSlotsSchema.optional(),
    template: z.enum(TEMPLATE_NAMES as [string, ...string[]]).optional(),
    /** With a template: fill the slots from this library's instruments only (else from every library). */
    libraryId: idParam.optional(),
  })
  .refine((b) => !(b.slots && b.template), { message: "Give slots or a template, not both." })
  .refine((b) => !b.libraryId || b.template, { path: ["libraryId"], message: "A library is chosen only to fill a kit template." })
  .superRefine((b, ctx) => {
    if (b.slots) alsoCheck(kitBodySchema)({ id: "x", name: "x", slots: b.slots }, ctx);
  });
export const updateKitSchema = z
  .strictObject({ name: name.optional(), slots: kitSlotsSchema.optional() })
  .refine((b) => b.name !== undefined || b.slots !== undefined, { message: "Send a name or slots." })
  .superRefine((b, ctx) => {
    if (b.slots) alsoCheck(kitBodySchema)({ id: "x", name: "x", slots: b.slots }, ctx);
  });
export const copySchema = z.strictObject({ name: name.optional() });

// the pad's fields as lib/audit/schema.ts defines them, refusing unknown fields here and in the target too
const padSchema = z.strictObject({ ...auditPadSchema.shape, target: z.strictObject({ slotId: sid, articulation }).nullable() });
const pedalSchema = z.strictObject({
  controller: z.number().int().min(0).max(119),
  channel,
  slotId: sid,
  closedAt: z.enum(["low", "high"]),
  zones: z.array(z.strictObject({ low: midi7, high: midi7, articulation })).min(1).max(16),
  chickNote: midi7.nullable(),
});
const surfaceSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("grid"), rows: z.number().int().min(1).max(64), cols: z.number().int().min(1).max(64) }),
  z.strictObject({ kind: z.literal("zones") }),
]);
const layoutFields = {
  name: z.string().min(1).max(200),
  surface: surfaceSchema,
  pads: z.array(padSchema).min(1).max(128),
  hiHatPedal: pedalSchema.nullable(),
  slots: z.array(z.strictObject({ id: sid, name: z.string().min(1).max(200), family })).optional(),
};
export const layoutDocSchema = z.strictObject({ id: sid, ...layoutFields, strokes: carriedStrokes }).superRefine(alsoCheck(layoutBodySchema));
export const layoutFileStrictSchema = z.strictObject({ schema: z.enum(LAYOUT_SCHEMAS), layout: layoutDocSchema });
/** The editor saves the whole layout (the server keeps the row id). */
export const layoutContentSchema = z.strictObject(layoutFields).superRefine((v, ctx) => alsoCheck(layoutBodySchema)({ id: "x", ...v }, ctx));

export const createLayoutSchema = z
  .strictObject({
    name,
    template: z.enum(TEMPLATE_NAMES as [string, ...string[]]).optional(),
    grid: z.strictObject({ rows: z.number().int().min(1).max(64), cols: z.number().int().min(1).max(64) }).optional(),
    zones: z.number().int().min(1).max(128).optional(),
  })
  .refine((b) => [b.template, b.grid, b.zones].filter((x) => x !== undefined).length === 1, { message: "Choose one of: a template, a blank grid, or a list of trigger zones." })
  .refine((b) => !b.grid || b.grid.rows * b.grid.cols <= MAX_GRID_PADS, { message: `A grid holds 1 to ${MAX_GRID_PADS} pads.`, path: ["grid"] });
export const updateLayoutSchema = z
  .strictObject({ name: name.optional(), layout: layoutContentSchema.optional() })
  .refine((b) => b.name !== undefined || b.layout !== undefined, { message: "Send a name or a layout." });

/** POST .../layouts/suggest: a surface (a grid, or named trigger zones) and the kit to suggest a layout for. */
export const suggestLayoutSchema = z.strictObject({
  kitId: idParam,
  surface: z.discriminatedUnion("kind", [
    z
      .strictObject({ kind: z.literal("grid"), rows: z.number().int().min(1).max(64), cols: z.number().int().min(1).max(64) })
      .refine((g) => g.rows * g.cols <= MAX_GRID_PADS, { message: `A grid holds 1 to ${MAX_GRID_PADS} pads.` }),
    z.strictObject({
      kind: z.literal("zones"),
      zones: z.array(z.string().trim().min(1, "A zone needs a name.").max(80)).min(1, "Name at least one trigger zone.").max(MAX_ZONE_PADS),
    }),
  ]),
  standIns: z.boolean().optional(),
  name: name.optional(),
});

/** PUT .../layouts/:layoutId/share: publish with a short description; `newLink` replaces the link. */
export const publishLayoutSchema = z.strictObject({
  description: z.string().trim().max(2000, "At most 2,000 characters."),
  newLink: z.boolean().optional(),
});
/** POST .../shared-layouts/import: the token of the link (its last part). */
export const importSharedSchema = z.strictObject({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, "That is not a Kitwright share link.") });
export const sharedParams = z.strictObject({ token: z.string().max(200) });

export const runAuditSchema = z.strictObject({ layoutId: idParam, kitId: idParam });
export const auditListQuery = z.strictObject({ layoutId: idParam.optional() });
export const compareQuery = z.strictObject({ before: idParam, after: idParam });
export const exportQuery = z.strictObject({ format: z.enum(EXPORT_FORMAT_IDS) });

export const kitParams = z.strictObject({ studioId: idParam, kitId: idParam });
export const layoutParams = z.strictObject({ studioId: idParam, layoutId: idParam });
export const auditParams = z.strictObject({ studioId: idParam, auditId: idParam });
