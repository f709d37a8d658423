// Shapes the catalogue's server functions return and its client components draw (lib/server/catalogue
// samples.ts and views.ts build them): plain types in a neutral module, so components never import lib/server.

/** One sample as the library's browser lists it. */
export interface SampleRow {
  id: string;
  path: string;
  fileName: string;
  state: "queued" | "measuring" | "catalogued" | "rejected";
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

/** One velocity layer group of the loudness ladder plot. */
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
/** One sample on the feature map (strike brightness against decay). */
export interface FeaturePoint { id: string; path: string; family: string | null; articulation: string | null; centroidHz: number; decaySec: number; strikeLufs: number | null; conflict: string | null; instrumentKey: string | null }
