// Requests and answers of /api/studios/:id/kits (list, create, import, the instruments a slot can hold) and
// /api/studios/:id/kits/:kitId (read, save, rename, copy, delete). Types only, shared by lib/server and
// components/data.
import type { z } from "zod";
import type { Family } from "@/lib/catalogue/taxonomy";
import type { Kit, KitSlot } from "@/lib/audit/types";
import type { copySchema, createKitSchema } from "@/lib/validation/kit";

export interface KitSummary { id: string; name: string; slots: number; filled: number; updatedAt: string }
export interface KitRecord { id: string; name: string; kit: Kit; createdAt: string; updatedAt: string }

/** GET /api/studios/:id/kits */
export interface KitList {
  kits: KitSummary[];
}
/** Answer of every route that reads or writes one kit (GET, PATCH, POST create / copy / import). */
export interface KitAnswer {
  kit: KitRecord;
}

/** One instrument as the kit editor lists it (family, library, sample counts): GET /api/studios/:id/kits/instruments. */
export interface InstrumentChoice {
  id: string;
  name: string;
  family: Family;
  libraryId: string;
  libraryName: string;
  pitchHz: number | null;
  sampleCount: number;
  articulations: string[];
}
export interface InstrumentChoiceList {
  instruments: InstrumentChoice[];
}

/** POST /api/studios/:id/kits: empty, with slots, or filled from the catalogue for a layout template. */
export type CreateKitBody = z.input<typeof createKitSchema>;
/** PATCH /api/studios/:id/kits/:kitId */
export interface UpdateKitBody {
  name?: string;
  slots?: KitSlot[];
}
/** POST .../kits/:kitId/copy and .../layouts/:layoutId/copy */
export type CopyBody = z.input<typeof copySchema>;
