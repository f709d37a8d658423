// Deterministic hostile-input generator: damaged and disguised WAV files made from valid bases.
// The bases are RIFF/WAVE files written by lib/audio's encoder (RIFF 1991 layout; WAVE_FORMAT_EXTENSIBLE);
// the damage follows the ways real files break (common practice in file-format fuzzing, no published source):
// truncation, flipped bytes, chunk sizes far beyond the file, odd sizes without the RIFF pad byte, format tags
// other than PCM/float, nested LIST chunks, zero channels, the RF64 header (EBU Tech 3306) and non-WAV bytes
// under a .wav name. Same seed, same corpus: a failure found once can be replayed by its index.
import { encodeWav } from "../../lib/audio/index";
import { mulberry32 as rng } from "@/lib/synth/rng";

/** mulberry32 (lib/synth/rng.ts): repeatable test data. */
export { mulberry32 as rng } from "@/lib/synth/rng";

export type MutationKind =
  | "valid"
  | "truncated"
  | "flipped-bytes"
  | "flipped-header"
  | "huge-chunk-size"
  | "odd-sizes"
  | "wrong-format-tag"
  | "nested-list"
  | "zero-channels"
  | "bad-fmt-fields"
  | "rf64"
  | "not-wav"
  | "chunk-storm"
  | "missing-chunk"
  | "empty";

export const MUTATION_KINDS: MutationKind[] = [
  "valid", "truncated", "flipped-bytes", "flipped-header", "huge-chunk-size", "odd-sizes", "wrong-format-tag",
  "nested-list", "zero-channels", "bad-fmt-fields", "rf64", "not-wav", "chunk-storm", "missing-chunk", "empty",
];

export interface Mutant {
  index: number;
  kind: MutationKind;
  /** A .wav name, as an uploader would send it. */
  name: string;
  bytes: Uint8Array;
}

const te = new TextEncoder();

function tone(frames: number, channels: number, seed: number): Float32Array[] {
  const r = rng(seed);
  const f = 80 + 400 * r();
  return Array.from({ length: channels }, (_, c) => {
    const x = new Float32Array(frames);
    for (let i = 0; i < frames; i++) {
      const t = i / 44100;
      x[i] = 0.6 * Math.exp(-t * 20) * Math.sin(2 * Math.PI * f * (1 + 0.01 * c) * t) + 0.05 * (r() - 0.5);
    }
    return x;
  });
}

function listChunk(depth: number, r: () => number): Uint8Array {
  // LIST <type> then sub-chunks; each level holds an INFO-style text chunk and the next LIST
  let inner: Uint8Array = new Uint8Array(0);
  for (let d = 0; d < depth; d++) {
    const text = te.encode(`level ${d} ${"x".repeat(Math.floor(r() * 9))}`);
    const tpad = text.length & 1;
    const body = new Uint8Array(4 + 8 + text.length + tpad + (d ? 8 + inner.length : 0));
    const dv = new DataView(body.buffer);
    body.set(te.encode(d % 2 ? "INFO" : "adtl"), 0);
    body.set(te.encode("INAM"), 4);
    dv.setUint32(8, text.length, true);
    body.set(text, 12);
    let p = 12 + text.length + tpad;
    if (d) {
      body.set(te.encode("LIST"), p);
      dv.setUint32(p + 4, inner.length, true);
      body.set(inner, p + 8);
    }
    inner = body;
  }
  return inner;
}

/** The valid files the mutants start from: several encodings, channel counts and extra chunks. */
export function bases(): { name: string; bytes: Uint8Array }[] {
  const r = rng(7);
  const n = 4410; // 0.1 s at 44.1 kHz: enough for every measurement, small enough for 10,000 runs
  return [
    { name: "mono16", bytes: encodeWav(tone(n, 1, 1), { sampleRate: 44100, bits: 16 }) },
    { name: "stereo24", bytes: encodeWav(tone(n, 2, 2), { sampleRate: 48000, bits: 24 }) },
    { name: "float32", bytes: encodeWav(tone(n, 2, 3), { sampleRate: 44100, bits: 32, float: true }) },
    { name: "pcm8", bytes: encodeWav(tone(n, 1, 4), { sampleRate: 22050, bits: 8 }) },
    { name: "ext24x4", bytes: encodeWav(tone(n, 4, 5), { sampleRate: 96000, bits: 24, extensible: true }) },
    { name: "float64", bytes: encodeWav(tone(n, 1, 6), { sampleRate: 48000, bits: 64, float: true }) },
    {
      name: "with-list",
      bytes: encodeWav(tone(n, 2, 8), { sampleRate: 44100, bits: 16, chunksBefore: [{ id: "LIST", data: listChunk(3, r) }], chunksAfter: [{ id: "LIST", data: listChunk(2, r) }] }),
    },
  ];
}

/** Offsets of the chunks of a RIFF file (walked leniently; stops at the first impossible size). */
export function chunkOffsets(b: Uint8Array): { id: string; at: number; size: number }[] {
  const out: { id: string; at: number; size: number }[] = [];
  const dv = new DataView(b.buffer, b.byteOffset, b.byteLength);
  let p = 12;
  while (p + 8 <= b.length && out.length < 64) {
    const id = String.fromCharCode(b[p]!, b[p + 1]!, b[p + 2]!, b[p + 3]!);
    const size = dv.getUint32(p + 4, true);
    out.push({ id, at: p, size });
    p += 8 + size + (size & 1);
  }
  return out;
}

const pick = <T,>(r: () => number, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)]!;

/** One kind of damage; a write that falls outside an already shortened file is skipped. */
export function mutateOnce(src: Uint8Array, kind: MutationKind, r: () => number): Uint8Array {
  try {
    return mutateUnsafe(src, kind, r);
  } catch (e) {
    if (e instanceof RangeError) return src.slice();
    throw e;
  }
}

function mutateUnsafe(src: Uint8Array, kind: MutationKind, r: () => number): Uint8Array {
  const b = src.slice();
  const dv = () => new DataView(b.buffer, b.byteOffset, b.byteLength);
  const chunks = chunkOffsets(b);
  const fmt = chunks.find((c) => c.id === "fmt ");
  const data = chunks.find((c) => c.id === "data");
  switch (kind) {
    case "valid":
      return b;
    case "truncated": {
      // anywhere, with extra weight on the header and the first frames
      const cut = r() < 0.5 ? Math.floor(r() * Math.min(b.length, 80)) : Math.floor(r() * b.length);
      return b.slice(0, cut);
    }
    case "flipped-bytes": {
      const n = 1 + Math.floor(r() * 32);
      for (let i = 0; i < n; i++) b[Math.floor(r() * b.length)] ^= 1 << Math.floor(r() * 8);
      return b;
    }
    case "flipped-header": {
      const n = 1 + Math.floor(r() * 6);
      const end = Math.min(b.length, (data?.at ?? 44) + 8);
      for (let i = 0; i < n; i++) b[Math.floor(r() * end)] = Math.floor(r() * 256);
      return b;
    }
    case "huge-chunk-size": {
      const target = pick(r, chunks.length ? [...chunks, { id: "RIFF", at: -4, size: 0 }] : [{ id: "RIFF", at: -4, size: 0 }]);
      const v = pick(r, [0xffffffff, 0x7fffffff, 0x80000000, b.length * 2, b.length + 1, 0xfffffff0]);
      dv().setUint32(target.at + 4 === 0 ? 4 : target.at + 4, v >>> 0, true);
      return b;
    }
    case "odd-sizes": {
      // an odd-sized chunk written without its pad byte, or a data size that splits a frame
      if (data && r() < 0.5) {
        dv().setUint32(data.at + 4, Math.max(0, data.size - 1 - Math.floor(r() * 5)) | 1, true);
        return b;
      }
      const junk = te.encode("odd".repeat(1 + Math.floor(r() * 3)).slice(0, 1 + 2 * Math.floor(r() * 4)));
      const at = data?.at ?? 12;
      const ins = new Uint8Array(8 + junk.length);
      ins.set(te.encode("junk"), 0);
      new DataView(ins.buffer).setUint32(4, junk.length, true);
      ins.set(junk, 8);
      const out = new Uint8Array(b.length + ins.length);
      out.set(b.subarray(0, at), 0);
      out.set(ins, at);
      out.set(b.subarray(at), at + ins.length);
      new DataView(out.buffer).setUint32(4, out.length - 8, true);
      return out;
    }
    case "wrong-format-tag": {
      if (!fmt) return b;
      dv().setUint16(fmt.at + 8, pick(r, [0, 2, 6, 7, 0x11, 0x50, 0x55, 0x161, 0xfffe, 0xffff, Math.floor(r() * 65536)]), true);
      return b;
    }
    case "nested-list": {
      // deep or self-inconsistent LIST nesting before the data chunk
      const depth = 1 + Math.floor(r() * 40);
      const body = listChunk(depth, r);
      if (r() < 0.4 && body.length > 20) new DataView(body.buffer).setUint32(16 + Math.floor(r() * 4), Math.floor(r() * 0xffffffff), true);
      const at = data?.at ?? b.length;
      const ins = new Uint8Array(8 + body.length + (body.length & 1));
      ins.set(te.encode("LIST"), 0);
      new DataView(ins.buffer).setUint32(4, r() < 0.2 ? body.length + 1000 : body.length, true);
      ins.set(body, 8);
      const out = new Uint8Array(b.length + ins.length);
      out.set(b.subarray(0, at), 0);
      out.set(ins, at);
      out.set(b.subarray(at), at + ins.length);
      new DataView(out.buffer).setUint32(4, out.length - 8, true);
      return out;
    }
    case "zero-channels":
      if (fmt) dv().setUint16(fmt.at + 10, 0, true);
      return b;
    case "bad-fmt-fields": {
      if (!fmt) return b;
      const field = pick(r, ["rate", "rate0", "align", "bits", "byterate", "channels", "fmtsize"] as const);
      const d = dv();
      if (field === "rate") d.setUint32(fmt.at + 12, pick(r, [1, 7999, 192001, 0xffffffff, 384000]), true);
      else if (field === "rate0") d.setUint32(fmt.at + 12, 0, true);
      else if (field === "align") d.setUint16(fmt.at + 20, pick(r, [0, 1, 3, 0xffff]), true);
      else if (field === "bits") d.setUint16(fmt.at + 22, pick(r, [0, 1, 7, 12, 20, 48, 0xffff]), true);
      else if (field === "byterate") d.setUint32(fmt.at + 16, Math.floor(r() * 0xffffffff), true);
      else if (field === "channels") d.setUint16(fmt.at + 10, pick(r, [9, 64, 255, 0xffff]), true);
      else d.setUint32(fmt.at + 4, pick(r, [0, 2, 14, 15, 17, 1000]), true);
      return b;
    }
    case "rf64": {
      b.set(te.encode(r() < 0.5 ? "RF64" : "BW64"), 0);
      dv().setUint32(4, 0xffffffff, true);
      return b;
    }
    case "not-wav": {
      const k = Math.floor(r() * 6);
      if (k === 0) return te.encode(`<!doctype html><script>alert(${Math.floor(r() * 1e6)})</script>`);
      if (k === 1) return Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...Array.from({ length: 64 }, () => Math.floor(r() * 256))]); // PNG signature
      if (k === 2) return Uint8Array.from([0x49, 0x44, 0x33, 4, 0, 0, 0, 0, 0, 10, ...Array.from({ length: 200 }, () => Math.floor(r() * 256))]); // ID3v2 (MP3)
      if (k === 3) return Uint8Array.from([0x50, 0x4b, 0x03, 0x04, ...Array.from({ length: 60 }, () => Math.floor(r() * 256))]); // zip local header
      if (k === 4) return Uint8Array.from(Array.from({ length: 1 + Math.floor(r() * 4000) }, () => Math.floor(r() * 256)));
      b.set(te.encode("RIFX"), 0); // big-endian RIFF
      return b;
    }
    case "chunk-storm": {
      // thousands of tiny (or zero-size) chunks before the data chunk: the chunk walk must stay linear
      const n = 500 + Math.floor(r() * 5000);
      const at = data?.at ?? b.length;
      const ins = new Uint8Array(n * 8);
      for (let i = 0; i < n; i++) ins.set(te.encode(pick(r, ["junk", "LIST", "PAD ", "\0\0\0\0"])), i * 8);
      const out = new Uint8Array(b.length + ins.length);
      out.set(b.subarray(0, at), 0);
      out.set(ins, at);
      out.set(b.subarray(at), at + ins.length);
      new DataView(out.buffer).setUint32(4, out.length - 8, true);
      return out;
    }
    case "missing-chunk": {
      const victim = pick(r, [fmt, data].filter(Boolean) as { at: number; size: number }[]);
      if (!victim) return b;
      if (r() < 0.5) {
        b.set(te.encode("zzzz"), victim.at); // renamed: the reader must not find it
        return b;
      }
      const end = Math.min(b.length, victim.at + 8 + victim.size + (victim.size & 1));
      const out = new Uint8Array(b.length - (end - victim.at));
      out.set(b.subarray(0, victim.at), 0);
      out.set(b.subarray(end), victim.at);
      new DataView(out.buffer).setUint32(4, Math.max(0, out.length - 8), true);
      return out;
    }
    case "empty":
      return new Uint8Array(r() < 0.5 ? 0 : 12);
  }
}

/**
 * Mutant number `index` of the corpus for `seed`: a base file and one to three kinds of damage (the first
 * kind names it). Index 0..N-1 cycles through the kinds so every kind is well represented.
 */
export function mutant(index: number, seed = 1, basesList = bases()): Mutant {
  const r = rng(seed * 1_000_003 + index);
  const kind = MUTATION_KINDS[index % MUTATION_KINDS.length]!;
  const base = basesList[Math.floor(r() * basesList.length)]!;
  let bytes = mutateOnce(base.bytes, kind, r);
  if (kind !== "valid" && kind !== "empty" && r() < 0.3) {
    const extra = pick(r, MUTATION_KINDS.filter((k) => k !== "valid" && k !== "empty" && k !== "not-wav"));
    bytes = mutateOnce(bytes, extra, r);
  }
  return { index, kind, name: `hostile-${String(index).padStart(5, "0")}-${kind}-${base.name}.wav`, bytes };
}

export function* corpus(count: number, seed = 1): Generator<Mutant> {
  const b = bases();
  for (let i = 0; i < count; i++) yield mutant(i, seed, b);
}
