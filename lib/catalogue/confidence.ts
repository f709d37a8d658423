// The one way a confidence is shown: a whole percentage ("29 %", a no-break space before the sign, as SI and
// ISO 80000-1 write a percentage). Confidences are kept as fractions 0..1 in data (API, database, CSV); only
// their words go through this.

/** A fraction 0..1 as a whole percentage, clamped to 0-100 %; "–" when there is no number. */
export function formatConfidence(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return "–";
  return `${Math.round(Math.min(1, Math.max(0, x)) * 100)}\u00a0%`;
}
