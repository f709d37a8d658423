// npm run corpus [-- --force] [-- --inspect]
// Builds the open labelled corpus of real drum recordings used to train and evaluate the sound model:
// Debian's fluid-soundfont-gm package (MIT licence) is fetched with `apt-get download`, its percussion
// presets (bank 128) are read with the soundfont2 parser, every key of the General MIDI Level 1 percussion
// key map (MIDI Manufacturers Association; table in lib/audit/templates.ts) is rendered as the font plays
// it (sf2-voice.ts), identical renders are kept once, and each file gets its truth from the key map.
// Output (kept out of git, rebuilt when missing or when this builder changes):
//   <KW_CORPUS_DIR or .data/corpus/fluid-gm>/wav/<opaque id>.wav   24-bit PCM, 44.1 kHz, mono or stereo
//   <...>/labels.json                                              one item per file (see CorpusItem)
// What is kept and why: scripts/corpus/README.md. --inspect prints every render with the font's own sample
// names (to look at the data; the names are never written to the corpus).

import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { SoundFont2 } from "soundfont2";
import { encodeWav } from "../../lib/synth/wav";
import { gmPercussionTruth } from "../../lib/audit/templates";
import { corpusDir, type CorpusFile, type CorpusItem, CORPUS_BUILDER_VERSION } from "./corpus";
import { renderVoice, voicesFor, OUTPUT_RATE, type SampleRef, type ZoneLike } from "./sf2-voice";

const ROOT = path.resolve(__dirname, "../..");
const CACHE = path.join(ROOT, ".data/corpus/cache");
const SF2_IN_DEB = "./usr/share/sounds/sf2/FluidR3_GM.sf2";

/** Programs of bank 128 that are General MIDI kit maps. 48 and up (orchestra, effects) are not. */
const KIT_PROGRAM_MAX = 47;
/** Kits made of synthesised drums (programs 24 and 25 in this font): kept, marked electronic. */
const ELECTRONIC_PROGRAMS = new Set([24, 25]);
/** Brush kits: the snare keys 38-40 hold brush strokes (tap, slap, swirl), not stick hits or a clap. */
const BRUSH_PROGRAMS = new Set([40, 41, 42]);
/** Longest render in seconds (a held cymbal with a long release rings longer; it is faded out here). */
const MAX_SEC = 8;

function log(msg: string) {
  process.stderr.write(`[corpus] ${msg}\n`);
}

function sha256(b: Uint8Array | Buffer): string {
  return createHash("sha256").update(b).digest("hex");
}

/** The SoundFont file, fetched with apt-get download into the cache and extracted from the package. */
function fetchSf2(): string {
  mkdirSync(CACHE, { recursive: true });
  const sf2 = path.join(CACHE, "FluidR3_GM.sf2");
  if (existsSync(sf2)) return sf2;
  let deb = readdirSync(CACHE).find((f) => /^fluid-soundfont-gm_.*\.deb$/.test(f));
  if (!deb) {
    log("apt-get download fluid-soundfont-gm");
    try {
      execFileSync("apt-get", ["download", "fluid-soundfont-gm"], { cwd: CACHE, stdio: ["ignore", "ignore", "inherit"] });
    } catch {
      log("apt-get update, then download again");
      execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit" });
      execFileSync("apt-get", ["download", "fluid-soundfont-gm"], { cwd: CACHE, stdio: ["ignore", "ignore", "inherit"] });
    }
    deb = readdirSync(CACHE).find((f) => /^fluid-soundfont-gm_.*\.deb$/.test(f));
    if (!deb) throw new Error("apt-get download fluid-soundfont-gm left no package file");
  }
  log(`extracting the SoundFont from ${deb}`);
  const tar = execFileSync("dpkg-deb", ["--fsys-tarfile", path.join(CACHE, deb)], { maxBuffer: 512 * 1024 * 1024 });
  const out = execFileSync("tar", ["-x", "-O", SF2_IN_DEB], { input: tar, maxBuffer: 512 * 1024 * 1024 });
  writeFileSync(sf2, out);
  return sf2;
}

interface RawZone {
  generators: Record<number, { value?: number; range?: { lo: number; hi: number } }>;
  keyRange?: { lo: number; hi: number };
}

function zoneLike(z: RawZone | undefined): ZoneLike | undefined {
  if (!z) return undefined;
  const generators: Record<number, number> = {};
  let velRange: { lo: number; hi: number } | undefined;
  for (const [k, g] of Object.entries(z.generators)) {
    if (Number(k) === 44 && g.range) velRange = g.range;
    else if (typeof g.value === "number") generators[Number(k)] = g.value;
  }
  const keyRange = z.keyRange ?? (z.generators[43]?.range as { lo: number; hi: number } | undefined);
  return { generators, keyRange, velRange };
}

/** Union-find over sample indices: one physical recording (stereo halves, layers of one stroke) per group. */
class Groups {
  private parent = new Map<number, number>();
  find(x: number): number {
    let p = this.parent.get(x) ?? x;
    if (p !== x) {
      p = this.find(p);
      this.parent.set(x, p);
    }
    return p;
  }
  union(a: number, b: number) {
    const ra = this.find(a), rb = this.find(b);
    if (ra !== rb) this.parent.set(Math.max(ra, rb), Math.min(ra, rb));
  }
}

interface Render {
  program: number;
  key: number;
  velocity: number;
  voices: { sample: number; name: string; instrument: string; peak: number }[];
  channels: Float32Array[];
  hash: string;
}

function main() {
  const args = new Set(process.argv.slice(2));
  const out = corpusDir();
  const labelsPath = path.join(out, "labels.json");
  const sf2Path = fetchSf2();
  const sf2Bytes = readFileSync(sf2Path);
  const sf2Sha = sha256(sf2Bytes);
  if (!args.has("--force") && !args.has("--inspect") && existsSync(labelsPath)) {
    const prev = JSON.parse(readFileSync(labelsPath, "utf8")) as CorpusFile;
    const complete = prev.items.every((i) => existsSync(path.join(out, "wav", i.file)));
    if (prev.builderVersion === CORPUS_BUILDER_VERSION && prev.source.sha256 === sf2Sha && complete) {
      log(`up to date: ${prev.items.length} files in ${out}`);
      return;
    }
  }

  log("reading the SoundFont");
  const sf = new SoundFont2(new Uint8Array(sf2Bytes.buffer, sf2Bytes.byteOffset, sf2Bytes.byteLength));
  const refs: SampleRef[] = sf.samples.map((s, index) => ({
    index,
    data: s.data,
    sampleRate: s.header.sampleRate,
    originalPitch: s.header.originalPitch,
    pitchCorrection: s.header.pitchCorrection > 127 ? s.header.pitchCorrection - 256 : s.header.pitchCorrection,
    startLoop: s.header.startLoop,
    endLoop: s.header.endLoop,
    type: s.header.type,
    link: s.header.link,
  }));
  const refOf = new Map(sf.samples.map((s, i) => [s, refs[i]!]));
  const kits = sf.presets
    .filter((p) => p.header.bank === 128 && p.header.preset <= KIT_PROGRAM_MAX)
    .sort((a, b) => a.header.preset - b.header.preset);

  const groups = new Groups();
  const renders: Render[] = [];
  for (const p of kits) {
    const preset = {
      global: zoneLike((p as unknown as { globalZone?: RawZone }).globalZone),
      zones: p.zones.map((z) => {
        const inst = z.instrument as unknown as { header: { name: string }; globalZone?: RawZone; zones: (RawZone & { sample: unknown })[] };
        return {
          ...zoneLike(z as unknown as RawZone)!,
          instrument: {
            name: inst.header.name,
            global: zoneLike(inst.globalZone),
            zones: inst.zones.map((iz) => ({ ...zoneLike(iz)!, sample: refOf.get(iz.sample as never)!, instrument: inst.header.name })),
          },
        };
      }),
    };
    for (let key = 35; key <= 81; key++) {
      // one render per distinct set of voices across the velocity range (at the top of each velocity region)
      const seen = new Set<string>();
      const regions: number[] = [];
      for (let v = 127; v >= 1; v--) {
        const sig = voicesFor(preset, key, v).map((x) => x.sample.index).join(",");
        if (!sig || seen.has(sig)) continue;
        seen.add(sig);
        regions.push(v);
      }
      const drumSamples: number[] = [];
      for (const velocity of regions) {
        const voices = voicesFor(preset, key, velocity);
        const rendered = voices.map((v) => ({ v, x: renderVoice(v, { key, velocity, holdSec: 1.5, maxSec: MAX_SEC }) })).filter((r) => r.x);
        if (!rendered.length) continue;
        const stereo = rendered.some((r) => r.v.sample.type & 6);
        const n = Math.max(...rendered.map((r) => r.x!.length));
        const channels = stereo ? [new Float32Array(n), new Float32Array(n)] : [new Float32Array(n)];
        for (const { v, x } of rendered) {
          const side = v.sample.type & 4 ? [0] : v.sample.type & 2 ? [1] : stereo ? [0, 1] : [0];
          for (const c of side) for (let i = 0; i < x!.length; i++) channels[c]![i]! += x![i]!;
        }
        // a render stopped by the length limit while still sounding gets a 50 ms fade, not a hard cut
        if (n >= Math.floor(MAX_SEC * OUTPUT_RATE)) {
          const f = Math.round(0.05 * OUTPUT_RATE);
          for (const c of channels) for (let i = 0; i < f; i++) c[n - f + i]! *= 0.5 * (1 + Math.cos((Math.PI * i) / f));
        }
        let peak = 0;
        for (const c of channels) for (let i = 0; i < n; i++) peak = Math.max(peak, Math.abs(c[i]!));
        if (peak === 0) continue;
        if (peak > 0.99) for (const c of channels) for (let i = 0; i < n; i++) c[i]! *= 0.99 / peak;
        const bytes = encodeWav(channels, { sampleRate: OUTPUT_RATE, bits: 24 });
        for (const r of rendered) {
          groups.union(r.v.sample.index, rendered[0]!.v.sample.index);
          drumSamples.push(r.v.sample.index);
        }
        renders.push({
          program: p.header.preset,
          key,
          velocity,
          voices: rendered.map((r) => ({
            sample: r.v.sample.index,
            name: sf.samples[r.v.sample.index]!.header.name,
            instrument: presetInstrumentName(preset, r.v.sample.index),
            peak: r.x!.reduce((m, y) => Math.max(m, Math.abs(y)), 0),
          })),
          channels,
          hash: sha256(bytes).slice(0, 16),
        });
      }
      // the velocity layers of one key of one kit are one drum: one group
      for (const s of drumSamples) groups.union(s, drumSamples[0]!);
    }
  }

  // edits of one recording kept as separate samples in the font (one cut shorter or faded) are one recording
  mergeEdits(renders, groups);

  if (args.has("--inspect")) {
    for (const r of renders) {
      const t = gmPercussionTruth(r.key)!;
      const dur = (r.channels[0]!.length / OUTPUT_RATE).toFixed(2);
      console.log(`${r.program}\t${r.key}\t${t.name}\tv${r.velocity}\t${dur}s\t${r.hash}\tg${groups.find(r.voices[0]!.sample)}\t${r.voices.map((v) => `${v.name}[${v.instrument}]@${v.peak.toFixed(3)}`).join(" + ")}`);
    }
    return;
  }

  // keep each distinct render once, with every place it is played
  rmSync(out, { recursive: true, force: true });
  mkdirSync(path.join(out, "wav"), { recursive: true });
  const byHash = new Map<string, CorpusItem>();
  for (const r of renders) {
    const truth = gmPercussionTruth(r.key)!;
    const labelled = truthAt(r.program, r.key, r.channels[0]!.length / OUTPUT_RATE);
    const prior = byHash.get(r.hash);
    if (prior) {
      prior.alsoAt.push({ program: r.program, key: r.key, velocity: r.velocity });
      const other = truthAt(r.program, r.key, r.channels[0]!.length / OUTPUT_RATE);
      if (!prior.excluded && (other.family !== prior.family || other.articulation !== prior.articulation)) {
        prior.excluded = `the same sound is played for ${prior.gmName} and ${gmPercussionTruth(r.key)!.name}: its label is not known`;
      }
      continue;
    }
    const kind = ELECTRONIC_PROGRAMS.has(r.program) ? "electronic" : BRUSH_PROGRAMS.has(r.program) ? "brush" : "acoustic";
    const item: CorpusItem = {
      file: `${r.hash}.wav`,
      group: `g${groups.find(r.voices[0]!.sample)}`,
      program: r.program,
      kitKind: kind,
      key: r.key,
      gmName: truth.name,
      velocity: r.velocity,
      family: labelled.family,
      articulation: labelled.articulation,
      channels: r.channels.length,
      durationSec: Math.round((r.channels[0]!.length / OUTPUT_RATE) * 1000) / 1000,
      alsoAt: [],
    };
    if (labelled.note) item.note = labelled.note;
    if (labelled.excluded) item.excluded = labelled.excluded;
    byHash.set(r.hash, item);
    writeFileSync(path.join(out, "wav", item.file), encodeWav(r.channels, { sampleRate: OUTPUT_RATE, bits: 24 }));
  }
  const items = [...byHash.values()].sort((a, b) => a.program - b.program || a.key - b.key || b.velocity - a.velocity);
  const file: CorpusFile = {
    builderVersion: CORPUS_BUILDER_VERSION,
    source: {
      package: "fluid-soundfont-gm (Debian)",
      licence: "MIT",
      file: "FluidR3_GM.sf2",
      sha256: sf2Sha,
      keyMap: "General MIDI Level 1 percussion key map (MIDI Manufacturers Association), keys 35-81, bank 128 programs 0-47",
    },
    items,
  };
  writeFileSync(labelsPath, JSON.stringify(file, null, 1));
  const used = items.filter((i) => !i.excluded);
  log(`${items.length} distinct renders (${used.length} used, ${items.length - used.length} excluded), ${new Set(used.map((i) => i.group)).size} recordings, in ${out}`);
}

/** Mono mix of the first 100 ms after the onset (first sample within 40 dB of the peak), unit energy. */
function headOf(channels: Float32Array[]): Float32Array {
  const n = channels[0]!.length;
  const mono = new Float32Array(n);
  for (const c of channels) for (let i = 0; i < n; i++) mono[i]! += c[i]!;
  let peak = 0;
  for (const x of mono) peak = Math.max(peak, Math.abs(x));
  let on = 0;
  while (on < n && Math.abs(mono[on]!) < peak / 100) on++;
  const head = mono.slice(on, on + Math.round(0.1 * OUTPUT_RATE));
  let e = 0;
  for (const x of head) e += x * x;
  const g = e > 0 ? 1 / Math.sqrt(e) : 0;
  return head.map((x) => x * g);
}

/**
 * Unites the groups of renders whose first 100 ms correlate at 0.9 or more (at a lag of up to 1 ms) within one
 * family: the font keeps some recordings twice, once trimmed or faded, under different sample names.
 */
function mergeEdits(renders: Render[], groups: Groups) {
  // a render is often played by several kits (same bytes, same hash): each head is computed, and each pair of
  // distinct renders correlated, once (the pairs of all renders, ~2,000 of them, took 7 minutes; this takes seconds)
  const headByHash = new Map<string, Float32Array>();
  for (const r of renders) if (!headByHash.has(r.hash)) headByHash.set(r.hash, headOf(r.channels));
  const lag = Math.round(0.001 * OUTPUT_RATE);
  const similar = new Map<string, boolean>();
  const isEdit = (ha: string, hb: string): boolean => {
    const k = ha < hb ? `${ha}|${hb}` : `${hb}|${ha}`;
    let known = similar.get(k);
    if (known !== undefined) return known;
    const x = headByHash.get(ha)!, y = headByHash.get(hb)!;
    let best = 0;
    for (let l = -lag; l <= lag; l++) {
      let s = 0;
      for (let i = Math.max(0, -l); i < x.length && i + l < y.length; i++) s += x[i]! * y[i + l]!;
      best = Math.max(best, s);
    }
    known = best >= 0.9;
    similar.set(k, known);
    return known;
  };
  for (let a = 0; a < renders.length; a++) {
    for (let b = a + 1; b < renders.length; b++) {
      const ra = renders[a]!, rb = renders[b]!;
      if (gmPercussionTruth(ra.key)!.family !== gmPercussionTruth(rb.key)!.family) continue;
      if (groups.find(ra.voices[0]!.sample) === groups.find(rb.voices[0]!.sample)) continue;
      if (isEdit(ra.hash, rb.hash)) groups.union(ra.voices[0]!.sample, rb.voices[0]!.sample);
    }
  }
}

function presetInstrumentName(preset: { zones: { instrument: { name: string; zones: { sample: SampleRef }[] } }[] }, sample: number): string {
  for (const z of preset.zones) if (z.instrument.zones.some((iz) => iz.sample.index === sample)) return z.instrument.name;
  return "";
}

/** The truth of a key of a kit: the GM key map, with the corrections made after looking at the data (README.md). */
function truthAt(program: number, key: number, seconds: number): Pick<CorpusItem, "family" | "articulation" | "note" | "excluded"> {
  const t = gmPercussionTruth(key)!;
  if (BRUSH_PROGRAMS.has(program) && key >= 38 && key <= 40) {
    // brush kits put brush strokes on the snare keys (39 is a brush slap here, not a clap)
    return { family: "snare", articulation: null, note: "brush stroke on a snare: family only" };
  }
  if (program === 25 && key === 44 && seconds > 1.5) {
    // this kit's pedal key plays its open-hat recording for over three seconds: whatever a pedal chick is, not this
    return { family: t.family, articulation: t.articulation, excluded: "the pedal hi-hat key plays the open-hat recording at full length" };
  }
  return { family: t.family, articulation: t.articulation };
}

main();
