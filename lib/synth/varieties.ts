// Over 300 lines: one generator of training variety: the instrument samplers, their renderers and the file plan.
// Training variety: many distinct instruments per family, each one's build sampled across a physically plausible
// range, rendered with the sources of drums.ts (membrane, cymbal plate, noise bursts, partials) and, for the
// electronic voices, generic synthesis (a sine with an exponential pitch fall, filtered noise and a tone, sums of
// inharmonic square waves through band-pass filters, two detuned square waves). Deterministic from a seed; pure.
//
// Acoustic facts used beyond those listed in drums.ts (numbers are published approximations or marked):
// - Thin plates: mode frequencies scale as h / a^2 (thickness over radius squared; Fletcher & Rossing, The Physics
//   of Musical Instruments, ch. 3), so a small or a thick cymbal sounds higher; smaller plates store less energy
//   and ring shorter (F&R ch. 20; memory). Size ranges are common practice: splash 6-12", crash 14-20",
//   ride 18-24", china 12-22", hi-hat 12-16". A heavier cymbal of the same size sustains longer and a thin one
//   opens up fast and dies sooner (common practice); modelled as decay times in proportion to sqrt(weight).
// - A hi-hat pair: besides the plates' partials and wash, a broadband rush from 250 Hz up to 20 kHz (air pushed
//   out from between the plates, plate-on-plate contact; memory), sampled from faint to dominant. Measured, not
//   assumed: the open corpus's acoustic hi-hats are close to white noise at the strike (spectral flatness
//   0.65-0.75), the plates-and-wash model alone gave 0.15-0.42; with the rush the training hats span about
//   0.36-0.68 (scripts/sound-model/README.md, fourth round).
// - The china's upturned flange: a trashy, rattling sound with stronger mid partials and a quicker decay than a
//   crash of the same size (common practice, no published source).
// - Hand drums: single-headed and tuned high (conga about 180-350 Hz, bongo about 350-600 Hz; common practice).
//   The hand's contact lasts longer than a stick's (a few milliseconds of soft tissue; memory), so an open tone
//   is mellow; a slap is a short edge contact with the fingers left on the head: the low modes are damped and the
//   high modes ring briefly; a bass tone is a palm stroke at the centre (F&R ch. 18; memory).
// - Shakers and tambourines: the sum of many short collisions of beads or jingles, each a burst filtered by the
//   container's or the jingle's resonances (P. R. Cook, "Physically informed sonic modeling (PhISM)", Computer
//   Music Journal 21(3), 1997; memory). Jingles: small metal discs with a few high inharmonic partials (memory).
// - Wood blocks and claves: free-free bar modes 1 : 2.756 : 5.404 (F&R ch. 2), fundamental roughly 500 Hz to
//   2.5 kHz, short decays (memory). A triangle: a bent steel rod, long-ringing partials from ~700 Hz up (F&R
//   ch. 19; memory). A hand clap: a few palm contacts milliseconds apart, each a noise burst centred near
//   1-2 kHz (B. H. Repp, "The sound of two hands clapping", JASA 81(4), 1987; memory). A scraped ridge (a
//   guiro-like "other"): a train of small impacts at tens per second (memory).
// - Electronic voices: generic subtractive and additive synthesis (common practice; e.g. C. Roads, The Computer
//   Music Tutorial). Square waves are band-limited by polyBLEP (V. Valimaki and A. Huovilainen, "Antialiasing
//   oscillators in subtractive synthesis", IEEE Signal Processing Magazine 24(2), 2007; memory).

import type { Articulation, Family } from "../catalogue/taxonomy";
import {
  choke, contactTime, cymbal, cymbalStick, drawSound, membrane, noiseBurst, partials, renderTake, type CymbalOpts, type KickSpec, type Mic,
  type SnareSpec, type Src, type TomSpec,
} from "./drums";
import { applyEnvelope, biquad, mixInto, whiteNoise } from "./dsp";
import { rngFromKey, type Rng } from "./rng";

export type VarietyKind =
  | "kick" | "snare" | "tom" | "hi-hat" | "crash" | "ride" | "china" | "splash" | "cowbell" | "hand-drum" | "shaker"
  | "tambourine" | "clap" | "wood" | "triangle" | "scrape" | "timbale" | "cuica" | "whistle"
  | "e-kick" | "e-tom" | "e-tom-noise" | "e-snare" | "e-clap" | "e-hat" | "e-cymbal" | "e-cowbell";

export type VarietyParams = Record<string, number | string>;

export interface VarietyInstrument {
  /** unique id: one instrument is one group in training */
  id: string;
  kind: VarietyKind;
  family: Family;
  electronic: boolean;
  /** the sampled build (sizes in inches, frequencies in Hz, times in seconds) */
  params: VarietyParams;
}

export interface VarietyFile {
  id: string;
  instrument: VarietyInstrument;
  family: Family;
  articulation: Articulation;
  velocity: number;
  seed: string;
  mic: Mic;
  channels: 1 | 2;
  sampleRate: 44100 | 48000;
  seconds: number;
}

interface KindDef {
  family: Family;
  electronic?: boolean;
  /** instruments per seed */
  count: number;
  sample(r: Rng): VarietyParams;
  strokes(r: Rng, p: VarietyParams): Articulation[];
  /** file length in seconds for a stroke */
  seconds(r: Rng, p: VarietyParams, a: Articulation): number;
  /** draws the dry sound; returns the reference peak in dB at full strength (as drums.ts renderers do) */
  render(s: Src, p: VarietyParams, a: Articulation): number;
}

const num = (p: VarietyParams, k: string) => p[k] as number;
const pick = <T>(r: Rng, xs: readonly T[]): T => xs[r.int(xs.length)]!;
/** log-uniform in [lo, hi): frequencies and times evenly per octave */
const logU = (r: Rng, lo: number, hi: number) => lo * Math.pow(hi / lo, r.next());
const rd = (x: number, d = 3) => Math.round(x * 10 ** d) / 10 ** d;
const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));

// ---------------------------------------------------------------------------------------------------------
// Shared small sources

/** Adds a mono signal to both channels from the take's pre-roll on. */
function addMono(s: Src, x: Float64Array, gain: number, right = 1): void {
  mixInto(s.L, x, gain, s.pre);
  mixInto(s.R, x, gain * right, s.pre);
}

/** A sustained sound's gate: raised-cosine attack, held for `len` seconds, then a 20 ms release. */
function gate(x: Float64Array, sr: number, attack: number, len: number): void {
  const na = Math.max(1, Math.round(attack * sr)), nh = Math.round(len * sr), nr = Math.round(0.02 * sr);
  for (let i = 0; i < x.length; i++) {
    const g = i < na ? 0.5 - 0.5 * Math.cos((Math.PI * i) / na) : i < nh ? 1 : i < nh + nr ? 0.5 + 0.5 * Math.cos((Math.PI * (i - nh)) / nr) : 0;
    x[i] *= g;
  }
}

/** A sine whose pitch falls exponentially from startHz to endHz (time constant fallTau), decaying with ampTau. */
function fallingSine(n: number, sr: number, o: { startHz: number; endHz: number; fallTau: number; ampTau: number; drive?: number }): Float64Array {
  const x = new Float64Array(n);
  let ph = 0;
  const drive = o.drive ?? 0;
  const norm = drive > 0 ? Math.tanh(1 + 4 * drive) : 1;
  const dec = Math.exp(-1 / (o.ampTau * sr));
  let a = 1;
  for (let i = 0; i < n; i++) {
    const t = i / sr;
    const f = o.endHz + (o.startHz - o.endHz) * Math.exp(-t / o.fallTau);
    ph += (2 * Math.PI * f) / sr;
    const y = Math.sin(ph);
    x[i] = a * (drive > 0 ? Math.tanh((1 + 4 * drive) * y) / norm : y);
    a *= dec;
  }
  return x;
}

/** polyBLEP correction for a discontinuity at phase 0 (t and dt in cycles). */
function blep(t: number, dt: number): number {
  if (t < dt) { const u = t / dt; return u + u - u * u - 1; }
  if (t > 1 - dt) { const u = (t - 1) / dt; return u * u + u + u + 1; }
  return 0;
}

/** A band-limited square wave (polyBLEP) at f Hz, n samples, starting phase ph (cycles). */
function square(n: number, sr: number, f: number, ph = 0): Float64Array {
  const x = new Float64Array(n);
  const dt = f / sr;
  let t = ph % 1;
  for (let i = 0; i < n; i++) {
    let y = t < 0.5 ? 1 : -1;
    y += blep(t, dt);
    y -= blep((t + 0.5) % 1, dt);
    x[i] = y;
    t += dt;
    if (t >= 1) t -= 1;
  }
  return x;
}

function noiseOf(s: Src, n: number, lo: number, hi: number): Float64Array {
  const x = whiteNoise(n, s.rng);
  if (lo > 20) biquad(x, s.sr, "highpass", lo, 0.7);
  if (hi < s.sr * 0.45) biquad(x, s.sr, "lowpass", hi, 0.7);
  return x;
}

/** n samples of the take after its pre-roll, at most `sec` seconds */
const span = (s: Src, sec: number) => Math.max(1, Math.min(s.L.length - s.pre, Math.round(sec * s.sr)));

/** The stick tip's tick on metal (drums.ts cymbalStick at the take's velocity). */
const stickTick = (s: Src, gain: number) => cymbalStick(s, s.vn, gain);

/** decay-time factor of a cymbal's relative weight (header: heavier sustains longer; the square root is our choice) */
const WEIGHT_SUSTAIN = (w: number) => Math.sqrt(w);


/** A crash-like cymbal (crash, splash): one renderer, the kind's constants apart. Pairs are [base, per velocity]
 * or [low clamp, high clamp]; the choke is [start, random extra, fall time constant] in seconds. */
function crashLike(k: {
  nPartials: number; fLo: [number, number]; fHi: number; tauExp: number; contactFull: number; lowModes: number;
  washGain: (p: VarietyParams, vn: number) => number; washHi: [number, number]; washTau: number; washRise: [number, number];
  tick: number; choke: [number, number, number]; level: number;
}) {
  return (s: Src, p: VarietyParams, a: Articulation): number => {
    const sz = num(p, "diameterIn") / 18, w = num(p, "weight"), vn = s.vn, fs = w / (sz * sz);
    const tau = 0.42 * sz * num(p, "decay") * WEIGHT_SUSTAIN(w);
    cymbal(s, {
      nPartials: k.nPartials, fLo: clamp(300 * fs, k.fLo[0], k.fLo[1]), fHi: k.fHi, tau1k: tau, tauExp: k.tauExp, contactT: contactTime(k.contactFull, s.v),
      lowModes: k.lowModes, lowBase: 55 * fs, washGain: k.washGain(p, vn), washLo: num(p, "washLo"), washHi: k.washHi[0] + k.washHi[1] * vn,
      washTau: tau * k.washTau, washRise: k.washRise[0] + k.washRise[1] * vn,
    });
    stickTick(s, k.tick);
    if (a === "choke") choke(s, k.choke[0] + k.choke[1] * s.rng.next(), k.choke[2]);
    return k.level;
  };
}

// ---------------------------------------------------------------------------------------------------------
// Acoustic drums: drums.ts renderers with sampled builds

const KINDS: Record<VarietyKind, KindDef> = {
  kick: {
    family: "kick", count: 8,
    sample: (r) => ({ diameterIn: pick(r, [18, 20, 22, 24, 26]), depthIn: rd(r.range(12, 22), 1), tuneHz: rd(logU(r, 40, 85), 1), beater: pick(r, ["felt", "plastic"]) }),
    strokes: (r) => ["centre", "centre", r.next() < 0.3 ? "mute" : "centre"],
    seconds: (r) => rd(r.range(0.8, 1.6), 2),
    render: (s, p, a) => drawSound({ family: "kick", instrument: p as unknown as KickSpec, articulation: a === "mute" ? "mute" : "centre" }, s),
  },
  snare: {
    family: "snare", count: 10,
    sample: (r) => ({ diameterIn: pick(r, [10, 12, 13, 14, 14, 15]), depthIn: rd(r.range(3.5, 8), 1), tuneHz: rd(logU(r, 150, 330), 1), shell: pick(r, ["brass", "maple", "steel", "birch"]) }),
    strokes: (r) => ["centre", "centre", "rim-shot", "cross-stick", pick(r, ["edge", "half-edge", "rim-shot"] as const)],
    seconds: (r, _p, a) => rd(a === "cross-stick" ? r.range(0.4, 1) : r.range(0.8, 1.6), 2),
    render: (s, p, a) => drawSound({ family: "snare", instrument: p as unknown as SnareSpec, articulation: a as "centre" }, s),
  },
  tom: {
    family: "tom", count: 10,
    sample: (r) => {
      const floor = r.next() < 0.4;
      const d = floor ? pick(r, [14, 15, 16, 18]) : pick(r, [8, 10, 12, 13]);
      // a drum is tuned within about an octave around where its size sounds best (common practice)
      const mid = floor ? 1400 / d : 1800 / d;
      return { diameterIn: d, depthIn: rd(d * (floor ? r.range(0.85, 1.05) : r.range(0.6, 0.9)), 1), tuneHz: rd(mid * Math.pow(2, r.range(-0.6, 0.6)), 1), floor: floor ? 1 : 0 };
    },
    strokes: (r) => ["centre", "centre", r.next() < 0.35 ? "rim-shot" : pick(r, ["edge", "centre"] as const)],
    seconds: (r, p) => rd(num(p, "floor") ? r.range(1.5, 3) : r.range(1, 2.5), 2),
    render: (s, p, a) => {
      const t: TomSpec = { diameterIn: num(p, "diameterIn"), depthIn: num(p, "depthIn"), tuneHz: num(p, "tuneHz"), floor: num(p, "floor") === 1 };
      return drawSound({ family: "tom", instrument: t, articulation: a as "centre" }, s);
    },
  },

  // -------------------------------------------------------------------------------------------------------
  // Cymbals: the plate of drums.ts with sampled size, weight and wash

  "hi-hat": {
    family: "hi-hat", count: 10,
    sample: (r) => ({ diameterIn: pick(r, [12, 13, 14, 14, 15, 16]), weight: rd(r.range(0.75, 1.35)), washLo: rd(r.range(4500, 7000), 0), tight: rd(r.range(0.6, 1.6)), chickHz: rd(logU(r, 600, 1300), 0),
      air: rd(logU(r, 0.05, 2.5)) }),
    strokes: () => ["closed", "closed", "pedal", "open", "half-open", "quarter-open"],
    seconds: (r, _p, a) => {
      const [lo, hi] = ({ closed: [0.4, 1], pedal: [0.4, 1], "quarter-open": [0.8, 1.5], "half-open": [1, 2] } as Record<string, [number, number]>)[a] ?? [1.8, 3.2];
      return rd(r.range(lo, hi), 2);
    },
    render: (s, p, a) => {
      const sz = num(p, "diameterIn") / 14, w = num(p, "weight"), vn = s.vn;
      // the pair's broadband rush (header): lasting about as long as the stroke lets the plates ring
      const airTau = ({ closed: 0.03, pedal: 0.02, "quarter-open": 0.07, "half-open": 0.14 } as Record<string, number>)[a] ?? 0.3;
      noiseBurst(s, { lo: 250, hi: 20000, tau: airTau * sz * (0.7 + 0.6 * s.rng.next()), gain: num(p, "air") * (0.4 + 0.6 * vn), attack: 0.0005 });
      const fs = w / (sz * sz); // plate modes scale as h / a^2
      const base: CymbalOpts = {
        nPartials: 60, fLo: clamp(500 * fs, 300, 1100), fHi: 16000, tau1k: 0, tauExp: 0.5, contactT: contactTime(0.00025, s.v),
        washGain: 0.6, washLo: num(p, "washLo"), washHi: 9000 + 7000 * vn, washTau: 0, washRise: 0.001,
      };
      const t = num(p, "tight");
      switch (a) {
        case "pedal":
          noiseBurst(s, { lo: 1200, hi: 4500 + 3500 * vn, tau: 0.008 + 0.01 * s.rng.next(), gain: 0.6, attack: 0.002 });
          partials(s, [1, 1.37, 1.93, 2.6, 3.4].map((q, i) => ({ f: num(p, "chickHz") * fs * q, a: 0.2 / (i + 1), tau: 0.012 + 0.01 * s.rng.next() })), 1);
          return -18;
        case "closed":
          cymbal(s, { ...base, tau1k: 0.028 / t, washTau: (0.014 + 0.01 * s.rng.next()) / t, washGain: 0.7 });
          stickTick(s, 0.6);
          return -8;
        case "quarter-open":
          cymbal(s, { ...base, tau1k: 0.12 * sz, washTau: 0.075 * sz, sizzle: 0.5, sizzleRate: 55 });
          stickTick(s, 0.5);
          return -7;
        case "half-open":
          cymbal(s, { ...base, tau1k: 0.3 * sz, washTau: 0.16 * sz, washGain: 0.55, sizzle: 0.6, sizzleRate: 35, washRise: 0.002 });
          stickTick(s, 0.45);
          return -6.5;
        default:
          cymbal(s, { ...base, tau1k: 0.6 * sz * WEIGHT_SUSTAIN(w), washTau: 0.36 * sz, washGain: 0.5, sizzle: 0.15, sizzleRate: 20, washRise: 0.003 });
          stickTick(s, 0.4);
          return -6;
      }
    },
  },
  crash: {
    family: "crash", count: 8,
    sample: (r) => ({ diameterIn: pick(r, [14, 15, 16, 17, 18, 19, 20]), weight: rd(r.range(0.8, 1.25)), washLo: rd(r.range(2500, 4000), 0), washGain: rd(r.range(0.4, 0.9)), decay: rd(r.range(0.75, 1.3)) }),
    strokes: (r) => ["crash-hit", "crash-hit", r.next() < 0.3 ? "choke" : "crash-hit"],
    seconds: (r, _p, a) => rd(a === "choke" ? r.range(0.8, 1.5) : r.range(2.5, 4), 2),
    render: crashLike({ nPartials: 140, fLo: [200, 700], fHi: 16000, tauExp: 0.4, contactFull: 0.00035, lowModes: 6, washGain: (p, vn) => num(p, "washGain") + 0.6 * vn,
      washHi: [8000, 6000], washTau: 1.05, washRise: [0.003, 0.006], tick: 0.35, choke: [0.18, 0.12, 0.025], level: -5 }),
  },
  splash: {
    family: "splash", count: 8,
    sample: (r) => ({ diameterIn: pick(r, [6, 7, 8, 8, 9, 10, 10, 11, 12]), weight: rd(r.range(0.8, 1.3)), washLo: rd(r.range(4000, 6500), 0), decay: rd(r.range(0.45, 0.85)) }),
    strokes: (r) => ["crash-hit", "crash-hit", r.next() < 0.2 ? "choke" : "crash-hit"],
    seconds: (r, _p, a) => rd(a === "choke" ? r.range(0.5, 1) : r.range(1, 2.5), 2),
    render: crashLike({ nPartials: 110, fLo: [600, 1600], fHi: 17500, tauExp: 0.35, contactFull: 0.0003, lowModes: 3, washGain: (_p, vn) => 0.6 + 0.5 * vn,
      washHi: [11000, 5000], washTau: 0.9, washRise: [0.002, 0.003], tick: 0.4, choke: [0.1, 0.08, 0.02], level: -6 }),
  },
  china: {
    family: "china", count: 8,
    sample: (r) => ({ diameterIn: pick(r, [12, 14, 16, 17, 18, 19, 20, 22]), weight: rd(r.range(0.8, 1.2)), washLo: rd(r.range(1200, 2200), 0), sizzle: rd(r.range(0.45, 0.8)), rattleHz: rd(r.range(40, 110), 0), mid: rd(r.range(0.5, 1)), decay: rd(r.range(0.6, 1)) }),
    strokes: (r) => ["crash-hit", "crash-hit", r.next() < 0.25 ? "choke" : "crash-hit"],
    seconds: (r, _p, a) => rd(a === "choke" ? r.range(0.8, 1.5) : r.range(2, 3.5), 2),
    render: (s, p, a) => {
      const sz = num(p, "diameterIn") / 18, w = num(p, "weight"), vn = s.vn, fs = w / (sz * sz);
      const tau = 0.3 * sz * num(p, "decay") * WEIGHT_SUSTAIN(w);
      const T = contactTime(0.0004, s.v);
      cymbal(s, {
        nPartials: 160, fLo: clamp(350 * fs, 250, 600), fHi: 11000, tau1k: tau, tauExp: 0.4, contactT: T, lowModes: 6, lowBase: 70 * fs,
        washGain: 0.6 + 0.3 * vn, washLo: num(p, "washLo"), washHi: 6000 + 4000 * vn, washTau: tau, washRise: 0.008,
        sizzle: num(p, "sizzle"), sizzleRate: num(p, "rattleHz"), gain: 1.1,
      });
      // the flange's strong mid-range partials, dying faster
      cymbal(s, { nPartials: 60, fLo: 450 * fs, fHi: 3200, tau1k: tau * 0.6, tauExp: 0.3, contactT: T, washGain: 0, washLo: 2000, washHi: 4000, washTau: 0.1, washRise: 0.01, gain: num(p, "mid") });
      stickTick(s, 0.3);
      if (a === "choke") choke(s, 0.15 + 0.1 * s.rng.next(), 0.02);
      return -5;
    },
  },
  ride: {
    family: "ride", count: 8,
    sample: (r) => ({ diameterIn: pick(r, [18, 20, 20, 21, 22, 22, 24]), weight: rd(r.range(0.9, 1.4)), pingHz: rd(logU(r, 2000, 4200), 0), bellHz: rd(logU(r, 600, 1100), 0), washGain: rd(r.range(0.08, 0.25)) }),
    strokes: () => ["bow", "bow", "bell", "bell"],
    seconds: (r, _p, a) => rd(a === "bell" ? r.range(2, 3.5) : r.range(2.5, 4), 2),
    render: (s, p, a) => {
      const sz = num(p, "diameterIn") / 21, w = num(p, "weight"), vn = s.vn, fs = w / (sz * sz);
      if (a === "bell") {
        const f = num(p, "bellHz") * Math.sqrt(fs);
        partials(s, [1, 1.5, 2.12, 2.71, 3.37, 4.3].map((q, i) => ({ f: f * q * (1 + 0.03 * s.rng.gauss()), a: 0.55 / (1 + i * 0.5), tau: (0.5 + 0.4 * s.rng.next()) / (1 + i * 0.35) })), 1);
        cymbal(s, { nPartials: 50, fLo: 1500, fHi: 14000, tau1k: 0.6, tauExp: 0.5, contactT: contactTime(0.0002, s.v), washGain: 0.08 + 0.1 * vn, washLo: 4000, washHi: 11000, washTau: 0.5, washRise: 0.01, gain: 0.45 });
        stickTick(s, 0.35);
        return -6;
      }
      cymbal(s, {
        nPartials: 130, fLo: clamp(300 * fs, 200, 600), fHi: 15000, tau1k: 0.55 * sz * WEIGHT_SUSTAIN(w), tauExp: 0.35, contactT: contactTime(0.0003, s.v),
        lowModes: 5, lowBase: 45 * fs, washGain: num(p, "washGain") + 0.15 * vn, washLo: 3500, washHi: 7000 + 5000 * vn, washTau: 0.5, washRise: 0.008,
      });
      partials(s, [1, 1.41, 1.87].map((q, i) => ({ f: num(p, "pingHz") * q * (1 + s.rng.gauss() * 0.03), a: 0.08 / (i + 1), tau: 0.25 })), 1);
      stickTick(s, 0.6);
      return -10;
    },
  },

  // -------------------------------------------------------------------------------------------------------
  // Bells, hand drums, shakers and other percussion

  cowbell: {
    family: "cowbell", count: 6,
    sample: (r) => {
      const agogo = r.next() < 0.35; // a small tuned bell: higher, longer, more tonal (memory)
      return { lowHz: rd(agogo ? logU(r, 700, 1300) : logU(r, 450, 950), 0), ratio: rd(r.range(1.3, 1.7)), decay: rd(agogo ? r.range(0.15, 0.4) : r.range(0.05, 0.14)) };
    },
    strokes: (r) => ["hit", "hit", r.next() < 0.3 ? "mute" : "hit"],
    seconds: (r) => rd(r.range(0.5, 1.2), 2),
    render: (s, p, a) => {
      const lo = num(p, "lowHz"), hi = lo * num(p, "ratio"), d = num(p, "decay") * (a === "mute" ? 0.35 : 1), vn = s.vn;
      partials(s, [
        { f: lo, a: 0.8, tau: d }, { f: hi, a: 1, tau: d * 0.8 },
        { f: lo * 2.91, a: 0.15 + 0.25 * vn, tau: d * 0.35 }, { f: hi * 2.63, a: 0.1 + 0.2 * vn, tau: d * 0.3 },
      ], 1);
      noiseBurst(s, { lo: 1500, hi: 4000 + 8000 * vn, tau: 0.002, gain: 0.3 * vn });
      return a === "mute" ? -9 : -6;
    },
  },
  "hand-drum": {
    family: "hand-drum", count: 10,
    sample: (r) => ({ tuneHz: rd(logU(r, 160, 600), 1), ring: rd(r.range(0.7, 1.4)), shellHz: rd(logU(r, 600, 1800), 0) }),
    strokes: (r) => ["open-tone", "open-tone", "slap", r.next() < 0.5 ? "mute" : "bass"],
    seconds: (r) => rd(r.range(0.6, 1.5), 2),
    render: (s, p, a) => {
      const f0 = num(p, "tuneHz"), vn = s.vn;
      const tau0 = 0.22 * num(p, "ring") * Math.pow(300 / f0, 0.4);
      const common = { airLoading: 0.08, glide: 0.02 * vn * vn, glideTau: 0.05, maxRatio: 5, highModes: 20, highRatio: 14 };
      partials(s, [1, 1.6].map((q, i) => ({ f: num(p, "shellHz") * q, a: 0.03 / (i + 1), tau: 0.03 })), 1);
      switch (a) {
        case "slap":
          membrane(s, { ...common, f0, strikeRadius: 0.75, tau0: 0.04, tauExp: 0.1, contactT: contactTime(0.0006, s.v), gain: 1, highModes: 40, highRatio: 20 });
          noiseBurst(s, { lo: 1000, hi: 6000 + 5000 * vn, tau: 0.003 + 0.004 * s.rng.next(), gain: 0.35 + 0.4 * vn });
          return -4;
        case "bass":
          membrane(s, { ...common, f0: f0 * 0.97, strikeRadius: 0.06, tau0: tau0 * 0.6, tauExp: 0.9, contactT: contactTime(0.005, s.v), gain: 1 });
          return -5;
        case "mute":
          membrane(s, { ...common, f0, strikeRadius: 0.5, tau0: 0.03, tauExp: 0.5, contactT: contactTime(0.002, s.v), gain: 1 });
          return -7;
        default:
          membrane(s, { ...common, f0, strikeRadius: 0.7, tau0, tauExp: 0.7, contactT: contactTime(0.0022, s.v), gain: 1 });
          return -4;
      }
    },
  },
  shaker: {
    family: "shaker", count: 6,
    sample: (r) => ({ grains: Math.round(logU(r, 15, 150)), lengthSec: rd(logU(r, 0.05, 0.25)), f1: rd(logU(r, 2000, 6000), 0), f2: rd(logU(r, 4000, 10000), 0), q: rd(r.range(1.2, 4)), grainTau: rd(logU(r, 0.0005, 0.003), 5) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(num(p, "lengthSec") + r.range(0.3, 0.8), 2),
    render: (s, p) => { grains(s, p); return -10; },
  },
  tambourine: {
    family: "shaker", count: 4,
    sample: (r) => ({ jingles: 2 + r.int(4), hits: Math.round(logU(r, 4, 25)), lengthSec: rd(logU(r, 0.02, 0.12), 3), jingleHz: rd(logU(r, 4500, 8500), 0), ring: rd(logU(r, 0.04, 0.15), 3), head: r.next() < 0.4 ? 1 : 0 }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(num(p, "ring") * 8 + r.range(0.3, 0.6), 2),
    render: (s, p) => {
      const n = num(p, "hits"), len = num(p, "lengthSec"), f = num(p, "jingleHz");
      for (let h = 0; h < n; h++) {
        const at = Math.round(len * Math.pow(s.rng.next(), 1.5) * s.sr);
        const g = Math.pow(0.85, h) * (0.5 + 0.5 * s.rng.next());
        const list = [1, 1.41, 1.79, 2.23].map((q) => ({ f: f * q * (1 + 0.04 * s.rng.gauss()), a: g, tau: num(p, "ring") * (0.5 + s.rng.next()) }));
        partials(s, list, 0.3, at);
      }
      noiseBurst(s, { lo: 3000, hi: 12000, tau: len * 0.5 + 0.003, gain: 0.3 });
      if (num(p, "head")) membrane(s, { f0: 320, strikeRadius: 0.4, tau0: 0.05, tauExp: 0.8, contactT: 0.002, airLoading: 0.1, glide: 0, glideTau: 0.05, gain: 0.5, maxRatio: 3, highModes: 5 });
      return -8;
    },
  },
  clap: {
    family: "other", count: 4,
    sample: (r) => ({ claps: 2 + r.int(4), spacingMs: rd(r.range(3, 12), 1), bandHz: rd(logU(r, 800, 2200), 0), q: rd(r.range(0.7, 2)), tail: rd(logU(r, 0.03, 0.15)) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r) => rd(r.range(0.5, 1.2), 2),
    render: (s, p) => { clapBursts(s, p, false); return -6; },
  },
  wood: {
    family: "other", count: 5,
    sample: (r) => ({ f1: rd(logU(r, 500, 2500), 0), hollow: rd(r.range(0, 0.06)), tau: rd(logU(r, 0.015, 0.08), 4) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r) => rd(r.range(0.3, 0.9), 2),
    render: (s, p) => {
      const f1 = num(p, "f1"), h = num(p, "hollow"), t = num(p, "tau");
      partials(s, [1, 2.756 * (1 - h), 5.404 * (1 - 1.5 * h)].map((q, i) => ({ f: f1 * q, a: [1, 0.5, 0.25][i]!, tau: t / (1 + 1.5 * i) })), 1);
      noiseBurst(s, { lo: 800, hi: 4000 + 6000 * s.vn, tau: 0.0015, gain: 0.25 });
      return -4;
    },
  },
  triangle: {
    family: "other", count: 3,
    sample: (r) => ({ f1: rd(logU(r, 700, 1400), 0), ring: rd(logU(r, 0.6, 2.2), 2), damped: r.next() < 0.3 ? 1 : 0 }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(num(p, "damped") ? r.range(0.4, 0.8) : r.range(2, 3.5), 2),
    render: (s, p) => {
      const f1 = num(p, "f1"), ring = num(p, "ring") * (num(p, "damped") ? 0.06 : 1);
      const list = [];
      for (let k = 1; f1 * k < 16000 && k <= 14; k++) list.push({ f: f1 * k * (1 + 0.012 * s.rng.gauss()), a: 0.6 / Math.sqrt(k), tau: ring * Math.pow(1 / k, 0.3) });
      partials(s, list, 1);
      stickTick(s, 0.3);
      return -8;
    },
  },
  scrape: {
    family: "other", count: 3,
    sample: (r) => ({ rate: rd(r.range(25, 80), 1), lengthSec: rd(r.range(0.12, 0.45), 3), bandHz: rd(logU(r, 1500, 5000), 0) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(num(p, "lengthSec") + r.range(0.2, 0.5), 2),
    render: (s, p) => {
      const n = span(s, num(p, "lengthSec") + 0.05);
      const exc = new Float64Array(n);
      const period = s.sr / num(p, "rate");
      for (let t = 0; t < n - 1; t += period * (0.9 + 0.2 * s.rng.next())) exc[Math.floor(t)] = 0.6 + 0.4 * s.rng.next();
      const x = noiseOf(s, n, 300, 12000);
      let e = 0;
      const dec = Math.exp(-1 / (0.003 * s.sr));
      for (let i = 0; i < n; i++) { e = Math.max(e * dec, exc[i]!); x[i] *= e; }
      biquad(x, s.sr, "bandpass", num(p, "bandHz"), 1.5);
      addMono(s, x, 1, 0.95);
      return -10;
    },
  },

  timbale: {
    family: "other", count: 3,
    sample: (r) => ({ tuneHz: rd(logU(r, 250, 600), 1), ring: rd(r.range(0.15, 0.4)), shellHz: rd(logU(r, 1500, 3500), 0), shellRing: rd(r.range(0.08, 0.3)) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r) => rd(r.range(0.8, 1.6), 2),
    render: (s, p) => {
      // a thin head on an open metal shell, struck with a stick: membrane plus the shell's ring (memory)
      membrane(s, { f0: num(p, "tuneHz"), strikeRadius: 0.45 + 0.2 * s.rng.next(), tau0: num(p, "ring"), tauExp: 0.5, contactT: contactTime(0.0006, s.v), airLoading: 0.08, glide: 0.02 * s.vn, glideTau: 0.04, gain: 1, maxRatio: 5 });
      partials(s, [1, 1.59, 2.33, 3.1].map((q, i) => ({ f: num(p, "shellHz") * q, a: 0.25 / (1 + i), tau: num(p, "shellRing") / (1 + 0.4 * i) })), 1);
      stickTick(s, 0.4);
      return -4;
    },
  },
  cuica: {
    family: "other", count: 3,
    sample: (r) => ({ fromHz: rd(logU(r, 300, 900), 0), toRatio: rd(logU(r, 0.6, 1.7)), lengthSec: rd(logU(r, 0.08, 0.4), 3) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(num(p, "lengthSec") + r.range(0.2, 0.5), 2),
    render: (s, p) => {
      // a friction drum: stick-slip drives the head into a harmonic-rich tone whose pitch glides with the pull (memory)
      const len = num(p, "lengthSec"), n = span(s, len + 0.05), f0 = num(p, "fromHz");
      for (const [h, g] of [[1, 1], [2, 0.45], [3, 0.25], [4, 0.12]] as const) {
        const x = fallingSine(n, s.sr, { startHz: f0 * h, endHz: f0 * num(p, "toRatio") * h, fallTau: len / 2, ampTau: 1e9 });
        gate(x, s.sr, 0.01, len);
        addMono(s, x, g, 0.95);
      }
      return -6;
    },
  },
  whistle: {
    family: "other", count: 3,
    sample: (r) => ({ toneHz: rd(logU(r, 1800, 3300), 0), trillHz: rd(r.range(18, 40), 1), depth: rd(r.range(0.01, 0.06), 3), lengthSec: rd(pick(r, [logU(r, 0.08, 0.2), logU(r, 0.4, 0.9)]), 3) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(num(p, "lengthSec") + r.range(0.2, 0.5), 2),
    render: (s, p) => {
      // a pea whistle: a jet-driven tone warbled by the pea, with breath noise (memory)
      const len = num(p, "lengthSec"), n = span(s, len + 0.05), f = num(p, "toneHz");
      const x = new Float64Array(n);
      let ph = 0;
      for (let i = 0; i < n; i++) {
        ph += (2 * Math.PI * f * (1 + num(p, "depth") * Math.sin((2 * Math.PI * num(p, "trillHz") * i) / s.sr))) / s.sr;
        x[i] = Math.sin(ph);
      }
      const z = noiseOf(s, n, f * 0.7, f * 1.5);
      for (let i = 0; i < n; i++) x[i]! += 0.15 * z[i]!;
      gate(x, s.sr, 0.015, len);
      addMono(s, x, 1, 0.95);
      return -6;
    },
  },

  // -------------------------------------------------------------------------------------------------------
  // Electronic voices: generic synthesis

  "e-kick": {
    family: "kick", electronic: true, count: 8,
    sample: (r) => ({ endHz: rd(logU(r, 38, 75), 1), startRatio: rd(logU(r, 2.5, 8)), fallTau: rd(logU(r, 0.008, 0.06), 4), ampTau: rd(logU(r, 0.08, 0.6), 3), click: rd(r.range(0, 1)), drive: rd(r.range(0, 1)) }),
    strokes: () => ["centre", "centre", "centre"],
    seconds: (r, p) => rd(clamp(num(p, "ampTau") * 7, 0.4, 2) * r.range(0.8, 1.1), 2),
    render: (s, p) => {
      const n = span(s, num(p, "ampTau") * 10);
      const x = fallingSine(n, s.sr, { startHz: num(p, "endHz") * num(p, "startRatio"), endHz: num(p, "endHz"), fallTau: num(p, "fallTau"), ampTau: num(p, "ampTau"), drive: num(p, "drive") });
      addMono(s, x, 1);
      if (num(p, "click") > 0.3) noiseBurst(s, { lo: 500, hi: 3000 + 6000 * num(p, "click"), tau: 0.0015, gain: 0.3 * num(p, "click") * s.vn });
      return -3;
    },
  },
  // ten per seed (six before 2026-12-03): with the corpus's recordings weighted alike (scripts/sound-model/run.ts
  // trainingRows) six left a decaying 110 Hz sine, a textbook tom, read as a kick at some gains
  "e-tom": {
    family: "tom", electronic: true, count: 10,
    sample: (r) => ({ endHz: rd(logU(r, 70, 260), 1), startRatio: rd(logU(r, 1.02, 2.5)), fallTau: rd(logU(r, 0.03, 0.15), 4), ampTau: rd(logU(r, 0.12, 0.6), 3), noise: rd(r.range(0, 0.25)) }),
    strokes: () => ["centre", "centre", "centre"],
    seconds: (r, p) => rd(clamp(num(p, "ampTau") * 7, 0.6, 2.5) * r.range(0.8, 1.1), 2),
    render: (s, p) => {
      const n = span(s, num(p, "ampTau") * 10);
      addMono(s, fallingSine(n, s.sr, { startHz: num(p, "endHz") * num(p, "startRatio"), endHz: num(p, "endHz"), fallTau: num(p, "fallTau"), ampTau: num(p, "ampTau") }), 1);
      if (num(p, "noise") > 0.05) {
        const z = noiseOf(s, span(s, 0.3), 200, 5000);
        applyEnvelope(z, s.sr, { attack: 0.0005, tau: 0.03 });
        addMono(s, z, num(p, "noise"));
      }
      return -4;
    },
  },
  // An electronic tom whose body is mostly filtered noise under a slow pitch sweep: the oscillator falls over a
  // few hundred milliseconds and the noise decays with it, so it rings as long as a tom while its spectrum sits
  // kHz above its pitch (generic subtractive synthesis, common practice)
  "e-tom-noise": {
    family: "tom", electronic: true, count: 4,
    sample: (r) => ({ endHz: rd(logU(r, 80, 260), 1), startRatio: rd(logU(r, 1.4, 3)), fallTau: rd(logU(r, 0.06, 0.3), 4), ampTau: rd(logU(r, 0.1, 0.45), 3), noiseLo: rd(logU(r, 300, 1500), 0), noiseHi: rd(logU(r, 3000, 10000), 0), noiseTau: rd(r.range(0.5, 1)), mix: rd(logU(r, 0.5, 2.5)) }),
    strokes: () => ["centre", "centre", "centre"],
    seconds: (r, p) => rd(clamp(num(p, "ampTau") * 7, 0.4, 2.5) * r.range(0.8, 1.1), 2),
    render: (s, p) => {
      const n = span(s, num(p, "ampTau") * 10);
      addMono(s, fallingSine(n, s.sr, { startHz: num(p, "endHz") * num(p, "startRatio"), endHz: num(p, "endHz"), fallTau: num(p, "fallTau"), ampTau: num(p, "ampTau") }), 1);
      const z = noiseOf(s, n, num(p, "noiseLo"), num(p, "noiseHi"));
      applyEnvelope(z, s.sr, { attack: 0.001, tau: num(p, "ampTau") * num(p, "noiseTau") });
      addMono(s, z, num(p, "mix") * 0.5, 0.97);
      return -4;
    },
  },
  "e-snare": {
    family: "snare", electronic: true, count: 8,
    sample: (r) => ({ toneHz: rd(logU(r, 150, 320), 1), second: rd(r.range(1.45, 1.9)), toneTau: rd(logU(r, 0.03, 0.15), 4), noiseLo: rd(logU(r, 700, 2500), 0), noiseHi: rd(logU(r, 5000, 13000), 0), noiseTau: rd(logU(r, 0.05, 0.25), 4), mix: rd(logU(r, 0.4, 2)) }),
    strokes: () => ["centre", "centre", "centre"],
    seconds: (r, p) => rd(clamp(num(p, "noiseTau") * 7, 0.4, 1.6) * r.range(0.8, 1.1), 2),
    render: (s, p) => {
      const n = span(s, Math.max(num(p, "toneTau"), num(p, "noiseTau")) * 10);
      const f = num(p, "toneHz"), tt = num(p, "toneTau");
      addMono(s, fallingSine(n, s.sr, { startHz: f * 1.6, endHz: f, fallTau: 0.015, ampTau: tt }), 1);
      addMono(s, fallingSine(n, s.sr, { startHz: f * num(p, "second") * 1.3, endHz: f * num(p, "second"), fallTau: 0.015, ampTau: tt * 0.7 }), 0.5);
      const z = noiseOf(s, n, num(p, "noiseLo"), num(p, "noiseHi"));
      applyEnvelope(z, s.sr, { attack: 0.0008, tau: num(p, "noiseTau") });
      addMono(s, z, num(p, "mix") * 0.6, 0.97);
      return -4;
    },
  },
  "e-clap": {
    family: "other", electronic: true, count: 4,
    sample: (r) => ({ claps: 3 + r.int(2), spacingMs: rd(r.range(6, 14), 1), bandHz: rd(logU(r, 900, 1800), 0), q: rd(r.range(1, 3)), tail: rd(logU(r, 0.06, 0.25)) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(clamp(num(p, "tail") * 7, 0.5, 1.8), 2),
    render: (s, p) => { clapBursts(s, p, true); return -5; },
  },
  "e-hat": {
    family: "hi-hat", electronic: true, count: 8,
    sample: (r) => ({ ...squareBank(r), bandHz: rd(logU(r, 7000, 11000), 0), q: rd(r.range(1, 3)), closedTau: rd(logU(r, 0.01, 0.05), 4), openTau: rd(logU(r, 0.12, 0.5), 3), noise: rd(r.range(0, 0.5)) }),
    strokes: () => ["closed", "closed", "open"],
    seconds: (r, _p, a) => rd(a === "open" ? r.range(1, 2.5) : r.range(0.3, 0.8), 2),
    render: (s, p, a) => { metalBank(s, p, a === "open" ? num(p, "openTau") : num(p, "closedTau")); return a === "open" ? -6 : -8; },
  },
  "e-cymbal": {
    family: "crash", electronic: true, count: 4,
    sample: (r) => ({ ...squareBank(r), bandHz: rd(logU(r, 5000, 9000), 0), q: rd(r.range(0.7, 1.5)), tau: rd(logU(r, 0.4, 1.5), 3), noise: rd(r.range(0.3, 1)) }),
    strokes: () => ["crash-hit", "crash-hit"],
    seconds: (r, p) => rd(clamp(num(p, "tau") * 5, 2, 4) * r.range(0.85, 1), 2),
    render: (s, p) => { metalBank(s, p, num(p, "tau")); return -5; },
  },
  "e-cowbell": {
    family: "cowbell", electronic: true, count: 4,
    sample: (r) => ({ lowHz: rd(logU(r, 480, 850), 1), ratio: rd(r.range(1.4, 1.55), 4), bandQ: rd(r.range(2, 5)), fast: rd(logU(r, 0.008, 0.03), 4), tail: rd(logU(r, 0.08, 0.35), 3) }),
    strokes: () => ["hit", "hit", "hit"],
    seconds: (r, p) => rd(clamp(num(p, "tail") * 6, 0.4, 1.5), 2),
    render: (s, p) => {
      const n = span(s, num(p, "tail") * 10);
      const lo = num(p, "lowHz"), hi = lo * num(p, "ratio");
      const x = square(n, s.sr, lo);
      const y = square(n, s.sr, hi, 0.25);
      for (let i = 0; i < n; i++) x[i]! += y[i]!;
      biquad(x, s.sr, "bandpass", hi * 1.2, num(p, "bandQ"));
      // two-stage decay: a quick drop after the attack, then a longer tail (common practice)
      const kf = Math.exp(-1 / (num(p, "fast") * s.sr)), kt = Math.exp(-1 / (num(p, "tail") * s.sr));
      let gf = 1, gt = 1;
      for (let i = 0; i < n; i++) { x[i] *= 0.6 * gf + 0.4 * gt; gf *= kf; gt *= kt; }
      addMono(s, x, 1);
      return -6;
    },
  },
};

/** Six inharmonic square-wave frequencies between 200 and 900 Hz (a generic metallic bank). */
function squareBank(r: Rng): VarietyParams {
  const out: VarietyParams = {};
  for (let i = 0; i < 6; i++) out[`sq${i}`] = rd(logU(r, 200, 900), 1);
  return out;
}

function metalBank(s: Src, p: VarietyParams, tau: number): void {
  const n = span(s, tau * 10);
  const x = new Float64Array(n);
  for (let i = 0; i < 6; i++) {
    const q = square(n, s.sr, num(p, `sq${i}`), s.rng.next());
    for (let k = 0; k < n; k++) x[k]! += q[k]!;
  }
  biquad(x, s.sr, "bandpass", num(p, "bandHz"), num(p, "q"));
  biquad(x, s.sr, "highpass", num(p, "bandHz") * 0.7, 0.7);
  const z = noiseOf(s, n, num(p, "bandHz") * 0.6, 16000);
  for (let k = 0; k < n; k++) x[k]! += num(p, "noise") * z[k]!;
  applyEnvelope(x, s.sr, { attack: 0.0004, tau });
  addMono(s, x, 1, 0.98);
}

function clapBursts(s: Src, p: VarietyParams, electronic: boolean): void {
  const claps = num(p, "claps"), sp = num(p, "spacingMs") / 1000, tail = num(p, "tail");
  const n = span(s, sp * claps + tail * 10);
  const x = new Float64Array(n);
  const z = whiteNoise(n, s.rng);
  const dec = Math.exp(-1 / (0.004 * s.sr)), decT = Math.exp(-1 / (tail * s.sr));
  const starts: number[] = [];
  for (let c = 0; c < claps; c++) starts.push(Math.round(c * sp * (electronic ? 1 : 0.6 + 0.8 * s.rng.next()) * s.sr));
  const last = starts[starts.length - 1]!;
  for (let i = 0; i < n; i++) {
    let e = 0;
    for (const st of starts) if (i >= st) e = Math.max(e, Math.pow(dec, i - st));
    if (i >= last) e = Math.max(e, 0.5 * Math.pow(decT, i - last));
    x[i] = z[i]! * e;
  }
  biquad(x, s.sr, "bandpass", num(p, "bandHz"), num(p, "q"));
  if (!electronic) biquad(x, s.sr, "highpass", 400, 0.7);
  addMono(s, x, 1, electronic ? 1 : 0.9);
}

/** A shake: grains of noise at random times (denser at the start), through two resonances of the container. */
function grains(s: Src, p: VarietyParams): void {
  const len = num(p, "lengthSec");
  const n = span(s, len + 0.1);
  const z = whiteNoise(n, s.rng);
  const env = new Float64Array(n);
  const dec = Math.exp(-1 / (num(p, "grainTau") * s.sr));
  const count = num(p, "grains");
  const marks = new Float64Array(n);
  for (let g = 0; g < count; g++) {
    const t = Math.floor(len * Math.pow(s.rng.next(), 1.3) * s.sr);
    if (t < n) marks[t] = Math.max(marks[t]!, 0.3 + 0.7 * s.rng.next());
  }
  let e = 0;
  for (let i = 0; i < n; i++) { e = Math.max(e * dec, marks[i]!); env[i] = e; }
  for (const [f, g] of [[num(p, "f1"), 1], [num(p, "f2"), 0.7]] as const) {
    const x = Float64Array.from(z, (v, i) => v * env[i]!);
    biquad(x, s.sr, "bandpass", f, num(p, "q"));
    addMono(s, x, g, 0.9 + 0.1 * s.rng.next());
  }
}

// ---------------------------------------------------------------------------------------------------------
// The plan: instruments and files

export const VARIETY_KINDS = Object.keys(KINDS) as VarietyKind[];

/** The variety instruments of a seed: `scale` times each kind's count (at least one of each kind). */
export function varietyInstruments(seed: number, scale = 1): VarietyInstrument[] {
  const out: VarietyInstrument[] = [];
  for (const kind of VARIETY_KINDS) {
    const def = KINDS[kind];
    const count = Math.max(1, Math.round(def.count * scale));
    for (let i = 0; i < count; i++) {
      const r = rngFromKey(`variety:${seed}:${kind}:${i}`);
      out.push({ id: `v${seed}-${kind}-${i + 1}`, kind, family: def.family, electronic: def.electronic ?? false, params: def.sample(r) });
    }
  }
  return out;
}

/** Every file to render for a seed: each instrument's strokes at sampled strength, microphone, length and format. */
export function varietyFiles(seed: number, scale = 1): VarietyFile[] {
  const files: VarietyFile[] = [];
  for (const inst of varietyInstruments(seed, scale)) {
    const def = KINDS[inst.kind];
    const r = rngFromKey(`variety-files:${inst.id}`);
    def.strokes(r, inst.params).forEach((articulation, k) => {
      // strength: up to 24 dB under full through the synthesizer's level law (peak dB = 32 log10(v/127))
      const velocity = Math.max(1, Math.round(127 * Math.pow(10, -r.range(0, 24) / 32)));
      const u = r.next();
      const mic: Mic = inst.electronic ? (u < 0.85 ? "close" : "overhead") : u < 0.6 ? "close" : u < 0.85 ? "overhead" : "room";
      files.push({
        id: `${inst.id}/${k + 1}-${articulation}`, instrument: inst, family: inst.family, articulation, velocity,
        seed: `${inst.id}:${k}`, mic, channels: r.next() < 0.5 ? 1 : 2, sampleRate: r.next() < 0.5 ? 44100 : 48000,
        seconds: def.seconds(r, inst.params, articulation),
      });
    });
  }
  return files;
}

/** Renders one variety file: one Float32Array per channel in [-1, 1]. */
export function renderVariety(f: VarietyFile): Float32Array[] {
  const def = KINDS[f.instrument.kind];
  const key = `variety|${f.instrument.id}|${JSON.stringify(f.instrument.params)}|${f.articulation}|${f.velocity}|${f.seed}`;
  return renderTake(key, f.seconds, { sampleRate: f.sampleRate, velocity: f.velocity, seed: f.seed, mic: f.mic, channels: f.channels, seconds: f.seconds },
    (s) => def.render(s, f.instrument.params, f.articulation));
}
