// MIDI note names (MIDI 1.0 note numbers; note 60 is middle C). Makers disagree on what middle C is called
// (C3 or C4): common practice, no published source. Pure; usable on the server and in the browser.
const NAMES = ["C", "C#", "D", "D#", "E", "F", "F#", "G", "G#", "A", "A#", "B"];
export type MiddleC = "C3" | "C4";

/** Note name of MIDI note `n` (0-127): with middle C = C4, note 60 is C4 and note 0 is C-1; with C3, note 60 is C3 and 0 is C-2. */
export function noteName(n: number, middleC: MiddleC = "C4"): string {
  if (!Number.isInteger(n) || n < 0 || n > 127) return "?";
  const octave = Math.floor(n / 12) - (middleC === "C4" ? 1 : 2);
  return `${NAMES[n % 12]}${octave}`;
}
