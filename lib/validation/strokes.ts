// Shared zod schemas for a studio's own strokes (the strokes page's form and the route handlers use the same ones).
import { z } from "zod";
import { FAMILIES } from "@/lib/catalogue/taxonomy";
import { CLOSENESS, strokeIdSchema, strokeNameSchema } from "@/lib/catalogue/strokes";
import { idParam } from "./studio";

const COSTS = CLOSENESS.map((c) => c.cost) as number[];

export const strokeInputSchema = z.strictObject({
  name: strokeNameSchema,
  families: z.array(z.enum(FAMILIES)).min(1, "Choose at least one family.").max(FAMILIES.length),
  /** Words or phrases of file names; split and lower-cased as the name reader reads names. */
  words: z.array(z.string().trim().min(1).max(40)).max(20, "At most 20 words."),
  neighbours: z
    .array(z.strictObject({ to: strokeIdSchema, cost: z.number().refine((c) => COSTS.includes(c), `closeness is one of ${CLOSENESS.map((c) => `${c.label} (${c.cost})`).join(", ")}`) }))
    .max(20, "At most 20 neighbours."),
});

export const updateStrokeSchema = strokeInputSchema.extend({
  /** Renaming a stroke that something uses: true moves every use to the new name. */
  moveUses: z.boolean().optional(),
});

export const strokeParams = z.strictObject({ studioId: idParam, strokeId: strokeIdSchema });
/** GET .../strokes?download=1: the list as a kitwright.strokes/v1 file. */
export const strokeListQuery = z.strictObject({ download: z.literal("1").optional() });
export const deleteStrokeQuery = z.strictObject({ moveTo: strokeIdSchema.optional() });
