// Requests and answers of /api/studios/:id/libraries(/:libraryId) and the library's read models (progress,
// health, plots). Types only, shared by lib/server and components/data.
import type { z } from "zod";
import type { HealthFinding } from "@/lib/catalogue";
import type { GroupResponse } from "@/lib/catalogue/velocity-response";
import type { MicSeries } from "@/lib/catalogue/mic-consistency";
import type { createLibrarySchema, deleteLibrarySchema, updateLibrarySchema, VelocityCurveName } from "@/lib/validation/library";

export type StateCounts = { queued: number; measuring: number; measured: number; catalogued: number; rejected: number; total: number };

export interface LibrarySummary {
  id: string;
  name: string;
  description: string | null;
  createdAt: string;
  updatedAt: string;
  counts: StateCounts;
  instruments: number;
  healthComputedAt: string | null;
  velocityCurve: VelocityCurveName;
}

/** GET /api/studios/:id/libraries */
export interface LibraryList {
  libraries: LibrarySummary[];
}

/** POST /api/studios/:id/libraries */
export type CreateLibraryBody = z.input<typeof createLibrarySchema>;
export interface CreatedLibrary {
  id: string;
  name: string;
}
/** PATCH /api/studios/:id/libraries/:libraryId (answers the LibrarySummary). */
export type UpdateLibraryBody = z.input<typeof updateLibrarySchema>;
/** DELETE /api/studios/:id/libraries/:libraryId (owners; the name typed again). */
export type DeleteLibraryBody = z.input<typeof deleteLibrarySchema>;

/**
 * GET .../libraries/:libraryId/progress: counts per state, `pending` (queued + measuring), and `cataloguing`:
 * samples wait for the cataloguing (measured) or changed after the last cataloguing read them, so instruments,
 * layers and health are about to change.
 */
export type LibraryProgress = StateCounts & { pending: number; cataloguing: boolean; healthComputedAt: string | null };

/** GET .../libraries/:libraryId/health */
export interface HealthView {
  computedAt: string | null;
  sampleCount: number;
  findings: (HealthFinding & { samples: { id: string; path: string }[] })[];
  /** Multi-mic takes: each mic's arrival offset against the close mic, take by take (for the plot). */
  micSeries: MicSeries[];
}

/** One instrument + articulation (+ mic) group of the loudness ladder. */
export interface LadderGroup {
  key: string;
  label: string;
  instrumentKey: string;
  articulation: string;
  mic: string | null;
  countFrom: string;
  criterion: string | null;
  layers: { index: number; velocityLow: number; velocityHigh: number; meanStrikeLufs: number; spreadDb: number; members: { id: string; strikeLufs: number | null; roundRobin: number }[] }[];
}
/** One measured sample on the feature map. */
export interface FeaturePoint { id: string; path: string; family: string | null; articulation: string | null; centroidHz: number; decaySec: number; strikeLufs: number | null; conflict: string | null; instrumentKey: string | null }

/** GET .../libraries/:libraryId/plots */
export interface LibraryPlots {
  groups: LadderGroup[];
  points: FeaturePoint[];
}

/** GET .../libraries/:libraryId/velocity-response: every group of two or more layers against the curve. */
export interface VelocityResponseView {
  library: string;
  curve: { kind: "dls" } | { kind: "dannenberg"; rangeDb?: number };
  groups: {
    key: string;
    instrument: string;
    articulation: string;
    mic: string | null;
    response: GroupResponse;
    /** The first take of each layer (by layer index), for listening before and after the trims. */
    takes: { index: number; sampleId: string | null }[];
  }[];
}
