// Requests and answers of /api/studios/:id/libraries/:libraryId/instruments(/merge, /:instrumentId). Types only.
import type { z } from "zod";
import type { mergeInstrumentsSchema, renameInstrumentSchema } from "@/lib/validation/library";

export interface InstrumentRow { id: string; key: string; name: string; nameSource: "auto" | "person"; family: string; pitchHz: number | null; sampleCount: number }

/** GET .../instruments */
export interface InstrumentList {
  instruments: InstrumentRow[];
}

/** PATCH .../instruments/:instrumentId (the name is kept across cataloguings). */
export type RenameInstrumentBody = z.input<typeof renameInstrumentSchema>;
export interface RenamedInstrument {
  id: string;
  name: string;
}

/** POST .../instruments/merge: the sources' samples move into the target; the library is catalogued again. */
export type MergeInstrumentsBody = z.input<typeof mergeInstrumentsSchema>;
export interface MergedInstruments {
  moved: number;
}
