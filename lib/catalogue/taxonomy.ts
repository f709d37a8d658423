// The instrument families and articulation words Kitwright uses everywhere (DEVELOPERS.md "Words").
// Trade vocabulary only; ids are Kitwright's own lower-case, hyphenated spellings.

export const FAMILIES = [
  "kick", "snare", "tom", "hi-hat", "crash", "ride", "china", "splash", "stack", "cowbell", "hand-drum", "shaker", "other",
] as const;
export type Family = (typeof FAMILIES)[number];

export const ARTICULATIONS = [
  // drums
  "centre", "half-edge", "edge", "rim-shot", "rim-click", "cross-stick", "flam", "drag", "roll", "buzz", "mute",
  "slap", "open-tone", "heel", "toe",
  // cymbals
  "bell", "bow", "tip", "shank", "choke", "crash-hit",
  // hi-hat
  "closed", "quarter-open", "half-open", "open", "pedal", "foot-splash",
  // generic
  "hit",
] as const;
export type Articulation = (typeof ARTICULATIONS)[number];

/** Articulations each family is normally recorded with (common practice of drum libraries, no published source). */
export const FAMILY_ARTICULATIONS: Record<Family, readonly Articulation[]> = {
  kick: ["centre", "mute", "heel", "toe", "flam"],
  snare: ["centre", "half-edge", "edge", "rim-shot", "rim-click", "cross-stick", "flam", "drag", "roll", "buzz", "mute"],
  tom: ["centre", "half-edge", "edge", "rim-shot", "rim-click", "flam", "roll", "mute"],
  "hi-hat": ["closed", "quarter-open", "half-open", "open", "pedal", "foot-splash", "tip", "shank", "bell", "choke"],
  crash: ["crash-hit", "bow", "edge", "bell", "choke", "roll"],
  ride: ["bow", "bell", "edge", "tip", "shank", "crash-hit", "choke", "roll"],
  china: ["crash-hit", "bow", "bell", "edge", "choke"],
  splash: ["crash-hit", "bow", "bell", "choke"],
  stack: ["hit", "closed", "open", "choke"],
  cowbell: ["hit", "open-tone", "mute", "bell"],
  "hand-drum": ["open-tone", "slap", "mute", "heel", "toe", "centre", "edge"],
  shaker: ["hit", "roll"],
  other: ["hit"],
};

export function isFamily(s: string): s is Family {
  return (FAMILIES as readonly string[]).includes(s);
}
export function isArticulation(s: string): s is Articulation {
  return (ARTICULATIONS as readonly string[]).includes(s);
}
