// Shared zod schemas for libraries, samples, instruments (used by the API routes and the forms).
import { z } from "zod";
import { FAMILIES } from "@/lib/catalogue/taxonomy";
import { strokeIdSchema } from "@/lib/catalogue/strokes";
import { MIC_POSITIONS } from "@/lib/catalogue/names";
import { idParam } from "./studio";

export const libraryNameSchema = z.string().trim().min(1, "Name the library.").max(160, "At most 160 characters.");
export const libraryDescriptionSchema = z.string().trim().max(4000, "At most 4000 characters.");
export const createLibrarySchema = z.strictObject({ name: libraryNameSchema, description: libraryDescriptionSchema.optional() });
/** How layers map to MIDI velocities: MMA DLS Level 1 square law (default) or Dannenberg (ICMC 2006). */
export const VELOCITY_CURVES = ["dls", "dannenberg"] as const;
export type VelocityCurveName = (typeof VELOCITY_CURVES)[number];
export const updateLibrarySchema = z
  .strictObject({ name: libraryNameSchema.optional(), description: libraryDescriptionSchema.nullable().optional(), velocityCurve: z.enum(VELOCITY_CURVES).optional() })
  .refine((v) => v.name !== undefined || v.description !== undefined || v.velocityCurve !== undefined, "Change the name, the description or the velocity curve.");
/** Deleting asks for the library's name typed again. */
export const deleteLibrarySchema = z.strictObject({ confirmName: z.string() });

export const libraryParams = z.strictObject({ studioId: idParam, libraryId: idParam });
export const sampleParams = z.strictObject({ studioId: idParam, libraryId: idParam, sampleId: idParam });
export const instrumentParams = z.strictObject({ studioId: idParam, libraryId: idParam, instrumentId: idParam });

/** A sample's way: queued, measuring, measured (waiting for the cataloguing), catalogued (placed in its instrument and layer), or rejected. */
export const SAMPLE_STATES = ["queued", "measuring", "measured", "catalogued", "rejected"] as const;
export type SampleState = (typeof SAMPLE_STATES)[number];
/** The states of a sample that has a measurement, whether or not the cataloguing has placed it yet. */
export const MEASURED_STATES = ["measured", "catalogued"] as const satisfies readonly SampleState[];
export const SAMPLE_SORTS = ["name", "path", "instrument", "articulation", "family", "layer", "roundRobin", "mic", "strike", "truePeak", "duration", "confidence", "state", "added"] as const;
export type SampleSort = (typeof SAMPLE_SORTS)[number];

/** Review filters: the name and the sound disagree; the sound alone gave the family and is unsure of it
 * (lib/catalogue/confidence.ts soundUnsure); either. */
export const SAMPLE_FLAGS = ["conflict", "unsure", "review"] as const;
export type SampleFlag = (typeof SAMPLE_FLAGS)[number];

export const samplesQuery = z.strictObject({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(50),
  sort: z.enum(SAMPLE_SORTS).default("path"),
  dir: z.enum(["asc", "desc"]).default("asc"),
  q: z.string().trim().max(200).optional(),
  family: z.enum(FAMILIES).optional(),
  articulation: strokeIdSchema.optional(),
  state: z.enum(SAMPLE_STATES).optional(),
  instrument: z.string().max(191).optional(),
  flag: z.enum(SAMPLE_FLAGS).optional(),
});
export type SamplesQuery = z.infer<typeof samplesQuery>;

/** Bulk relabel: the given labels become the members' confirmed labels (source "person"). */
export const relabelSchema = z
  .strictObject({
    sampleIds: z.array(idParam).min(1, "Select at least one sample.").max(5000),
    family: z.enum(FAMILIES).optional(),
    articulation: strokeIdSchema.optional(),
    mic: z.enum(MIC_POSITIONS).nullable().optional(),
    instrumentKey: z.string().trim().min(1).max(191).optional(),
  })
  .refine((v) => v.family !== undefined || v.articulation !== undefined || v.mic !== undefined || v.instrumentKey !== undefined, "Choose at least one label to set.");
/** Confirm the current suggestions of the selected samples as they are. */
export const confirmSchema = z.strictObject({ sampleIds: z.array(idParam).min(1, "Select at least one sample.").max(5000) });

export const renameInstrumentSchema = z.strictObject({ name: z.string().trim().min(1, "Name the instrument.").max(160) });
export const mergeInstrumentsSchema = z.strictObject({ sourceIds: z.array(idParam).min(1).max(100), targetId: idParam });

/** GET .../velocity-response: the curve to measure against (default: the library's), Dannenberg's range, a download format. */
export const velocityResponseQuery = z.strictObject({
  curve: z.enum(VELOCITY_CURVES).optional(),
  rangeDb: z.coerce.number().min(6, "A range of 6 to 120 dB.").max(120, "A range of 6 to 120 dB.").optional(),
  format: z.enum(["csv", "json"]).optional(),
});
