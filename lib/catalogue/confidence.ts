// The one way a confidence is shown: a whole percentage ("29 %", a no-break space before the sign, as SI and
// ISO 80000-1 write a percentage). Confidences are kept as fractions 0..1 in data (API, database, CSV); only
// their words go through this.

/** A fraction 0..1 as a whole percentage, clamped to 0-100 %; "–" when there is no number. */
export function formatConfidence(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "–";
  return `${Math.round(Math.min(1, Math.max(0, x)) * 100)}\u00a0%`;
}

/**
 * Below this confidence a label the sound alone gave is "unsure" and listed for review: out of fold, the trained
 * model's answers shown under 60 % were right about half the time or less (scripts/sound-model/RESULTS.md,
 * "Confidence shown, checked out of fold"), so a person should listen before trusting them.
 */
export const SOUND_UNSURE_BELOW = 0.6;

/** Whether a sample's family came from its sound alone with a confidence under SOUND_UNSURE_BELOW. */
export function soundUnsure(familySource: string | null | undefined, confidence: number | null | undefined): boolean {
  return familySource === "sound" && confidence !== null && confidence !== undefined && confidence < SOUND_UNSURE_BELOW;
}
