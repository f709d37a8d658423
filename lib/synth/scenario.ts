// The demo library, as data: an invented studio's invented session kit, every file to generate (relative path,
// sound, strength, take, microphone, format), the truth about each file, and the deliberate faults the health
// checks must find. Pure data + small helpers; the generator script renders and writes it.

import type { Articulation, Family } from "../catalogue/taxonomy";
import { defaultSeconds, type Mic, type SoundSpec } from "./drums";

export const DEMO_LIBRARY = {
  studio: "Harbour Lane Studio",
  library: "Harbour Lane Session Kit",
  description: "A five-piece session kit with hi-hat, crash, ride, china and cowbell, recorded in the live room.",
  people: [
    { name: "Maren Olvedi", email: "maren@harbourlane.example", role: "owner", job: "sound designer, engineered the session" },
    { name: "Tobiah Renck", email: "tobiah@harbourlane.example", role: "editor", job: "session drummer" },
    { name: "Sunniva Achterhof", email: "sunniva@harbourlane.example", role: "viewer", job: "producer, checks packs before use" },
  ],
} as const;

export interface DemoInstrument {
  id: string;
  name: string;
  family: Family;
  folder: string;
}

export type SampleBits = 16 | 24 | 32;

export interface ScenarioFile {
  /** relative path with forward slashes */
  path: string;
  /** what is actually rendered (for a mislabelled file this differs from what the name says) */
  sound: SoundSpec;
  velocity: number;
  seed: string;
  mic: Mic;
  channels: 1 | 2;
  sampleRate: number;
  bits: SampleBits;
  seconds: number;
  /** ground truth: what the file really is */
  truth: {
    instrumentId: string;
    family: Family;
    articulation: Articulation;
    /** 1 = softest */
    layer: number;
    layerCount: number;
    roundRobin: number;
    mic: Mic;
  };
  /** deliberate damage applied after rendering */
  post?: { clipGainDb?: number; leadingSilenceMs?: number; truncateAtSec?: number };
  /** this file is a byte-identical copy of another path in the scenario */
  duplicateOf?: string;
}

export type DemoFaultKind = "clipped" | "late-onset" | "cut-tail" | "mislabelled" | "duplicate" | "missing-layer" | "sample-rate";

export interface DemoFault {
  kind: DemoFaultKind;
  /** the file the fault is in (for missing-layer: the file that would be expected) */
  path: string;
  detail: string;
  /** other paths involved (the original of a duplicate; the present layers of a group with a gap) */
  related?: string[];
}

export const DEMO_INSTRUMENTS: readonly DemoInstrument[] = [
  { id: "kick22", name: "22x18 kick", family: "kick", folder: "Kick_22x18" },
  { id: "snare-brass14", name: "14x6.5 brass snare", family: "snare", folder: "Snare_Brass14" },
  { id: "snare-maple13", name: "13x5 maple snare", family: "snare", folder: "Snare_Maple13" },
  { id: "tom10", name: "10x8 rack tom", family: "tom", folder: "Toms" },
  { id: "tom12", name: "12x9 rack tom", family: "tom", folder: "Toms" },
  { id: "tom16", name: "16x16 floor tom", family: "tom", folder: "Toms" },
  { id: "hihat14", name: "14\" hi-hat", family: "hi-hat", folder: "HiHat" },
  { id: "crash18", name: "18\" crash", family: "crash", folder: "Cymbals/Crash18" },
  { id: "ride21", name: "21\" ride", family: "ride", folder: "Cymbals/Ride21" },
  { id: "china18", name: "18\" china", family: "china", folder: "Cymbals/China18" },
  { id: "cowbell", name: "cowbell", family: "cowbell", folder: "Percussion/Cowbell" },
];

const KICK = { diameterIn: 22, depthIn: 18, tuneHz: 55, beater: "felt" as const };
const BRASS = { diameterIn: 14, depthIn: 6.5, tuneHz: 195, shell: "brass" as const };
const MAPLE = { diameterIn: 13, depthIn: 5, tuneHz: 240, shell: "maple" as const };
const TOM10 = { diameterIn: 10, depthIn: 8, tuneHz: 172, floor: false };
const TOM12 = { diameterIn: 12, depthIn: 9, tuneHz: 136, floor: false };
const TOM16 = { diameterIn: 16, depthIn: 16, tuneHz: 88, floor: true };
const HAT = { diameterIn: 14 };
const CRASH = { diameterIn: 18 };
const RIDE = { diameterIn: 21 };
const CHINA = { diameterIn: 18 };
const BELL = { lowHz: 560, highHz: 845 };

/**
 * Strike strength of layer i (1-based) of n: layers evenly spaced in level over 30 dB, inverted through the
 * synthesizer's level law (peak dB = 32 log10(v/127)). Drummers play layers as even perceived steps
 * (common practice, no published source).
 */
export function layerVelocity(i: number, n: number, rangeDb = 30): number {
  const db = n <= 1 ? 0 : -rangeDb + (rangeDb * (i - 1)) / (n - 1);
  return Math.round(127 * Math.pow(10, db / 32));
}

/** Dynamic markings used in some names, softest first, for n layers. */
export function dynamics(n: number): string[] {
  const table: Record<number, string[]> = {
    2: ["p", "f"], 3: ["p", "mf", "ff"], 4: ["p", "mf", "f", "ff"], 5: ["pp", "p", "mf", "f", "ff"],
    6: ["pp", "p", "mp", "mf", "f", "ff"],
  };
  const t = table[n];
  if (!t) throw new RangeError(`no dynamic names for ${n} layers`);
  return t;
}

const pad2 = (n: number) => String(n).padStart(2, "0");

interface GroupDef {
  instrumentId: string;
  sound: SoundSpec;
  layers: number;
  rrs: number;
  mics: readonly Mic[];
  channels: 1 | 2;
  name: (layer: number, rr: number, mic: Mic) => string;
  /** layers to leave out (a gap) */
  skipLayers?: number[];
  seconds?: number;
}

function groups(): GroupDef[] {
  const g: GroupDef[] = [];
  const dynName = (n: number) => (l: number) => dynamics(n)[l - 1];
  // kick: close (mono, inside the drum) and a stereo room pair
  g.push({
    instrumentId: "kick22", sound: { family: "kick", instrument: KICK, articulation: "centre" }, layers: 5, rrs: 3,
    mics: ["close"], channels: 1, name: (l, r) => `Kick_22x18/Kick22_Centre_v${l}_rr${r}.wav`,
  });
  g.push({
    instrumentId: "kick22", sound: { family: "kick", instrument: KICK, articulation: "centre" }, layers: 5, rrs: 3,
    mics: ["room"], channels: 2, seconds: 2, name: (l, r) => `Kick_22x18/Kick22_Centre_v${l}_rr${r}_Room.wav`,
  });
  // brass snare: numbered layers and round robins
  g.push({
    instrumentId: "snare-brass14", sound: { family: "snare", instrument: BRASS, articulation: "centre" }, layers: 5, rrs: 3,
    mics: ["close"], channels: 2, name: (l, r) => `Snare_Brass14/SnareBrass_Center_v${l}_rr${r}.wav`,
  });
  g.push({
    instrumentId: "snare-brass14", sound: { family: "snare", instrument: BRASS, articulation: "rim-shot" }, layers: 4, rrs: 3,
    mics: ["close"], channels: 2, skipLayers: [3], name: (l, r) => `Snare_Brass14/SnareBrass_RimShot_v${l}_rr${r}.wav`,
  });
  g.push({
    instrumentId: "snare-brass14", sound: { family: "snare", instrument: BRASS, articulation: "cross-stick" }, layers: 3, rrs: 2,
    mics: ["close"], channels: 2, name: (l, r) => `Snare_Brass14/SnareBrass_XStick_v${l}_rr${r}.wav`,
  });
  // maple snare: dynamic words and two-digit takes, spaces in names
  for (const [art, word, layers, rrs] of [["centre", "center", 4, 3], ["edge", "edge", 3, 2], ["rim-shot", "rimshot", 3, 2]] as const) {
    const d = dynName(layers);
    g.push({
      instrumentId: "snare-maple13", sound: { family: "snare", instrument: MAPLE, articulation: art }, layers, rrs,
      mics: ["close"], channels: 2, name: (l, r) => `Snare_Maple13/snare maple 13 ${word} ${d(l)} ${pad2(r)}.wav`,
    });
  }
  // toms
  for (const [id, spec, label] of [["tom10", TOM10, "Tom10"], ["tom12", TOM12, "Tom12"], ["tom16", TOM16, "FloorTom16"]] as const) {
    g.push({
      instrumentId: id, sound: { family: "tom", instrument: spec, articulation: "centre" }, layers: 4, rrs: 3,
      mics: ["close"], channels: 2, name: (l, r) => `Toms/${label} center ${dynName(4)(l)} ${pad2(r)}.wav`,
    });
    g.push({
      instrumentId: id, sound: { family: "tom", instrument: spec, articulation: "rim-shot" }, layers: 3, rrs: 2,
      mics: ["close"], channels: 2, name: (l, r) => `Toms/${label} rimshot ${dynName(3)(l)} ${pad2(r)}.wav`,
    });
  }
  // hi-hat: lower-case, underscores
  for (const [art, word, layers, rrs] of [
    ["closed", "closed", 4, 3], ["quarter-open", "quarter", 3, 2], ["half-open", "halfopen", 3, 2], ["open", "open", 3, 2],
    ["pedal", "pedal", 3, 2], ["foot-splash", "footsplash", 2, 2],
  ] as const) {
    const d = dynName(layers);
    g.push({
      instrumentId: "hihat14", sound: { family: "hi-hat", instrument: HAT, articulation: art }, layers, rrs,
      mics: ["close"], channels: 2, name: (l, r) => `HiHat/hh_${word}_${d(l)}_${pad2(r)}.wav`,
    });
  }
  // cymbals: close and overhead
  g.push({
    instrumentId: "crash18", sound: { family: "crash", instrument: CRASH, articulation: "crash-hit" }, layers: 4, rrs: 2,
    mics: ["close", "overhead"], channels: 2,
    name: (l, r, m) => `Cymbals/Crash18/Crash18_Hit_V${l}_RR${r}_${m === "close" ? "Close" : "OH"}.wav`,
  });
  g.push({
    instrumentId: "crash18", sound: { family: "crash", instrument: CRASH, articulation: "choke" }, layers: 2, rrs: 2,
    mics: ["close"], channels: 2, name: (l, r) => `Cymbals/Crash18/Crash18_Choke_V${l}_RR${r}_Close.wav`,
  });
  for (const [art, word, layers, rrs] of [["bow", "Bow", 4, 3], ["bell", "Bell", 3, 2]] as const) {
    g.push({
      instrumentId: "ride21", sound: { family: "ride", instrument: RIDE, articulation: art }, layers, rrs,
      mics: ["close", "overhead"], channels: 2,
      name: (l, r, m) => `Cymbals/Ride21/Ride21-${word}-v${l}-rr${r}-${m === "close" ? "close" : "oh"}.wav`,
    });
  }
  g.push({
    instrumentId: "china18", sound: { family: "china", instrument: CHINA, articulation: "crash-hit" }, layers: 3, rrs: 2,
    mics: ["close", "overhead"], channels: 2,
    name: (l, r, m) => `Cymbals/China18/China18_v${l}_rr${r}_${m === "close" ? "Close" : "OH"}.wav`,
  });
  g.push({
    instrumentId: "cowbell", sound: { family: "cowbell", instrument: BELL, articulation: "hit" }, layers: 3, rrs: 3,
    mics: ["close"], channels: 1, name: (l, r) => `Percussion/Cowbell/cowbell_hit_${["soft", "med", "hard"][l - 1]}_${r}.wav`,
  });
  return g;
}

// The deliberate faults (paths are fixed; the scenario's seed only changes the takes).
const CLIPPED = "Kick_22x18/Kick22_Centre_v5_rr3.wav";
const LATE = "Snare_Brass14/SnareBrass_Center_v2_rr3.wav";
const CUT = "Cymbals/Crash18/Crash18_Hit_V3_RR2_Close.wav";
const MISLABELLED = "Snare_Maple13/snare maple 13 center mf 04.wav";
const DUP_ORIGINAL = "HiHat/hh_closed_mf_02.wav";
const DUP_COPY = "HiHat/hh_closed_mf_04.wav";
const RATE = "Toms/Tom12 center f 02.wav";
const MISSING = "Snare_Brass14/SnareBrass_RimShot_v3_rr1.wav";

export const DEMO_FAULTS: readonly DemoFault[] = [
  { kind: "clipped", path: CLIPPED, detail: "driven 9 dB into full scale: flat-topped runs at +-1.0" },
  { kind: "late-onset", path: LATE, detail: "about 120 ms of room noise before the strike" },
  { kind: "cut-tail", path: CUT, detail: "crash truncated at 0.9 s while still ringing (no fade)" },
  { kind: "mislabelled", path: MISLABELLED, detail: "named as a maple snare centre hit but is a ride bell" },
  { kind: "duplicate", path: DUP_COPY, detail: "byte-identical copy of another round robin", related: [DUP_ORIGINAL] },
  {
    kind: "missing-layer", path: MISSING, detail: "brass snare rim shot has layers v1, v2 and v4; v3 was never recorded",
    related: [1, 2, 4].flatMap((l) => [1, 2, 3].map((r) => `Snare_Brass14/SnareBrass_RimShot_v${l}_rr${r}.wav`)),
  },
  { kind: "sample-rate", path: RATE, detail: "delivered at 44.1 kHz while the rest of the library is 48 kHz" },
];

export interface ScenarioOptions {
  /** changes every take (not the paths or the faults); default 1 */
  seed?: number;
}

/** Every file of the demo library, in a stable order. */
export function demoScenario(opts: ScenarioOptions = {}): ScenarioFile[] {
  const seed = opts.seed ?? 1;
  const files: ScenarioFile[] = [];
  for (const g of groups()) {
    const inst = DEMO_INSTRUMENTS.find((x) => x.id === g.instrumentId);
    if (!inst) throw new Error(`unknown instrument ${g.instrumentId}`);
    for (let l = 1; l <= g.layers; l++) {
      if (g.skipLayers?.includes(l)) continue;
      for (let r = 1; r <= g.rrs; r++) {
        for (const mic of g.mics) {
          const path = g.name(l, r, mic);
          const f: ScenarioFile = {
            path, sound: g.sound, velocity: layerVelocity(l, g.layers), mic, channels: g.channels,
            // the same strike through several microphones shares one seed
            seed: `${seed}:${g.instrumentId}:${g.sound.articulation}:${l}:${r}`,
            sampleRate: path === RATE ? 44100 : 48000, bits: 24, seconds: g.seconds ?? defaultSeconds(g.sound),
            truth: {
              instrumentId: g.instrumentId, family: inst.family, articulation: g.sound.articulation, layer: l,
              layerCount: g.layers, roundRobin: r, mic,
            },
          };
          if (path === CLIPPED) f.post = { clipGainDb: 9 };
          if (path === LATE) f.post = { leadingSilenceMs: 120 };
          if (path === CUT) f.post = { truncateAtSec: 0.9 };
          files.push(f);
          if (path === DUP_ORIGINAL) {
            files.push({ ...f, path: DUP_COPY, duplicateOf: DUP_ORIGINAL, truth: { ...f.truth, roundRobin: 4 } });
          }
        }
      }
    }
  }
  // a ride bell take filed among the maple snare centre hits
  files.push({
    path: MISLABELLED, sound: { family: "ride", instrument: RIDE, articulation: "bell" }, velocity: layerVelocity(2, 3),
    seed: `${seed}:mislabelled`, mic: "close", channels: 2, sampleRate: 48000, bits: 24,
    seconds: defaultSeconds({ family: "ride", instrument: RIDE, articulation: "bell" }),
    truth: { instrumentId: "ride21", family: "ride", articulation: "bell", layer: 2, layerCount: 3, roundRobin: 3, mic: "close" },
  });
  return files;
}
