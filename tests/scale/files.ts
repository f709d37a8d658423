// The files of the scale test: for each library, a generated drum kit (our own synthesizer, lib/synth) of named
// instruments in velocity layers and round robins, plus deliberate copies (the same bytes under another name)
// and broken files (damaged by tests/hostile/mutate.ts: an RF64 header, bytes that are not a WAV, and a RIFF/WAVE
// header that says 0 channels, which passes the upload's check and is refused by the decoder; and an empty file). The
// files are cut into batches the way an uploader would send them; a copy always travels in its original's batch,
// after it, so which of two equal files the library keeps (the first, see the upload's recorder) does not hang
// on which of two concurrent requests is recorded first.
import fs from "node:fs";
import path from "node:path";
import { renderSound, type SoundSpec } from "@/lib/synth/drums";
import { mulberry32 } from "@/lib/synth/rng";
import { layerVelocity } from "@/lib/synth/scenario";
import { encodeWav } from "@/lib/synth/wav";
import { mutateOnce } from "../hostile/mutate";

/** What the uploaded file is meant to become. */
export type FileKind =
  | "good" // catalogued, once
  | "copy" // same bytes as a good file of the same batch: a duplicate of it
  | "refused-at-upload" // refused by the upload (code in `code`)
  | "rejected-by-decoder"; // accepted, then refused by the measuring (the CLI's refusal gives the reason)

export interface PlannedFile { libraryIndex: number; path: string; kind: FileKind; code?: string; copyOf?: string; bytes: Uint8Array }
export interface PlannedLibrary { index: number; name: string; files: PlannedFile[]; batches: PlannedFile[][] }

interface Slot { folder: string; stem: string; sound: SoundSpec; layers: number; seconds: number }

function slots(k: number): Slot[] {
  const t = 1 + 0.04 * k; // each library's kit is tuned a little differently
  return [
    { folder: "Kick22", stem: "Kick22", sound: { family: "kick", instrument: { diameterIn: 22, depthIn: 18, tuneHz: 55 * t, beater: "felt" }, articulation: "centre" }, layers: 3, seconds: 0.7 },
    { folder: "Snare14", stem: "Snare14_Center", sound: { family: "snare", instrument: { diameterIn: 14, depthIn: 6.5, tuneHz: 200 * t, shell: "brass" }, articulation: "centre" }, layers: 3, seconds: 0.6 },
    { folder: "Snare14", stem: "Snare14_RimShot", sound: { family: "snare", instrument: { diameterIn: 14, depthIn: 6.5, tuneHz: 200 * t, shell: "brass" }, articulation: "rim-shot" }, layers: 2, seconds: 0.6 },
    { folder: "Toms", stem: "Tom10 center", sound: { family: "tom", instrument: { diameterIn: 10, depthIn: 8, tuneHz: 180 * t, floor: false }, articulation: "centre" }, layers: 2, seconds: 0.7 },
    { folder: "Toms", stem: "Tom12 center", sound: { family: "tom", instrument: { diameterIn: 12, depthIn: 9, tuneHz: 140 * t, floor: false }, articulation: "centre" }, layers: 2, seconds: 0.7 },
    { folder: "Toms", stem: "FloorTom16 center", sound: { family: "tom", instrument: { diameterIn: 16, depthIn: 16, tuneHz: 90 * t, floor: true }, articulation: "centre" }, layers: 2, seconds: 0.8 },
    { folder: "HiHat", stem: "hh_closed", sound: { family: "hi-hat", instrument: { diameterIn: 14 }, articulation: "closed" }, layers: 2, seconds: 0.5 },
    { folder: "HiHat", stem: "hh_open", sound: { family: "hi-hat", instrument: { diameterIn: 14 }, articulation: "open" }, layers: 1, seconds: 1 },
    { folder: "HiHat", stem: "hh_pedal", sound: { family: "hi-hat", instrument: { diameterIn: 14 }, articulation: "pedal" }, layers: 1, seconds: 0.5 },
    { folder: "Ride20", stem: "Ride20_bow", sound: { family: "ride", instrument: { diameterIn: 20 }, articulation: "bow" }, layers: 2, seconds: 1 },
    { folder: "Crash18", stem: "Crash18_hit", sound: { family: "crash", instrument: { diameterIn: 18 }, articulation: "crash-hit" }, layers: 1, seconds: 1 },
  ];
}
const LAYER_SLOTS = slots(0).reduce((n, s) => n + s.layers, 0);

const pad = (n: number) => String(n).padStart(2, "0");

/**
 * Plans `total` files over `libraries` libraries: about 94% good files, 3% copies and 3% broken (at least one of
 * each broken kind per library), in batches of `batchSize` files. Deterministic for its arguments.
 */
export function planLibraries({ total, libraries, batchSize = 8, seed = 1 }: { total: number; libraries: number; batchSize?: number; seed?: number }): PlannedLibrary[] {
  const perLibrary = Math.floor(total / libraries);
  const out: PlannedLibrary[] = [];
  for (let k = 0; k < libraries; k++) {
    const rnd = mulberry32(seed * 1000 + k);
    const brokenEach = Math.max(1, Math.round(perLibrary * 0.0075));
    const copies = Math.max(2, Math.round(perLibrary * 0.03));
    const goodTarget = perLibrary - 4 * brokenEach - copies;
    // round robins per layer: the same in every layer, one more in the first layers until the target is met
    const rr = Math.max(1, Math.floor(goodTarget / LAYER_SLOTS));
    let extra = Math.max(0, goodTarget - rr * LAYER_SLOTS);
    const good: PlannedFile[] = [];
    for (const s of slots(k)) {
      for (let l = 1; l <= s.layers; l++) {
        const takes = rr + (extra-- > 0 ? 1 : 0);
        for (let r = 1; r <= takes; r++) {
          const p = `${s.folder}/${s.stem}_v${l}_rr${pad(r)}.wav`;
          const velocity = Math.max(1, Math.min(127, layerVelocity(l, s.layers) + Math.round((rnd() - 0.5) * 6)));
          const chs = renderSound(s.sound, { sampleRate: 44_100, velocity, seed: `scale:${seed}:${k}:${p}`, channels: 1, seconds: s.seconds });
          good.push({ libraryIndex: k, path: p, kind: "good", bytes: encodeWav(chs, { sampleRate: 44_100, bits: 16 }) });
        }
      }
    }
    // shuffled (seeded), as files of a real upload arrive in no particular order
    for (let i = good.length - 1; i > 0; i--) {
      const j = Math.floor(rnd() * (i + 1));
      [good[i], good[j]] = [good[j]!, good[i]!];
    }
    const batches: PlannedFile[][] = [];
    for (let i = 0; i < good.length; i += batchSize) batches.push(good.slice(i, i + batchSize));
    const files: PlannedFile[] = [...good];
    // copies: a file's bytes again, under another name, later in the same batch
    for (let c = 0; c < copies; c++) {
      const b = batches[Math.floor(rnd() * batches.length)]!;
      const originals = b.filter((f) => f.kind === "good" && !files.some((x) => x.copyOf === f.path));
      const orig = originals[Math.floor(rnd() * originals.length)];
      if (!orig) continue;
      const copy: PlannedFile = { libraryIndex: k, path: `Copies/copy ${pad(c + 1)} of ${path.posix.basename(orig.path)}`, kind: "copy", copyOf: orig.path, bytes: orig.bytes };
      b.push(copy);
      files.push(copy);
    }
    // broken files, each in a batch of good ones (one bad file never fails its batch)
    for (let i = 0; i < brokenEach; i++) {
      const r = mulberry32(seed * 100_000 + k * 1000 + i);
      const base = () => encodeWav(renderSound(slots(k)[1]!.sound, { sampleRate: 44_100, velocity: 60 + i, seed: `scale-broken:${seed}:${k}:${i}`, channels: 1, seconds: 0.3 }), { sampleRate: 44_100, bits: 16 });
      const broken: PlannedFile[] = [
        { libraryIndex: k, path: `Broken/header says rf64 ${pad(i + 1)}.wav`, kind: "refused-at-upload", code: "rf64", bytes: mutateOnce(base(), "rf64", r) },
        { libraryIndex: k, path: `Broken/not audio ${pad(i + 1)}.wav`, kind: "refused-at-upload", code: "not-wav", bytes: mutateOnce(base(), "not-wav", r) },
        { libraryIndex: k, path: `Broken/empty ${pad(i + 1)}.wav`, kind: "refused-at-upload", code: "empty", bytes: new Uint8Array(0) },
        { libraryIndex: k, path: `Broken/zero channels ${pad(i + 1)}.wav`, kind: "rejected-by-decoder", bytes: mutateOnce(base(), "zero-channels", r) },
      ];
      for (const f of broken) {
        batches[Math.floor(rnd() * batches.length)]!.push(f);
        files.push(f);
      }
    }
    out.push({ index: k, name: `Scale kit ${k + 1}`, files, batches });
  }
  return out;
}

/**
 * Writes the single-process reference folder of a library: every file the library should hold (good files and the
 * ones only the decoder refuses), at its path, for `kitwright catalogue` and `kitwright audit`.
 */
export function writeReferenceFolder(lib: PlannedLibrary, dir: string): void {
  for (const f of lib.files) {
    if (f.kind !== "good" && f.kind !== "rejected-by-decoder") continue;
    const target = path.join(dir, f.path);
    fs.mkdirSync(path.dirname(target), { recursive: true });
    fs.writeFileSync(target, f.bytes);
  }
}
