// Renders one note of a SoundFont 2 percussion preset the way a synthesizer following the SoundFont 2.04
// specification would play it, so the corpus holds what a listener hears at that key (the closed hi-hat of
// many fonts is the open-hat recording cut short by its volume envelope; a tom recording is transposed over
// several keys). Pure: sample data and generator values in, float channels out.
//
// What is modelled (SoundFont Technical Specification 2.04, sections 8.1.2-8.1.3 and 8.4; the unit
// conversions are from the spec, checked in sf2-voice.test.ts):
//   - zone selection by key and velocity range; instrument global zone + local zone (local overrides),
//     preset global + local zones added to the instrument's values;
//   - sample start/end/loop offsets (fine + coarse * 32768), sample modes (loop while held, or loop until release);
//   - pitch: root key (overriding root key or the sample's original pitch), scale tuning, coarse and fine tune,
//     the sample's pitch correction; resampled by linear interpolation to 44.1 kHz;
//   - volume envelope: delay, attack (linear amplitude), hold, decay and sustain (linear in dB), release, with
//     key-number scaling of hold and decay; initial attenuation;
//   - a two-pole low-pass at the initial filter cutoff and resonance, moved by the modulation envelope;
//   - the default modulators for note-on velocity (concave attenuation up to 96 dB, cutoff down to -2400 cents).
// Not modelled (they barely change a one-shot's timbre or are absent from drum zones): LFOs, chorus, reverb,
// pan laws beyond the sample's own channel, other modulators. Linear interpolation dulls the top octave a
// little when a sample is transposed up.

export const OUTPUT_RATE = 44100;

/** Generator numbers (SoundFont 2.04, section 8.1.2). */
export const GEN = {
  startAddrsOffset: 0, endAddrsOffset: 1, startloopAddrsOffset: 2, endloopAddrsOffset: 3, startAddrsCoarseOffset: 4,
  initialFilterFc: 8, initialFilterQ: 9, modEnvToFilterFc: 11, endAddrsCoarseOffset: 12,
  delayModEnv: 25, attackModEnv: 26, holdModEnv: 27, decayModEnv: 28, sustainModEnv: 29, releaseModEnv: 30,
  keynumToModEnvHold: 31, keynumToModEnvDecay: 32,
  delayVolEnv: 33, attackVolEnv: 34, holdVolEnv: 35, decayVolEnv: 36, sustainVolEnv: 37, releaseVolEnv: 38,
  keynumToVolEnvHold: 39, keynumToVolEnvDecay: 40, keyRange: 43, velRange: 44, startloopAddrsCoarseOffset: 45,
  keynum: 46, velocity: 47, initialAttenuation: 48, endloopAddrsCoarseOffset: 50, coarseTune: 51, fineTune: 52,
  sampleModes: 54, scaleTuning: 56, exclusiveClass: 57, overridingRootKey: 58,
} as const;

/** Defaults of the generators used here (SoundFont 2.04, section 8.1.3). */
const DEFAULTS: Record<number, number> = {
  [GEN.initialFilterFc]: 13500, [GEN.initialFilterQ]: 0,
  [GEN.delayModEnv]: -12000, [GEN.attackModEnv]: -12000, [GEN.holdModEnv]: -12000, [GEN.decayModEnv]: -12000,
  [GEN.sustainModEnv]: 0, [GEN.releaseModEnv]: -12000,
  [GEN.delayVolEnv]: -12000, [GEN.attackVolEnv]: -12000, [GEN.holdVolEnv]: -12000, [GEN.decayVolEnv]: -12000,
  [GEN.sustainVolEnv]: 0, [GEN.releaseVolEnv]: -12000, [GEN.scaleTuning]: 100, [GEN.overridingRootKey]: -1,
};

/** Seconds of a timecent value: 2^(tc/1200); -32768 means 0 (spec 8.1.3). */
export function timecentsToSec(tc: number): number {
  return tc <= -32768 ? 0 : 2 ** (tc / 1200);
}

/** Hz of an absolute-cents value: 8.176 * 2^(c/1200) (spec 8.1.3: 6900 cents = 440 Hz). */
export function absCentsToHz(c: number): number {
  return 8.176 * 2 ** (c / 1200);
}

/** Amplitude factor of an attenuation in centibels: 10^(-cB/200). */
export function centibelsToGain(cb: number): number {
  return 10 ** (-cb / 200);
}

/**
 * Attenuation in centibels from the default "note-on velocity to initial attenuation" modulator (spec 8.4.2:
 * negative concave unipolar, amount 960 cB). The concave curve of spec 9.5.3: 960 * (-(20/96) log10((v/127)^2)),
 * capped at the amount.
 */
export function velocityAttenuationCb(velocity: number): number {
  if (velocity >= 127) return 0;
  if (velocity <= 0) return 960;
  const x = (127 - velocity) / 127; // negative unipolar source
  const concave = x >= 1 ? 1 : -(20 / 96) * Math.log10((1 - x) ** 2);
  return Math.min(960, 960 * concave);
}

/** Filter cutoff change in cents from the default "note-on velocity to filter cutoff" modulator (spec 8.4.3). */
export function velocityCutoffCents(velocity: number): number {
  return -2400 * ((127 - Math.max(0, Math.min(127, velocity))) / 127);
}

export interface SampleRef {
  index: number;
  /** Int16 samples of this sample header (start..end of the font's sample data). */
  data: Int16Array;
  sampleRate: number;
  originalPitch: number;
  pitchCorrection: number;
  startLoop: number; // relative to the sample's start
  endLoop: number;
  /** 1 mono, 2 right, 4 left, 8 linked */
  type: number;
  link: number;
}

export interface Voice {
  sample: SampleRef;
  /** Generator values after the instrument's and the preset's zones are combined. */
  gen: Record<number, number>;
}

export function genValue(v: Voice, g: number): number {
  return v.gen[g] ?? DEFAULTS[g] ?? 0;
}

/** Envelope levels (0..1 amplitude) per output sample for a DAHDSR envelope; release starts at noteOffAt. */
function envelope(
  n: number,
  fs: number,
  t: { delay: number; attack: number; hold: number; decay: number; sustainDb: number; release: number },
  noteOffAt: number,
  decayInDb: boolean,
): Float32Array {
  const out = new Float32Array(n);
  const sustainLin = decayInDb ? 10 ** (-t.sustainDb / 20) : Math.max(0, 1 - t.sustainDb / 100);
  const d0 = t.delay, a1 = d0 + t.attack, h1 = a1 + t.hold;
  let level = 0;
  for (let i = 0; i < n; i++) {
    const time = i / fs;
    if (time < noteOffAt) {
      if (time < d0) level = 0;
      else if (time < a1) level = t.attack > 0 ? (time - d0) / t.attack : 1;
      else if (time < h1) level = 1;
      else {
        const into = time - h1;
        if (decayInDb) {
          // decay runs linearly in dB towards the sustain level: the decay time is for a full 100 dB fall (spec 8.1.3)
          const db = t.decay > 0 ? Math.min(t.sustainDb, (100 * into) / t.decay) : t.sustainDb;
          level = 10 ** (-db / 20);
        } else {
          level = t.decay > 0 ? Math.max(sustainLin, 1 - into / t.decay) : sustainLin;
        }
      }
      out[i] = level;
    } else {
      // release: a 100 dB fall over the release time, from the level at note-off
      const into = time - noteOffAt;
      const db = t.release > 0 ? (100 * into) / t.release : 100;
      out[i] = db >= 100 ? 0 : level * 10 ** (-db / 20);
    }
  }
  return out;
}

export interface RenderOptions {
  key: number;
  velocity: number;
  /** Seconds the note is held (drum pads send short notes; fonts give drums long releases). */
  holdSec: number;
  /** Longest render, seconds. */
  maxSec: number;
}

/** Renders one voice to mono float samples at OUTPUT_RATE. Returns null for a voice with no sample data. */
export function renderVoice(v: Voice, o: RenderOptions): Float32Array | null {
  const s = v.sample;
  const g = (id: number) => genValue(v, id);
  const start = g(GEN.startAddrsOffset) + 32768 * g(GEN.startAddrsCoarseOffset);
  const end = s.data.length + g(GEN.endAddrsOffset) + 32768 * g(GEN.endAddrsCoarseOffset);
  const loopStart = s.startLoop + g(GEN.startloopAddrsOffset) + 32768 * g(GEN.startloopAddrsCoarseOffset);
  const loopEnd = s.endLoop + g(GEN.endloopAddrsOffset) + 32768 * g(GEN.endloopAddrsCoarseOffset);
  const a = Math.max(0, Math.min(s.data.length - 1, start));
  const b = Math.max(a + 1, Math.min(s.data.length, end));
  if (b - a < 2) return null;
  const mode = g(GEN.sampleModes) & 3; // 0 no loop, 1 loop, 3 loop until release
  const looped = (mode === 1 || mode === 3) && loopEnd - loopStart > 8 && loopEnd <= b;

  const root = g(GEN.overridingRootKey) >= 0 ? g(GEN.overridingRootKey) : s.originalPitch;
  const cents = (o.key - root) * g(GEN.scaleTuning) + g(GEN.coarseTune) * 100 + g(GEN.fineTune) + s.pitchCorrection;
  const step = (2 ** (cents / 1200) * s.sampleRate) / OUTPUT_RATE;

  const keyScale = 60 - o.key;
  const vol = {
    delay: timecentsToSec(g(GEN.delayVolEnv)),
    attack: timecentsToSec(g(GEN.attackVolEnv)),
    hold: timecentsToSec(g(GEN.holdVolEnv) + keyScale * g(GEN.keynumToVolEnvHold)),
    decay: timecentsToSec(g(GEN.decayVolEnv) + keyScale * g(GEN.keynumToVolEnvDecay)),
    sustainDb: Math.max(0, g(GEN.sustainVolEnv)) / 10,
    release: timecentsToSec(g(GEN.releaseVolEnv)),
  };
  const mod = {
    delay: timecentsToSec(g(GEN.delayModEnv)),
    attack: timecentsToSec(g(GEN.attackModEnv)),
    hold: timecentsToSec(g(GEN.holdModEnv) + keyScale * g(GEN.keynumToModEnvHold)),
    decay: timecentsToSec(g(GEN.decayModEnv) + keyScale * g(GEN.keynumToModEnvDecay)),
    sustainDb: Math.max(0, Math.min(1000, g(GEN.sustainModEnv))) / 10, // 0.1 % units: 1000 = 100 %
    release: timecentsToSec(g(GEN.releaseModEnv)),
  };

  // length: the unlooped sample plays to its end; a looped one sounds until its release has faded
  const natural = looped ? Infinity : (b - a) / step;
  const releaseEnd = (o.holdSec + vol.release) * OUTPUT_RATE;
  const n = Math.max(1, Math.floor(Math.min(natural, releaseEnd, o.maxSec * OUTPUT_RATE)));
  const volEnv = envelope(n, OUTPUT_RATE, vol, o.holdSec, true);
  const modEnv = envelope(n, OUTPUT_RATE, mod, o.holdSec, false);
  const gain = centibelsToGain(Math.max(0, g(GEN.initialAttenuation)) + velocityAttenuationCb(o.velocity));

  const out = new Float32Array(n);
  let pos = a;
  for (let i = 0; i < n; i++) {
    const k = Math.floor(pos);
    const frac = pos - k;
    let x0: number, x1: number;
    if (looped && k + 1 >= loopEnd) {
      const k0 = loopStart + ((k - loopStart) % (loopEnd - loopStart));
      x0 = s.data[k0]!;
      x1 = s.data[k0 + 1 < loopEnd ? k0 + 1 : loopStart]!;
    } else {
      if (k + 1 >= b) break;
      x0 = s.data[k]!;
      x1 = s.data[k + 1]!;
    }
    out[i] = ((x0 + (x1 - x0) * frac) / 32768) * volEnv[i]! * gain;
    pos += step;
    if (looped && pos >= loopEnd) pos = loopStart + ((pos - loopStart) % (loopEnd - loopStart));
  }

  // two-pole low-pass (RBJ cookbook biquad), cutoff moved by the modulation envelope, updated every 64 samples
  const fc0 = g(GEN.initialFilterFc) + velocityCutoffCents(o.velocity);
  const envAmount = g(GEN.modEnvToFilterFc);
  const qDb = Math.max(0, g(GEN.initialFilterQ)) / 10;
  if (fc0 < 13500 || envAmount !== 0) {
    const Q = Math.max(0.5, 10 ** (qDb / 20) / Math.SQRT2);
    let z1 = 0, z2 = 0, b0 = 1, b1 = 0, b2 = 0, a1 = 0, a2 = 0;
    for (let i = 0; i < n; i++) {
      if (i % 64 === 0) {
        const hz = Math.min(0.45 * OUTPUT_RATE, Math.max(20, absCentsToHz(fc0 + envAmount * modEnv[i]!)));
        const w = (2 * Math.PI * hz) / OUTPUT_RATE;
        const alpha = Math.sin(w) / (2 * Q);
        const c = Math.cos(w);
        const a0 = 1 + alpha;
        b0 = (1 - c) / 2 / a0; b1 = (1 - c) / a0; b2 = b0; a1 = (-2 * c) / a0; a2 = (1 - alpha) / a0;
      }
      const x = out[i]!;
      const y = b0 * x + z1;
      z1 = b1 * x - a1 * y + z2;
      z2 = b2 * x - a2 * y;
      out[i] = y;
    }
  }
  return out;
}

/** A zone as the parser gives it: generator values, key and velocity ranges. */
export interface ZoneLike {
  generators: Record<number, number>;
  keyRange?: { lo: number; hi: number };
  velRange?: { lo: number; hi: number };
}

const inRange = (r: { lo: number; hi: number } | undefined, x: number) => !r || (x >= r.lo && x <= r.hi);

/**
 * The voices a preset plays for one key and velocity: every preset zone and instrument zone whose key and
 * velocity ranges cover them. Instrument values: local zone over global zone over defaults; preset values
 * (global, then local) are added to them (spec 9.4), except for ranges, sample modes, root key and the
 * other "non-additive" generators, which presets may not set.
 */
export function voicesFor(
  preset: { global?: ZoneLike; zones: (ZoneLike & { instrument: { global?: ZoneLike; zones: (ZoneLike & { sample: SampleRef })[] } })[] },
  key: number,
  velocity: number,
): Voice[] {
  const NON_ADDITIVE = new Set<number>([GEN.startAddrsOffset, GEN.endAddrsOffset, GEN.startloopAddrsOffset, GEN.endloopAddrsOffset,
    GEN.startAddrsCoarseOffset, GEN.endAddrsCoarseOffset, GEN.startloopAddrsCoarseOffset, GEN.endloopAddrsCoarseOffset,
    GEN.keynum, GEN.velocity, GEN.sampleModes, GEN.exclusiveClass, GEN.overridingRootKey, GEN.keyRange, GEN.velRange]);
  const voices: Voice[] = [];
  for (const pz of preset.zones) {
    if (!inRange(pz.keyRange, key) || !inRange(pz.velRange, velocity)) continue;
    const inst = pz.instrument;
    for (const iz of inst.zones) {
      if (!inRange(iz.keyRange, key) || !inRange(iz.velRange, velocity)) continue;
      // local zones override their global zone; the preset's values are then added to the instrument's
      const gen: Record<number, number> = { ...(inst.global?.generators ?? {}), ...iz.generators };
      const presetGen: Record<number, number> = { ...(preset.global?.generators ?? {}), ...pz.generators };
      for (const [k, val] of Object.entries(presetGen)) {
        const id = Number(k);
        if (NON_ADDITIVE.has(id) || id === 41 || id === 53) continue;
        gen[id] = (gen[id] ?? DEFAULTS[id] ?? 0) + val;
      }
      voices.push({ sample: iz.sample, gen });
    }
  }
  return voices;
}
