// Requests and answers of /api/studios/:id/libraries/:libraryId/samples (the paged browser, one sample, bulk
// relabel and confirm). Types only, shared by lib/server and components/data.
import type { z } from "zod";
import type { CatalogueEntry } from "@/lib/catalogue";
import type { confirmSchema, relabelSchema, SampleState } from "@/lib/validation/library";

export type { SampleState };

export interface SampleRow {
  id: string;
  path: string;
  fileName: string;
  state: SampleState;
  rejectCode: string | null;
  rejectReason: string | null;
  family: string | null;
  familySource: string | null;
  articulation: string | null;
  articulationSource: string | null;
  confidence: number | null;
  mic: string | null;
  instrumentKey: string | null;
  instrumentName: string | null;
  layerIndex: number | null;
  layerCount: number | null;
  roundRobin: number | null;
  velocityLow: number | null;
  velocityHigh: number | null;
  strikeLufs: number | null;
  truePeakDbtp: number | null;
  durationSec: number | null;
  sampleRate: number | null;
  bits: number | null;
  channels: number | null;
  centroidHz: number | null;
  decaySec: number | null;
  conflict: string | null;
  confirmed: boolean;
  sizeBytes: number;
}

/** How a search term was matched: "words" (path words starting with each word typed) or "contains" (the
 * fallback when no word starts with it, or the term has no letters or digits). */
export type SearchMode = "words" | "contains";

/** GET .../samples?page&pageSize&sort&dir&q&family&articulation&state&instrument&flag */
export interface SamplesPage {
  rows: SampleRow[];
  total: number;
  page: number;
  pageSize: number;
  search?: SearchMode;
}

/** GET .../samples/:sampleId: the row with its peaks, the reasons for its labels and key measures. */
export type SampleDetail = SampleRow & {
  peaks: { min: number[]; max: number[] } | null;
  reasons: string[];
  /** What the sound alone says (null until the library is catalogued again after this was added). */
  sound: CatalogueEntry["sound"] | null;
  measurement: { onsetMs: number; attackMs: number; tail: string; samplePeakDbfs: number; clippedRuns: number; dcOffset: number; noiseFloorDbfs: number; warnings: string[] } | null;
};

/** POST .../samples/relabel: the labels set become the member's (source "person"). */
export type RelabelBody = z.input<typeof relabelSchema>;
export interface RelabelAnswer {
  updated: number;
}

/** POST .../samples/confirm: the current labels of catalogued samples, confirmed as they are. */
export type ConfirmBody = z.input<typeof confirmSchema>;
export interface ConfirmAnswer {
  confirmed: number;
  skipped: number;
}
