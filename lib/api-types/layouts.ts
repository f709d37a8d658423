// Requests and answers of /api/studios/:id/layouts (list, create, import) and /api/studios/:id/layouts/:layoutId
// (read, save, rename, copy, delete). Types only, shared by lib/server and components/data.
import type { z } from "zod";
import type { Layout } from "@/lib/audit/types";
import type { createLayoutSchema, publishLayoutSchema, suggestLayoutSchema } from "@/lib/validation/kit";

export interface LayoutSummary { id: string; name: string; kind: "grid" | "zones"; rows: number | null; cols: number | null; pads: number; pedal: boolean; updatedAt: string }
export interface LayoutRecord { id: string; name: string; layout: Layout; createdAt: string; updatedAt: string }

/** GET /api/studios/:id/layouts */
export interface LayoutList {
  layouts: LayoutSummary[];
}
/** Answer of every route that reads or writes one layout (GET, PATCH, POST create / copy / import). */
export interface LayoutAnswer {
  layout: LayoutRecord;
}

/** POST /api/studios/:id/layouts: a template, a blank grid (rows x cols) or a blank list of trigger zones. */
export type CreateLayoutBody = z.input<typeof createLayoutSchema>;
/** PATCH /api/studios/:id/layouts/:layoutId: the editor saves the whole layout (the server keeps the row id). */
export interface UpdateLayoutBody {
  name?: string;
  layout?: Omit<Layout, "id">;
}

/** POST /api/studios/:id/layouts/suggest: the surface and the kit (see lib/validation/kit.ts suggestLayoutSchema). */
export type SuggestLayoutBody = z.input<typeof suggestLayoutSchema>;
/** Its answer: a layout to review (not saved), the reason for every pad, and the strokes that did not fit. */
export interface SuggestLayoutAnswer {
  kitName: string;
  layout: Layout;
  placements: { padId: string; slotId: string; articulation: string; standIn: boolean; reason: string }[];
  leftOut: { slotId: string; articulation: string; reason: string }[];
}

/** A layout's share link (GET/PUT .../layouts/:layoutId/share). `path` is relative to the app's address. */
export interface LayoutShare {
  token: string;
  path: string;
  description: string;
  views: number;
  publishedAt: string;
}
export interface LayoutShareAnswer {
  share: LayoutShare | null;
}
export type PublishLayoutBody = z.input<typeof publishLayoutSchema>;

/** What a shared link shows (GET /api/shared/:token): the layout alone, its description and views. */
export interface SharedLayoutView {
  name: string;
  description: string;
  views: number;
  publishedAt: string;
  layout: Layout;
}

/** GET .../layouts/:layoutId/kit-matrix: the layout audited against every kit of the studio (nothing saved). */
export interface KitMatrix {
  layoutName: string;
  kits: { kitId: string; kitName: string; score: number; pads: number; direct: number; standIn: number; silent: number; pedalZonesSilent: number }[];
}
