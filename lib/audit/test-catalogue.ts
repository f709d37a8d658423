// A generated catalogue for the audit tests (invented data: a scenario of our own, not a measurement).
import type { CatalogueArticulation, CatalogueInstrument, Family, Stroke } from "./types";

/** Layers splitting 1-127 evenly, each with `rr` round robins. */
export function evenLayers(instrumentId: string, articulation: Stroke, count: number, rr: number): CatalogueArticulation {
  const layers = [];
  for (let i = 0; i < count; i++) {
    const low = Math.floor((i * 127) / count) + 1;
    const high = Math.floor(((i + 1) * 127) / count);
    layers.push({
      index: i,
      velocityLow: low,
      velocityHigh: high,
      meanStrikeLufs: -40 + 6 * i,
      sampleIds: Array.from({ length: rr }, (_, k) => `${instrumentId}-${articulation}-v${i + 1}-rr${k + 1}`),
    });
  }
  return { articulation, mic: null, layers };
}

export function instrument(
  id: string,
  name: string,
  family: Family,
  arts: Array<[Stroke, number, number]>,
  pitchHz: number | null = null,
): CatalogueInstrument {
  return { id, name, family, pitchHz, articulations: arts.map(([a, n, rr]) => evenLayers(id, a, n, rr)) };
}

/**
 * The test library: one kick, one snare (no half-edge, no flam; its edge has a velocity gap 61-79),
 * three toms listed out of pitch order (only the highest has rim shots), a hi-hat without partly-open
 * articulations, a crash with only its crash hit, a ride with bow and bell, a china with its hit,
 * a cowbell and a conga.
 */
export function testCatalogue(): CatalogueInstrument[] {
  const snare = instrument("snare-14", "Snare 14 brass", "snare", [
    ["centre", 4, 3],
    ["rim-shot", 3, 2],
    ["cross-stick", 2, 2],
  ]);
  snare.articulations.push({
    articulation: "edge",
    mic: null,
    layers: [
      { index: 0, velocityLow: 1, velocityHigh: 60, meanStrikeLufs: -30, sampleIds: ["e1a", "e1b"] },
      { index: 1, velocityLow: 80, velocityHigh: 127, meanStrikeLufs: -20, sampleIds: ["e2a"] },
    ],
  });
  return [
    instrument("kick-22", "Kick 22", "kick", [["centre", 4, 3]]),
    snare,
    instrument("tom-16", "Tom 16 floor", "tom", [["centre", 3, 2]], 82),
    instrument("tom-10", "Tom 10", "tom", [["centre", 3, 2], ["rim-shot", 2, 2]], 196),
    instrument("tom-12", "Tom 12", "tom", [["centre", 3, 2]], 147),
    instrument("hat-14", "Hi-hat 14", "hi-hat", [["closed", 4, 4], ["open", 3, 2], ["pedal", 2, 2]]),
    instrument("crash-18", "Crash 18", "crash", [["crash-hit", 3, 2]]),
    instrument("ride-21", "Ride 21", "ride", [["bow", 4, 3], ["bell", 2, 2]]),
    instrument("china-18", "China 18", "china", [["crash-hit", 2, 1]]),
    instrument("cowbell", "Cowbell", "cowbell", [["hit", 2, 2]]),
    instrument("conga-11", "Conga 11", "hand-drum", [["open-tone", 3, 2], ["slap", 2, 2]]),
  ];
}
