// Requests and answers of the stroke routes (/api/studios/:id/strokes, .../strokes/:strokeId). Types only.
import type { z } from "zod";
import type { StudioStroke } from "@/lib/catalogue/strokes";
import type { Family, Stroke } from "@/lib/catalogue/taxonomy";
import type { strokeInputSchema, updateStrokeSchema } from "@/lib/validation/strokes";

export type StrokeInput = z.infer<typeof strokeInputSchema>;
export type UpdateStrokeRequest = z.infer<typeof updateStrokeSchema>;

/** What uses a stroke in a studio (the answer to GET .../strokes/:id/uses and the details of a 409). */
export interface StrokeUses {
  strokeId: Stroke;
  samples: { libraryId: string; libraryName: string; count: number }[];
  kits: { id: string; name: string; slots: string[] }[];
  layouts: { id: string; name: string; pads: string[]; pedalZones: number }[];
  /** Other studio strokes with an edge to it. */
  strokes: Stroke[];
  /** Samples + kits + layouts + strokes: 0 when nothing uses it. */
  total: number;
}

/** GET .../strokes: the built-in list per family and the studio's own. */
export interface StrokeListAnswer {
  builtIn: Record<Family, Stroke[]>;
  strokes: StudioStroke[];
}
