// Over 300 lines: one synthesizer: shared sources (membrane, wires, cymbal) and the renderers built on them.
// Physically informed drum one-shot synthesizer: one function per drum family, each rendering a struck
// instrument at a velocity (1-127), for a round-robin seed, through a microphone position.
//
// Acoustic facts used (all from memory unless noted; the numbers are published approximations):
// - Circular membrane modes: f_mn proportional to the Bessel zeros j_mn; ratios to (0,1): 1, 1.59, 2.14, 2.30,
//   2.65, 2.92, 3.16, 3.50, 3.60, 3.65 ... (Fletcher & Rossing, The Physics of Musical Instruments, 2nd ed., ch. 3
//   and ch. 18; zeros from Abramowitz & Stegun, Handbook of Mathematical Functions, table 9.5).
// - Air loading lowers the low membrane modes more than the high ones, so real drums have wider ratios above the
//   fundamental than the ideal membrane (F&R ch. 18, timpani: (1,1):(2,1):(3,1):(4,1) near 1:1.5:2:2.5).
//   Modelled here as f_real = f_ideal * (1 - a / ratio), a small.
// - A strike at radius r excites mode (m,n) in proportion to J_m(j_mn r / a): a centre strike excites only the
//   axisymmetric (0,n) modes, an edge strike favours high-m modes (F&R ch. 18; standard modal analysis).
// - Contact time: the force pulse of a stick lasts about a millisecond or less and shortens as the strike gets
//   harder (Hertzian contact: duration proportional to v^-1/5, K. L. Johnson, Contact Mechanics, ch. 11), so
//   harder strikes excite higher modes: the spectrum of a half-sine pulse falls about 12 dB/octave above
//   about 1/(2 T). We use a steeper-than-Hertz exponent because a player also grips harder at loud dynamics
//   (our assumption).
// - Tension modulation: large amplitudes raise the membrane tension, so pitch starts high and glides down as
//   the vibration decays; the shift grows with the square of the amplitude (F&R ch. 18, nonlinear effects;
//   also Avanzini & Rocchesso on tension-modulated membranes). Kick ~40-80 Hz, toms ~70-300 Hz, snare batter
//   ~150-300 Hz (common tuning practice, no published source).
// - Snare wires: the snare-side head, driven through the enclosed air about depth/c later, throws the wires
//   off and back each cycle, giving a buzz of broadband noise modulated at the head's rate and decaying faster
//   than the head (F&R ch. 18, snare drum).
// - Free-free bar modes (the stick in a cross-stick): ratios 1 : 2.756 : 5.404 : 8.933 (F&R ch. 2).
// - Cymbals and gongs: thin-plate modes with a modal density roughly independent of frequency, many inharmonic
//   partials from a few hundred Hz to beyond 10 kHz, decays of several seconds, higher partials dying faster;
//   a nonlinear cascade moves energy up to high frequencies over the first tens of milliseconds after a hard
//   strike (the shimmering "aftersound") (F&R ch. 20, cymbals). The bell (cup) is stiffer: fewer, stronger,
//   more tonal partials, shorter overall ring.
// - Hi-hat: two cymbals; closed, the pair damps itself within ~0.1 s; as the gap opens the pair rattles
//   (sizzle) and rings longer (common practice, no published source).
// - Cowbell: a few strong inharmonic modes with a fast decay; we use partials near 560 and 845 Hz
//   (figures from our brief; real cowbells vary widely; T. D. Rossing, Science of Percussion Instruments, bells).
// - Microphones: inverse-square distance law for level, arrival delay d / 343 m/s, more reverberant field and
//   less high-frequency energy further away (any acoustics text; the specific numbers are common practice).

import { addMode, applyEnvelope, besselJ, biquad, dbToGain, delayInPlace, mixInto, onePoleLowpass, peakAbs,
  schroederReverb, SPEED_OF_SOUND, whiteNoise } from "./dsp";
import { rngFromKey, type Rng } from "./rng";

export type Mic = "close" | "overhead" | "room";
export const MICS: readonly Mic[] = ["close", "overhead", "room"];

export interface RenderOptions {
  sampleRate: number;
  /** MIDI-style strike strength 1-127 */
  velocity: number;
  /** round-robin seed: any text or number; the same seed gives the same take */
  seed: string | number;
  mic?: Mic;
  channels?: 1 | 2;
  /** length in seconds (default per sound) */
  seconds?: number;
  /** level spread between takes in dB (standard deviation; default 0.6) */
  takeSpreadDb?: number;
  /** preamp and room noise floor in dBFS RMS (default NOISE_FLOOR_DBFS); null for none */
  noiseFloorDbfs?: number | null;
}

export interface KickSpec { diameterIn: number; depthIn: number; tuneHz: number; beater: "felt" | "plastic" }
export interface SnareSpec { diameterIn: number; depthIn: number; tuneHz: number; shell: "brass" | "maple" | "steel" | "birch" }
export interface TomSpec { diameterIn: number; depthIn: number; tuneHz: number; floor: boolean }
export interface HiHatSpec { diameterIn: number }
export interface CymbalSpec { diameterIn: number }
export interface CowbellSpec { lowHz: number; highHz: number }

export type KickArticulation = "centre" | "mute";
export type SnareArticulation = "centre" | "half-edge" | "edge" | "rim-shot" | "cross-stick" | "rim-click";
export type TomArticulation = "centre" | "edge" | "rim-shot";
export type HiHatArticulation = "closed" | "quarter-open" | "half-open" | "open" | "pedal" | "foot-splash";
export type CrashArticulation = "crash-hit" | "bow" | "bell" | "choke";
export type RideArticulation = "bow" | "bell" | "crash-hit";
export type ChinaArticulation = "crash-hit" | "choke";
export type CowbellArticulation = "hit" | "mute";

export type SoundSpec =
  | { family: "kick"; instrument: KickSpec; articulation: KickArticulation }
  | { family: "snare"; instrument: SnareSpec; articulation: SnareArticulation }
  | { family: "tom"; instrument: TomSpec; articulation: TomArticulation }
  | { family: "hi-hat"; instrument: HiHatSpec; articulation: HiHatArticulation }
  | { family: "crash"; instrument: CymbalSpec; articulation: CrashArticulation }
  | { family: "ride"; instrument: CymbalSpec; articulation: RideArticulation }
  | { family: "china"; instrument: CymbalSpec; articulation: ChinaArticulation }
  | { family: "cowbell"; instrument: CowbellSpec; articulation: CowbellArticulation };

// ---------------------------------------------------------------------------------------------------------
// Membrane modes

/** Bessel zeros j_mn (Abramowitz & Stegun table 9.5, from memory; re-derived numerically in the tests). */
export const MEMBRANE_MODES: readonly { m: number; n: number; j: number }[] = [
  { m: 0, n: 1, j: 2.40483 }, { m: 1, n: 1, j: 3.83171 }, { m: 2, n: 1, j: 5.13562 }, { m: 0, n: 2, j: 5.52008 },
  { m: 3, n: 1, j: 6.38016 }, { m: 1, n: 2, j: 7.01559 }, { m: 4, n: 1, j: 7.58834 }, { m: 2, n: 2, j: 8.41724 },
  { m: 0, n: 3, j: 8.65373 }, { m: 5, n: 1, j: 8.77148 }, { m: 3, n: 2, j: 9.76102 }, { m: 6, n: 1, j: 9.93611 },
  { m: 1, n: 3, j: 10.17347 }, { m: 4, n: 2, j: 11.06471 }, { m: 7, n: 1, j: 11.08637 }, { m: 2, n: 3, j: 11.61984 },
  { m: 0, n: 4, j: 11.79153 }, { m: 8, n: 1, j: 12.22509 }, { m: 5, n: 2, j: 12.33860 }, { m: 3, n: 3, j: 13.01520 },
];

/** Ideal-membrane frequency ratios f_mn / f_01. */
export function membraneRatios(): number[] {
  return MEMBRANE_MODES.map((x) => x.j / MEMBRANE_MODES[0].j);
}

/** Relative force-spectrum weight of a stick contact of duration T seconds at frequency f (half-sine envelope). */
export function contactWeight(f: number, T: number): number {
  const x = 2 * f * T;
  return 1 / Math.sqrt(1 + x * x * x * x);
}

/** Contact duration for a velocity, scaled from the duration at full strength. */
export function contactTime(tAtFull: number, velocity: number): number {
  return tAtFull * Math.pow(127 / velocity, 0.45);
}

/** A source being rendered: stereo buffers, sample rate, its random stream, velocity (and /127), pre-roll. */
export interface Src { L: Float64Array; R: Float64Array; sr: number; rng: Rng; v: number; vn: number; pre: number }

/** Random pan gains for a partial inside a stereo close pair (mild decorrelation). */
export function pan(rng: Rng, width: number): [number, number] {
  const p = 0.5 + (rng.next() - 0.5) * width;
  return [Math.cos((p * Math.PI) / 2) * Math.SQRT2, Math.sin((p * Math.PI) / 2) * Math.SQRT2];
}

export interface MembraneOpts {
  f0: number;
  strikeRadius: number; // 0 centre .. 1 edge
  tau0: number; // time constant of the (0,1) mode
  tauExp: number; // higher modes: tau0 * (f0/f)^tauExp
  contactT: number;
  airLoading: number;
  glide: number;
  glideTau: number;
  gain: number;
  maxRatio?: number;
  start?: number;
  /** resonant-head detune for the (0,1) and (1,1) pair; 0 for a single head */
  secondHead?: number;
  /** statistical high modes above the table: how many, and up to which ratio to f0 */
  highModes?: number;
  highRatio?: number;
}

export function membrane(s: Src, o: MembraneOpts): void {
  const a = o.airLoading;
  const maxRatio = o.maxRatio ?? 6;
  const rDither = Math.min(0.95, Math.max(0.02, o.strikeRadius + s.rng.gauss() * 0.04));
  for (const mode of MEMBRANE_MODES) {
    const ratio = mode.j / MEMBRANE_MODES[0].j;
    if (ratio > maxRatio) break;
    const ratioReal = (ratio * (1 - a / ratio)) / (1 - a);
    const f = o.f0 * ratioReal * (1 + s.rng.gauss() * 0.004);
    // modal participation at the strike point, normalised by the mode's norm (J_{m+1}(j_mn))
    const part = Math.abs(besselJ(mode.m, mode.j * rDither)) / Math.abs(besselJ(mode.m + 1, mode.j));
    // higher circumferential orders radiate less well (dipole, quadrupole ...), and the nodal circles of the
    // (0,n>1) modes cancel much of their volume velocity, so the fundamental dominates the far field
    const radiation = 1 / ((1 + 0.35 * mode.m) * (1 + 0.9 * (mode.n - 1)));
    const amp = o.gain * part * radiation * contactWeight(f, o.contactT) * (0.85 + 0.3 * s.rng.next()) / 2.3;
    const tau = o.tau0 * Math.pow(o.f0 / f, o.tauExp) * (0.9 + 0.2 * s.rng.next());
    const [gl, gr] = pan(s.rng, 0.35);
    const common = { tau, glide: o.glide * (mode.n === 1 ? 1 : 0.7), glideTau: o.glideTau, start: s.pre + (o.start ?? 0) };
    addMode(s.L, s.R, s.sr, { ...common, freq: f, amp, gainL: gl, gainR: gr, phase: s.rng.gauss() * 0.05 });
    if (o.secondHead && mode.n === 1 && mode.m <= 1) {
      // the other head, coupled through the air column: a neighbouring mode that beats with the first
      addMode(s.L, s.R, s.sr, {
        ...common, freq: f * (1 + o.secondHead), amp: amp * 0.45, tau: tau * 1.1, gainL: gr, gainR: gl,
        start: common.start + Math.round(s.sr * 0.0006),
      });
    }
  }
  // Above the tabulated modes: a statistical set whose density grows in proportion to frequency, as Weyl's law
  // gives for a two-dimensional membrane (mode count ~ area * k^2 / 4 pi; from memory). Weak, short-lived and
  // mostly reached by hard, short contacts: the "stick" brightness of the head.
  const r0 = MEMBRANE_MODES[MEMBRANE_MODES.length - 1].j / MEMBRANE_MODES[0].j;
  const rMax = o.highRatio ?? 24;
  const count = o.highModes ?? 40;
  for (let i = 0; i < count; i++) {
    const ratio = Math.sqrt(r0 * r0 + s.rng.next() * (rMax * rMax - r0 * r0));
    const f = o.f0 * ((ratio - a) / (1 - a));
    const m = s.rng.int(12);
    const rayleigh = Math.sqrt(-2 * Math.log(1 - s.rng.next() * 0.999));
    const part = Math.abs(besselJ(Math.min(m, 8), 14 * Math.max(0.05, rDither))) + 0.05;
    const amp = (o.gain * 0.35 * rayleigh * part * contactWeight(f, o.contactT)) / (1 + 0.35 * m) / 2.3;
    const [gl, gr] = pan(s.rng, 0.5);
    addMode(s.L, s.R, s.sr, {
      freq: f, amp, tau: o.tau0 * Math.pow(o.f0 / f, o.tauExp) * (0.7 + 0.6 * s.rng.next()), gainL: gl, gainR: gr,
      start: s.pre + (o.start ?? 0), phase: s.rng.gauss() * 0.05,
    });
  }
}

/**
 * Noise for one channel of a close stereo pair: a part common to both microphones plus an independent part
 * (about 0.75 correlation: the pair hears one source from slightly different places; our assumption).
 */
export function pairNoise(n: number, s: Src, common: Float64Array | null): Float64Array {
  const x = whiteNoise(n, s.rng);
  if (!common) return x;
  const a = 0.86, b = 0.5;
  for (let i = 0; i < n; i++) x[i] = a * common[i] + b * x[i];
  return x;
}

/** A burst of filtered noise (stick tip, beater click, rim crack). */
export function noiseBurst(s: Src, o: { lo: number; hi: number; tau: number; gain: number; attack?: number; start?: number }): void {
  const n = Math.min(s.L.length, Math.ceil((o.tau * 12 + (o.attack ?? 0.0003)) * s.sr) + s.pre + (o.start ?? 0));
  const common = whiteNoise(n, s.rng);
  for (const [buf, k] of [[s.L, 0], [s.R, 1]] as const) {
    const x = pairNoise(n, s, common);
    if (o.lo > 20) biquad(x, s.sr, "highpass", o.lo, 0.7);
    biquad(x, s.sr, "lowpass", o.hi, 0.7);
    applyEnvelope(x, s.sr, { start: s.pre + (o.start ?? 0), attack: o.attack ?? 0.0003, tau: o.tau });
    mixInto(buf, x, o.gain * (k === 0 ? 1 : 0.93), 0);
  }
}

/** A few resonances (rim, shell, stick, cowbell): partials with given frequencies/amplitudes/decays. */
export function partials(s: Src, list: readonly { f: number; a: number; tau: number }[], gain: number, start = 0): void {
  for (const p of list) {
    const [gl, gr] = pan(s.rng, 0.4);
    addMode(s.L, s.R, s.sr, {
      freq: p.f * (1 + s.rng.gauss() * 0.003), amp: gain * p.a, tau: p.tau * (0.9 + 0.2 * s.rng.next()),
      gainL: gl, gainR: gr, start: s.pre + start, phase: s.rng.next() * 0.3,
    });
  }
}

// ---------------------------------------------------------------------------------------------------------
// Families

function renderKick(s: Src, k: KickSpec, art: KickArticulation): number {
  const vn = s.vn;
  const T = contactTime(k.beater === "felt" ? 0.0016 : 0.0009, s.v);
  const muted = art === "mute";
  membrane(s, {
    f0: k.tuneHz * (1 + s.rng.gauss() * 0.006), strikeRadius: 0.12, tau0: muted ? 0.05 : 0.1 * (k.depthIn / 18),
    tauExp: 1.1, contactT: T, airLoading: 0.12, glide: 0.16 * vn * vn, glideTau: 0.035, gain: 1, maxRatio: 4.2,
    secondHead: 0.035,
  });
  // beater click: the short, bright contact noise heard from a close mic (stronger for harder strokes)
  noiseBurst(s, { lo: 1200, hi: 2500 + 6000 * vn, tau: 0.004, gain: 0.25 * vn * vn * (k.beater === "plastic" ? 1.6 : 1) });
  return muted ? -5 : -3;
}

function shellPartials(shell: SnareSpec["shell"], base: number): { f: number; a: number; tau: number }[] {
  // metal shells ring longer and higher; wooden shells are lower and heavily damped (common practice)
  if (shell === "brass" || shell === "steel") {
    return [1.0, 1.62, 2.31, 3.05, 3.9].map((r, i) => ({ f: base * 5.2 * r, a: 0.04 / (i + 1), tau: 0.12 / (1 + i * 0.4) }));
  }
  return [1.0, 1.47, 2.2].map((r, i) => ({ f: base * 3.1 * r, a: 0.04 / (i + 1), tau: 0.05 / (1 + i * 0.5) }));
}

function snareWires(s: Src, sp: SnareSpec, o: { gain: number; tau: number; f0: number }): void {
  const n = s.L.length;
  const delay = s.pre + ((sp.depthIn * 0.0254) / SPEED_OF_SOUND) * s.sr; // air column between the heads
  const buzzRate = o.f0;
  const common = whiteNoise(n, s.rng);
  for (const [buf, k] of [[s.L, 0], [s.R, 1]] as const) {
    const x = pairNoise(n, s, common);
    biquad(x, s.sr, "highpass", 1500, 0.6);
    biquad(x, s.sr, "lowpass", 3500 + 9000 * s.vn, 0.6);
    const dec = Math.exp(-1 / (o.tau * s.sr));
    let g = 1;
    const w = (2 * Math.PI * buzzRate) / s.sr;
    const start = Math.floor(delay);
    for (let i = 0; i < n; i++) {
      if (i < start) { x[i] = 0; continue; }
      const t = i - start;
      const att = t < 0.0015 * s.sr ? t / (0.0015 * s.sr) : 1;
      g *= dec;
      // wires slap the head once per cycle: the noise is modulated at the head's rate
      const slap = 0.55 + 0.45 * Math.max(0, Math.sin(w * t + k * 0.3));
      x[i] *= att * g * slap;
    }
    mixInto(buf, x, o.gain * (k === 0 ? 1 : 0.9), 0);
  }
}

function renderSnare(s: Src, sp: SnareSpec, art: SnareArticulation): number {
  const vn = s.vn;
  const f0 = sp.tuneHz * (1 + s.rng.gauss() * 0.006);
  const wireTau = 0.11 * (sp.depthIn / 6) + s.rng.gauss() * 0.008;
  if (art === "cross-stick" || art === "rim-click") {
    // the stick, laid across, strikes the rim: a wooden free-free bar plus a knock of the shell, head faint
    const f1 = (art === "cross-stick" ? 600 : 820) * (1 + s.rng.gauss() * 0.02);
    partials(s, [1, 2.756, 5.404, 8.933].map((r, i) => ({ f: f1 * r, a: [1, 0.6, 0.35, 0.2][i] * (i === 0 ? 1 : 0.6 + 0.6 * vn), tau: [0.03, 0.016, 0.008, 0.005][i] })), 0.5);
    partials(s, shellPartials(sp.shell, f0), 1.2);
    noiseBurst(s, { lo: 800, hi: 3000 + 5000 * vn, tau: 0.003, gain: 0.2 + 0.2 * vn });
    membrane(s, { f0, strikeRadius: 0.92, tau0: 0.08, tauExp: 0.6, contactT: 0.002, airLoading: 0.1, glide: 0, glideTau: 0.05, gain: 0.12 });
    snareWires(s, sp, { gain: 0.02, tau: wireTau * 0.6, f0 });
    return art === "cross-stick" ? -12 : -14;
  }
  const radius = art === "centre" ? 0.18 : art === "half-edge" ? 0.5 : art === "edge" ? 0.82 : 0.3;
  const rim = art === "rim-shot";
  const T = contactTime(rim ? 0.00035 : 0.0007, s.v);
  membrane(s, {
    f0, strikeRadius: radius, tau0: 0.11 + 0.02 * s.rng.next(), tauExp: 0.55, contactT: T, airLoading: 0.1,
    glide: 0.035 * vn * vn, glideTau: 0.03, gain: 1, maxRatio: 6, secondHead: 0.04,
  });
  partials(s, shellPartials(sp.shell, f0), rim ? 2.5 : 1);
  const wireGain = art === "centre" ? 0.55 : art === "half-edge" ? 0.5 : art === "edge" ? 0.4 : 0.55;
  snareWires(s, sp, { gain: wireGain * (0.8 + 0.4 * vn), tau: wireTau, f0 });
  noiseBurst(s, { lo: 300, hi: 2000 + 8000 * vn, tau: 0.0015, gain: 0.15 * vn });
  if (rim) {
    // steel or die-cast hoop: inharmonic metallic partials, and the crack of wood on metal
    partials(s, [1, 1.63, 2.41, 3.36, 4.43, 5.6].map((r, i) => ({ f: 1350 * r, a: 0.3 / (1 + i * 0.3), tau: 0.06 / (1 + i * 0.3) })), 0.8 + 0.8 * vn);
    noiseBurst(s, { lo: 1500, hi: 14000, tau: 0.004, gain: 0.9 * vn + 0.3 });
    return -1.5;
  }
  return art === "centre" ? -4 : art === "half-edge" ? -4.5 : -5.5;
}

function renderTom(s: Src, t: TomSpec, art: TomArticulation): number {
  const vn = s.vn;
  const f0 = t.tuneHz * (1 + s.rng.gauss() * 0.005);
  const rim = art === "rim-shot";
  const T = contactTime(rim ? 0.0004 : 0.0008, s.v);
  const sizeScale = t.diameterIn / 12;
  membrane(s, {
    f0, strikeRadius: art === "edge" ? 0.75 : rim ? 0.32 : 0.2, tau0: (t.floor ? 0.5 : 0.34) * Math.sqrt(sizeScale),
    tauExp: 0.75, contactT: T, airLoading: 0.14, glide: (t.floor ? 0.09 : 0.07) * vn * vn, glideTau: 0.08,
    gain: 1, maxRatio: 5.2, secondHead: 0.03,
  });
  partials(s, [1, 1.52, 2.24].map((r, i) => ({ f: f0 * 4.3 * r, a: 0.03 / (i + 1), tau: 0.05 })), 1);
  noiseBurst(s, { lo: 400, hi: 2000 + 9000 * vn, tau: 0.0015, gain: 0.05 + 0.2 * vn });
  if (rim) {
    partials(s, [1, 1.63, 2.41, 3.36].map((r, i) => ({ f: 1250 * r, a: 0.2 / (1 + i * 0.5), tau: 0.05 / (1 + i * 0.3) })), 0.6 + 0.6 * vn);
    noiseBurst(s, { lo: 900, hi: 11000, tau: 0.003, gain: 0.45 * vn + 0.15 });
    return -2;
  }
  return art === "edge" ? -5 : -4;
}

export interface CymbalOpts {
  nPartials: number;
  fLo: number;
  fHi: number;
  tau1k: number; // partial time constant at 1 kHz
  tauExp: number; // tau(f) = tau1k * (1000/f)^tauExp
  contactT: number;
  washGain: number;
  washLo: number;
  washHi: number;
  washTau: number;
  washRise: number;
  sizzle?: number; // depth of random rattling modulation 0..1
  sizzleRate?: number;
  lowModes?: number; // number of low plate modes f ~ n^2
  lowBase?: number;
  gain?: number;
}

export function cymbal(s: Src, o: CymbalOpts): void {
  const g = o.gain ?? 1;
  // low plate modes (f roughly proportional to n^2 for the low (n,0) modes of a thin plate, F&R ch. 3 and 20)
  for (let n = 2; n < 2 + (o.lowModes ?? 0); n++) {
    const f = (o.lowBase ?? 60) * n * n * (1 + s.rng.gauss() * 0.01);
    if (f < o.fLo * 0.5) continue;
    const [gl, gr] = pan(s.rng, 0.5);
    addMode(s.L, s.R, s.sr, {
      // a small plate radiates poorly at low frequencies (radiation efficiency grows steeply with frequency
      // below coincidence; Cremer & Heckl, Structure-Borne Sound; from memory)
      freq: f, amp: g * 0.12 * contactWeight(f, o.contactT) * Math.min(1, Math.pow(f / 600, 2)) * (0.6 + 0.8 * s.rng.next()),
      tau: o.tau1k * Math.pow(1000 / f, o.tauExp) * (0.8 + 0.4 * s.rng.next()), gainL: gl, gainR: gr, start: s.pre,
      phase: s.rng.next() * 2 * Math.PI,
    });
  }
  // the dense inharmonic partials: modal density roughly constant in frequency
  for (let i = 0; i < o.nPartials; i++) {
    const f = o.fLo + (o.fHi - o.fLo) * s.rng.next();
    const [gl, gr] = pan(s.rng, 0.5);
    const rayleigh = Math.sqrt(-2 * Math.log(1 - s.rng.next() * 0.999));
    const amp = (g * 0.06 * rayleigh * contactWeight(f, o.contactT) * Math.pow(1000 / Math.max(f, 300), 0.3) * 40) / o.nPartials;
    addMode(s.L, s.R, s.sr, {
      freq: f, amp, tau: o.tau1k * Math.pow(1000 / f, o.tauExp) * (0.75 + 0.5 * s.rng.next()),
      gainL: gl, gainR: gr, start: s.pre, phase: s.rng.next() * 2 * Math.PI,
    });
  }
  // the wash: high-frequency energy that builds up after the strike (nonlinear cascade) and decays
  const n = s.L.length;
  const sizzle = o.sizzle ?? 0;
  // rattle: a random slowly-varying gain (the hi-hat pair or the china's flange chattering), heard by both mics
  let rattle: Float64Array | null = null;
  if (sizzle > 0) {
    rattle = new Float64Array(n);
    const rateN = Math.max(1, Math.round(s.sr / (o.sizzleRate ?? 40)));
    let r = 1;
    let target = 1;
    for (let i = 0; i < n; i++) {
      if (i % rateN === 0) target = 1 - sizzle * s.rng.next();
      r += (target - r) * 0.02;
      rattle[i] = r;
    }
  }
  const common = whiteNoise(n, s.rng);
  for (const [buf, k] of [[s.L, 0], [s.R, 1]] as const) {
    const x = pairNoise(n, s, common);
    biquad(x, s.sr, "highpass", o.washLo, 0.6);
    biquad(x, s.sr, "highpass", o.washLo, 0.6);
    biquad(x, s.sr, "lowpass", o.washHi, 0.6);
    const dec = Math.exp(-1 / (o.washTau * s.sr));
    const riseK = 1 / (o.washRise * s.sr);
    let e = 1;
    for (let i = 0; i < n; i++) {
      if (i < s.pre) { x[i] = 0; continue; }
      const t = i - s.pre;
      e *= dec;
      const rise = 1 - Math.exp(-t * riseK);
      x[i] *= e * rise * (rattle ? rattle[i] : 1);
    }
    mixInto(buf, x, g * o.washGain * (k === 0 ? 1 : 0.95), 0);
  }
}

/** Chokes a ringing source: a hand grabs it `at` seconds after the strike and it dies with time constant tau. */
export function choke(s: Src, at: number, tau: number): void {
  const tc = s.pre + Math.round(at * s.sr);
  const dec = Math.exp(-1 / (tau * s.sr));
  for (const b of [s.L, s.R]) {
    let g = 1;
    for (let i = tc; i < b.length; i++) { g *= dec; b[i] *= g; }
  }
}

export function cymbalStick(s: Src, vn: number, gain: number): void {
  // the stick tip's tick on metal
  noiseBurst(s, { lo: 2000, hi: 5000 + 10000 * vn, tau: 0.0012, gain: gain * (0.3 + 0.7 * vn) });
}

function renderHiHat(s: Src, h: HiHatSpec, art: HiHatArticulation): number {
  const vn = s.vn;
  const sz = h.diameterIn / 14;
  const T = contactTime(0.00025, s.v);
  const base = { fLo: 500 / sz, fHi: 16000, tauExp: 0.5, contactT: T, washLo: 5500, washHi: 9000 + 7000 * vn, nPartials: 70 };
  switch (art) {
    case "closed":
      cymbal(s, { ...base, tau1k: 0.028, washGain: 0.7, washTau: 0.018 + 0.005 * s.rng.next(), washRise: 0.0008 });
      cymbalStick(s, vn, 0.6);
      return -8;
    case "quarter-open":
      cymbal(s, { ...base, tau1k: 0.12, washGain: 0.6, washTau: 0.075, washRise: 0.0015, sizzle: 0.5, sizzleRate: 55 });
      cymbalStick(s, vn, 0.5);
      return -7;
    case "half-open":
      cymbal(s, { ...base, tau1k: 0.3, washGain: 0.55, washTau: 0.16, washRise: 0.002, sizzle: 0.6, sizzleRate: 35 });
      cymbalStick(s, vn, 0.45);
      return -6.5;
    case "open":
      cymbal(s, { ...base, tau1k: 0.6, washGain: 0.5, washTau: 0.36, washRise: 0.003, sizzle: 0.15, sizzleRate: 20 });
      cymbalStick(s, vn, 0.4);
      return -6;
    case "pedal": {
      // the two cymbals clapped by the foot: short "chick", less bright than a stick hit
      noiseBurst(s, { lo: 1500, hi: 5000 + 3000 * vn, tau: 0.012 + 0.004 * s.rng.next(), gain: 0.6, attack: 0.002 });
      partials(s, [1, 1.37, 1.93, 2.6].map((r, i) => ({ f: 900 * r, a: 0.2 / (i + 1), tau: 0.015 })), 1);
      return -18;
    }
    case "foot-splash": {
      noiseBurst(s, { lo: 1500, hi: 6000, tau: 0.01, gain: 0.4, attack: 0.002 });
      cymbal(s, { ...base, contactT: 0.0008, tau1k: 0.35, washGain: 0.5, washTau: 0.22, washRise: 0.004, sizzle: 0.4, sizzleRate: 30 });
      return -13;
    }
  }
}

function renderCrash(s: Src, c: CymbalSpec, art: CrashArticulation): number {
  const vn = s.vn;
  const sz = c.diameterIn / 18;
  const bell = art === "bell";
  const T = contactTime(bell ? 0.0002 : 0.00035, s.v);
  if (bell) {
    partials(s, [1, 1.48, 2.07, 2.6, 3.28, 4.12].map((r, i) => ({ f: 950 / sz * r, a: 0.5 / (1 + i * 0.6), tau: 0.55 / (1 + i * 0.35) })), 0.9);
    cymbal(s, { nPartials: 40, fLo: 1500, fHi: 14000, tau1k: 0.5, tauExp: 0.5, contactT: T, washGain: 0.15 * vn, washLo: 4000, washHi: 12000, washTau: 0.4, washRise: 0.01, gain: 0.5 });
    cymbalStick(s, vn, 0.3);
    return -7;
  }
  cymbal(s, {
    nPartials: 150, fLo: 300, fHi: 16000, tau1k: 0.42 * sz, tauExp: 0.4, contactT: T, lowModes: 6, lowBase: 55 / sz,
    washGain: 0.5 + 0.6 * vn, washLo: 3000, washHi: 8000 + 6000 * vn, washTau: 0.45 * sz, washRise: 0.003 + 0.006 * vn,
    gain: art === "bow" ? 0.8 : 1,
  });
  cymbalStick(s, vn, 0.35);
  if (art === "choke") {
    // a hand grabs the edge: everything dies within a few tens of milliseconds after ~0.25 s
    choke(s, 0.22 + 0.06 * s.rng.next(), 0.025);
  }
  return art === "bow" ? -7 : -5;
}

function renderRide(s: Src, c: CymbalSpec, art: RideArticulation): number {
  const vn = s.vn;
  const sz = c.diameterIn / 21;
  if (art === "bell") {
    const T = contactTime(0.0002, s.v);
    partials(s, [1, 1.5, 2.12, 2.71, 3.37, 4.3].map((r, i) => ({ f: (780 / sz) * r, a: 0.55 / (1 + i * 0.5), tau: 0.7 / (1 + i * 0.35) })), 1);
    cymbal(s, { nPartials: 50, fLo: 1500, fHi: 14000, tau1k: 0.6, tauExp: 0.5, contactT: T, washGain: 0.08 + 0.1 * vn, washLo: 4000, washHi: 11000, washTau: 0.5, washRise: 0.01, gain: 0.45 });
    cymbalStick(s, vn, 0.35);
    return -6;
  }
  const crash = art === "crash-hit";
  const T = contactTime(crash ? 0.0005 : 0.0003, s.v);
  // bow: a clear "ping" from the stick over a lower wash that sustains for seconds
  cymbal(s, {
    nPartials: 130, fLo: 300, fHi: 15000, tau1k: 0.55 * sz, tauExp: 0.35, contactT: T, lowModes: 5, lowBase: 45 / sz,
    washGain: crash ? 0.5 + 0.3 * vn : 0.12 + 0.15 * vn, washLo: 3500, washHi: 7000 + 5000 * vn, washTau: crash ? 0.6 : 0.5,
    washRise: crash ? 0.006 : 0.008, gain: 1,
  });
  partials(s, [1, 1.41, 1.87].map((r, i) => ({ f: 2900 * r * (1 + s.rng.gauss() * 0.03), a: 0.08 / (i + 1), tau: 0.25 })), 1);
  cymbalStick(s, vn, crash ? 0.25 : 0.6);
  return crash ? -6 : -10;
}

function renderChina(s: Src, c: CymbalSpec, art: ChinaArticulation): number {
  const vn = s.vn;
  const sz = c.diameterIn / 18;
  const T = contactTime(0.0004, s.v);
  // upturned flange: trashy, stronger mid-range, a rattling wash and a quicker decay than a crash
  cymbal(s, {
    nPartials: 170, fLo: 350, fHi: 12000, tau1k: 0.32 * sz, tauExp: 0.4, contactT: T, lowModes: 6, lowBase: 70 / sz,
    washGain: 0.6 + 0.3 * vn, washLo: 1500, washHi: 6000 + 4000 * vn, washTau: 0.3 * sz, washRise: 0.008,
    sizzle: 0.55, sizzleRate: 70, gain: 1.1,
  });
  cymbalStick(s, vn, 0.3);
  if (art === "choke") choke(s, 0.18 + 0.05 * s.rng.next(), 0.02);
  return -5;
}

function renderCowbell(s: Src, cb: CowbellSpec, art: CowbellArticulation): number {
  const vn = s.vn;
  const tauScale = art === "mute" ? 0.35 : 1;
  partials(s, [
    { f: cb.lowHz, a: 0.8, tau: 0.09 * tauScale },
    { f: cb.highHz, a: 1.0, tau: 0.07 * tauScale },
    { f: cb.lowHz * 2.91, a: 0.15 + 0.25 * vn, tau: 0.03 * tauScale },
    { f: cb.highHz * 2.63, a: 0.1 + 0.2 * vn, tau: 0.025 * tauScale },
  ], 1);
  noiseBurst(s, { lo: 1500, hi: 4000 + 8000 * vn, tau: 0.002, gain: 0.3 * vn });
  return art === "mute" ? -9 : -6;
}

// ---------------------------------------------------------------------------------------------------------
// Microphones

interface MicModel { gainDb: number; distanceM: number; lowpassHz: number; reverbDb: number; t60: number }
const MIC_MODELS: Record<Mic, MicModel> = {
  // levels are gain-staged at the preamp (common practice), not raw inverse-square differences
  close: { gainDb: 0, distanceM: 0.05, lowpassHz: 20000, reverbDb: -30, t60: 0.5 },
  // beyond the critical distance (about 1-2 m in a live room) the reverberant field outweighs the direct sound
  overhead: { gainDb: -4, distanceM: 1.0, lowpassHz: 12000, reverbDb: -10, t60: 0.7 },
  room: { gainDb: -10, distanceM: 4.0, lowpassHz: 6500, reverbDb: 4, t60: 1.0 },
};

export const DEFAULT_SECONDS: Record<SoundSpec["family"], number> = {
  kick: 1.5, snare: 1.5, tom: 2.5, "hi-hat": 2.5, crash: 5, ride: 6, china: 4, cowbell: 1,
};

/** Default length in seconds for a sound (long enough for the tail to reach the noise floor). */
export function defaultSeconds(sound: SoundSpec): number {
  if (sound.family === "hi-hat") {
    return { closed: 1, "quarter-open": 1.5, "half-open": 2, open: 3.5, pedal: 1, "foot-splash": 3 }[sound.articulation];
  }
  if (sound.family === "crash" && sound.articulation === "choke") return 1.5;
  if (sound.family === "china" && sound.articulation === "choke") return 1.5;
  if (sound.family === "ride" && sound.articulation === "bell") return 4;
  if (sound.family === "tom" && sound.instrument.floor) return 3;
  return DEFAULT_SECONDS[sound.family];
}

export const NOISE_FLOOR_DBFS = -80;

/**
 * Renders one take. Returns one Float32Array per channel in [-1, 1].
 * Level: the loudest dynamic peaks near the articulation's reference level; softer strikes follow
 * peak_dB = ref + 32 log10(v / 127) (about 34 dB between v=11 and v=127; our assumption, close to a
 * drummer's range) plus a natural take-to-take spread.
 */
export function renderSound(sound: SoundSpec, opts: RenderOptions): Float32Array[] {
  const key = `${sound.family}|${JSON.stringify(sound.instrument)}|${sound.articulation}|${opts.velocity}|${opts.seed}`;
  return renderTake(key, defaultSeconds(sound), opts, (s) => drawSound(sound, s));
}

/** Draws a sound's dry source into a take's buffers; returns its reference peak level in dB at full strength. */
export function drawSound(sound: SoundSpec, s: Src): number {
  switch (sound.family) {
    case "kick": return renderKick(s, sound.instrument, sound.articulation);
    case "snare": return renderSnare(s, sound.instrument, sound.articulation);
    case "tom": return renderTom(s, sound.instrument, sound.articulation);
    case "hi-hat": return renderHiHat(s, sound.instrument, sound.articulation);
    case "crash": return renderCrash(s, sound.instrument, sound.articulation);
    case "ride": return renderRide(s, sound.instrument, sound.articulation);
    case "china": return renderChina(s, sound.instrument, sound.articulation);
    case "cowbell": return renderCowbell(s, sound.instrument, sound.articulation);
  }
}

/**
 * One take of any source: `body` writes the dry sound into the source buffers and returns its reference peak level
 * in dB; the take then gets its attack, level (the velocity law of renderSound), microphone, room and noise floor.
 * `key` seeds every random choice of the take.
 */
export function renderTake(key: string, defaultSecs: number, opts: RenderOptions, body: (s: Src) => number): Float32Array[] {
  const { sampleRate: sr } = opts;
  if (!Number.isFinite(sr) || sr < 8000 || sr > 384000) throw new RangeError(`sample rate out of range: ${sr}`);
  if (!Number.isFinite(opts.velocity) || opts.velocity < 1 || opts.velocity > 127) {
    throw new RangeError(`velocity must be 1-127, got ${opts.velocity}`);
  }
  const mic = opts.mic ?? "close";
  const channels = opts.channels ?? 2;
  const seconds = opts.seconds ?? defaultSecs;
  const n = Math.max(1, Math.round(seconds * sr));
  const rng = rngFromKey(key);
  // the player never strikes twice alike: a little velocity scatter drives both level and timbre
  const v = Math.min(127, Math.max(1, opts.velocity * (1 + rng.gauss() * 0.03)));
  const s: Src = {
    L: new Float64Array(n), R: new Float64Array(n), sr, rng: rng.fork("sound"), v, vn: v / 127,
    pre: Math.round(0.002 * sr), // a couple of milliseconds of pre-roll before the strike (common trimming practice)
  };
  const refDb = body(s);
  // attack: the contact itself takes time; soft strokes are slower to build up (shorter attack when harder)
  const attackS = 0.0004 + 0.0025 * (1 - s.vn) * (1 - s.vn);
  for (const b of [s.L, s.R]) {
    const na = Math.round(attackS * sr);
    for (let i = 0; i < na && s.pre + i < n; i++) b[s.pre + i] *= 0.5 - 0.5 * Math.cos((Math.PI * i) / na);
  }
  const peak = peakAbs([s.L, s.R]) || 1;
  const spread = (opts.takeSpreadDb ?? 0.6) * rng.gauss();
  const levelDb = refDb + 32 * Math.log10(v / 127) + spread;
  const norm = dbToGain(levelDb) / peak;
  const model = MIC_MODELS[mic];
  const mrng = rng.fork(`mic:${mic}`);
  const outs: Float64Array[] = [];
  for (let c = 0; c < channels; c++) {
    const src = channels === 1 ? s.L.map((x, i) => 0.5 * (x + s.R[i])) : c === 0 ? s.L : s.R;
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = src[i] * norm;
    if (model.lowpassHz < 20000) onePoleLowpass(x, sr, model.lowpassHz);
    // the reverberant field of the room, low-pass damped (longer and stronger for distant mics)
    const wet = schroederReverb(x, sr, model.t60, mic === "room" ? 0.45 : 0.3, c * 23);
    const wetGain = dbToGain(model.reverbDb);
    for (let i = 0; i < n; i++) x[i] = (x[i] + wet[i] * wetGain) * dbToGain(model.gainDb);
    // arrival delay (d / c); a close pair is coincident, the overhead and room pairs are spaced, so their right
    // channel arrives a little later (common practice)
    const spaced = mic === "close" ? 0 : model.distanceM * 0.0004 * sr;
    delayInPlace(x, (model.distanceM / SPEED_OF_SOUND) * sr + (c === 1 ? spaced : 0));
    outs.push(x);
  }
  // preamp and room noise floor, then a short fade at the very end (as exported one-shots are)
  const floorDb = opts.noiseFloorDbfs === undefined ? NOISE_FLOOR_DBFS : opts.noiseFloorDbfs;
  const floor = floorDb === null ? 0 : dbToGain(floorDb);
  const nrng = mrng.fork("floor");
  const fade = Math.min(n, Math.round(0.03 * sr));
  const result: Float32Array[] = [];
  for (const x of outs) {
    const noise = whiteNoise(n, nrng);
    biquad(noise, sr, "lowpass", 9000, 0.7);
    const out = new Float32Array(n);
    for (let i = 0; i < n; i++) {
      let y = x[i] + floor * noise[i];
      if (i >= n - fade) y *= 0.5 + 0.5 * Math.cos((Math.PI * (i - (n - fade))) / fade);
      out[i] = y > 1 ? 1 : y < -1 ? -1 : y;
    }
    result.push(out);
  }
  return result;
}

// One function per family, for callers that prefer them to the dispatcher.
export const kick = (i: KickSpec, a: KickArticulation, o: RenderOptions) => renderSound({ family: "kick", instrument: i, articulation: a }, o);
export const snare = (i: SnareSpec, a: SnareArticulation, o: RenderOptions) => renderSound({ family: "snare", instrument: i, articulation: a }, o);
export const tom = (i: TomSpec, a: TomArticulation, o: RenderOptions) => renderSound({ family: "tom", instrument: i, articulation: a }, o);
export const hiHat = (i: HiHatSpec, a: HiHatArticulation, o: RenderOptions) => renderSound({ family: "hi-hat", instrument: i, articulation: a }, o);
export const crash = (i: CymbalSpec, a: CrashArticulation, o: RenderOptions) => renderSound({ family: "crash", instrument: i, articulation: a }, o);
export const ride = (i: CymbalSpec, a: RideArticulation, o: RenderOptions) => renderSound({ family: "ride", instrument: i, articulation: a }, o);
export const china = (i: CymbalSpec, a: ChinaArticulation, o: RenderOptions) => renderSound({ family: "china", instrument: i, articulation: a }, o);
export const cowbell = (i: CowbellSpec, a: CowbellArticulation, o: RenderOptions) => renderSound({ family: "cowbell", instrument: i, articulation: a }, o);
