// The instrument families and articulation words Kitwright uses everywhere (DEVELOPERS.md "Words").
// Trade vocabulary only; ids are Kitwright's own lower-case, hyphenated spellings.

export const FAMILIES = [
  "kick", "snare", "tom", "hi-hat", "crash", "ride", "china", "splash", "stack", "cowbell", "hand-drum", "shaker", "other",
] as const;
export type Family = (typeof FAMILIES)[number];

export const ARTICULATIONS = [
  // drums
  "centre", "half-edge", "edge", "rim-shot", "rim-click", "cross-stick", "flam", "drag", "roll", "buzz", "mute",
  "slap", "open-tone", "heel", "toe", "bass", "finger", "rim", "brush", "sweep",
  // cymbals
  "bell", "bow", "tip", "shank", "choke", "crash-hit",
  // hi-hat
  "closed", "quarter-open", "half-open", "open", "pedal", "foot-splash",
  // generic
  "hit",
] as const;
export type Articulation = (typeof ARTICULATIONS)[number];

/**
 * A stroke: a built-in articulation id or the id of a stroke a studio added (lib/catalogue/strokes.ts).
 * Data that people write (samples, kits, layouts, audits) carries strokes; code that reasons about one
 * particular built-in (the sound rules, the hi-hat pedal) narrows with isArticulation.
 */
export type Stroke = string;

/** Articulations each family is normally recorded with (common practice of drum libraries, no published source). */
export const FAMILY_ARTICULATIONS: Record<Family, readonly Articulation[]> = {
  kick: ["centre", "mute", "heel", "toe", "flam"],
  snare: ["centre", "half-edge", "edge", "rim-shot", "rim-click", "cross-stick", "flam", "drag", "roll", "buzz", "mute", "brush", "sweep"],
  tom: ["centre", "half-edge", "edge", "rim-shot", "rim-click", "flam", "roll", "mute", "brush"],
  "hi-hat": ["closed", "quarter-open", "half-open", "open", "pedal", "foot-splash", "tip", "shank", "bell", "choke"],
  crash: ["crash-hit", "bow", "edge", "bell", "choke", "roll"],
  ride: ["bow", "bell", "edge", "tip", "shank", "crash-hit", "choke", "roll"],
  china: ["crash-hit", "bow", "bell", "edge", "choke"],
  splash: ["crash-hit", "bow", "bell", "choke"],
  stack: ["hit", "closed", "open", "choke"],
  cowbell: ["hit", "open-tone", "mute", "bell", "tip", "shank"],
  "hand-drum": ["open-tone", "slap", "bass", "mute", "heel", "toe", "finger", "rim", "centre", "edge"],
  shaker: ["hit", "roll"],
  other: ["hit"],
};

/** A family as a drummer writes it in running text ("hand drum"; the others as they are). */
export function familyWords(f: string): string {
  return f === "hand-drum" ? "hand drum" : f;
}

export function isFamily(s: string): s is Family {
  return (FAMILIES as readonly string[]).includes(s);
}
export function isArticulation(s: string): s is Articulation {
  return (ARTICULATIONS as readonly string[]).includes(s);
}
