// The pitch of an instrument: one number per drum, used to order toms from high to low (default kits, the kit
// editor's picker) and shown on the library page. Computed here only, by catalogueSamples(); the cataloguing stores
// it (instruments.pitch_hz) and the command line prints it, so the app and `kitwright` order toms alike.
//
// Rule: the median of the measured pitch (Measurement.pitchHz) of the instrument's main-stroke hits (its family's
// first articulation in FAMILY_ARTICULATIONS: centre for drums, closed for a hi-hat, bow for a ride, crash-hit for
// a crash ...); when none of those has a measured pitch, the median over all its samples; null when no sample
// has one. Even counts take the mean of the two middle values (the usual median). Rounded to 0.01 Hz, the scale of
// the database column, so a stored pitch reads back equal.
//
// Why the main stroke: the pitch finder reports the strongest low spectral peak. A strike at the centre of a
// membrane excites only its axisymmetric (0,n) modes, so that peak is the (0,1) fundamental, the drum's note; a
// strike near the edge favours the higher (m,n) modes, and a rim shot adds the ring of the rim and shell
// (Fletcher & Rossing, The Physics of Musical Instruments, 2nd ed., ch. 18). A drum recorded with many edge hits
// would otherwise measure a fifth or more above its note and be ordered above a smaller drum.
// Why the median: a hit where the finder locked onto an overtone moves it only when half the hits are wrong.

import { median } from "simple-statistics";
import { FAMILY_ARTICULATIONS, type Articulation, type Family, type Stroke } from "./taxonomy";

export interface PitchedHit {
  articulation: Stroke;
  pitchHz: number | null | undefined;
}

/** The family's main stroke: its first articulation in FAMILY_ARTICULATIONS. */
export function mainStroke(family: Family): Articulation {
  return FAMILY_ARTICULATIONS[family][0]!;
}

const measured = (h: PitchedHit): h is PitchedHit & { pitchHz: number } => typeof h.pitchHz === "number" && Number.isFinite(h.pitchHz) && h.pitchHz > 0;

/** The instrument's pitch in Hz (rule above), or null when none of its hits has a measured pitch. */
export function instrumentPitchHz(family: Family, hits: readonly PitchedHit[]): number | null {
  const pitched = hits.filter(measured);
  if (!pitched.length) return null;
  const main = mainStroke(family);
  const mains = pitched.filter((h) => h.articulation === main);
  const m = median((mains.length ? mains : pitched).map((h) => h.pitchHz));
  return Math.round(m * 100) / 100;
}
