// Generated one-shots for the benchmarks: `count` WAV files of drums and cymbals, deterministic for a seed.
// Fast: a pool of distinct takes is synthesized once per format, and each file is a pool take with its own
// gain and its own low-level noise, so every file has different bytes (no accidental duplicates).

import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { renderSound, type SoundSpec } from "../lib/synth/drums";
import { rngFromKey } from "../lib/synth/rng";
import { encodeWav, type WavBits } from "../lib/synth/wav";

export interface BenchSetOptions {
  seconds?: number;
  sampleRate?: number;
  bits?: WavBits;
  channels?: 1 | 2;
  seed?: number;
}

type Resolved = Required<BenchSetOptions>;
const DEFAULTS: Resolved = { seconds: 1.5, sampleRate: 48000, bits: 24, channels: 2, seed: 1 };

const POOL_SOUNDS: { name: string; sound: SoundSpec }[] = [
  { name: "kick", sound: { family: "kick", instrument: { diameterIn: 22, depthIn: 16, tuneHz: 58, beater: "felt" }, articulation: "centre" } },
  { name: "snare", sound: { family: "snare", instrument: { diameterIn: 14, depthIn: 5.5, tuneHz: 210, shell: "steel" }, articulation: "centre" } },
  { name: "snare-rim", sound: { family: "snare", instrument: { diameterIn: 14, depthIn: 5.5, tuneHz: 210, shell: "steel" }, articulation: "rim-shot" } },
  { name: "tom", sound: { family: "tom", instrument: { diameterIn: 12, depthIn: 8, tuneHz: 140, floor: false }, articulation: "centre" } },
  { name: "floortom", sound: { family: "tom", instrument: { diameterIn: 16, depthIn: 14, tuneHz: 90, floor: true }, articulation: "centre" } },
  { name: "hat-closed", sound: { family: "hi-hat", instrument: { diameterIn: 14 }, articulation: "closed" } },
  { name: "hat-open", sound: { family: "hi-hat", instrument: { diameterIn: 14 }, articulation: "open" } },
  { name: "crash", sound: { family: "crash", instrument: { diameterIn: 18 }, articulation: "crash-hit" } },
  { name: "ride", sound: { family: "ride", instrument: { diameterIn: 20 }, articulation: "bow" } },
  { name: "cowbell", sound: { family: "cowbell", instrument: { lowHz: 560, highHz: 845 }, articulation: "hit" } },
];
const POOL_VELOCITIES = [40, 80, 120];

const poolCache = new Map<string, { name: string; channels: Float32Array[] }[]>();

function pool(o: Resolved): { name: string; channels: Float32Array[] }[] {
  const key = JSON.stringify(o);
  const hit = poolCache.get(key);
  if (hit) return hit;
  const p: { name: string; channels: Float32Array[] }[] = [];
  for (const s of POOL_SOUNDS) {
    for (const v of POOL_VELOCITIES) {
      p.push({
        name: `${s.name}-v${v}`,
        channels: renderSound(s.sound, { sampleRate: o.sampleRate, velocity: v, seed: `bench:${o.seed}`, channels: o.channels, seconds: o.seconds }),
      });
    }
  }
  poolCache.clear(); // keep one format in memory at a time
  poolCache.set(key, p);
  return p;
}

/** The name and WAV bytes of bench file number `index` (0-based) for these options. */
export function benchFile(index: number, opts: BenchSetOptions = {}): { name: string; bytes: Uint8Array } {
  const o: Resolved = { ...DEFAULTS, ...opts };
  const p = pool(o);
  const src = p[index % p.length];
  const rng = rngFromKey(`bench:${o.seed}:${index}`);
  const gain = Math.pow(10, (-6 * rng.next()) / 20);
  const noise = Math.pow(10, -90 / 20) * Math.sqrt(12);
  const chs = src.channels.map((c) => {
    const out = new Float32Array(c.length);
    for (let i = 0; i < c.length; i++) out[i] = c[i] * gain + noise * (rng.next() - 0.5);
    return out;
  });
  return { name: `bench_${String(index + 1).padStart(5, "0")}_${src.name}.wav`, bytes: encodeWav(chs, { sampleRate: o.sampleRate, bits: o.bits }) };
}

/** Writes `count` files into outdir (created if needed) and returns their paths and sizes. */
export function generateBenchSet(outdir: string, count: number, opts: BenchSetOptions = {}): { files: string[]; bytes: number } {
  if (!Number.isInteger(count) || count < 0) throw new RangeError(`count must be a non-negative integer, got ${count}`);
  mkdirSync(outdir, { recursive: true });
  const files: string[] = [];
  let bytes = 0;
  for (let i = 0; i < count; i++) {
    const f = benchFile(i, opts);
    const target = path.join(outdir, f.name);
    writeFileSync(target, f.bytes);
    files.push(target);
    bytes += f.bytes.length;
  }
  return { files, bytes };
}
