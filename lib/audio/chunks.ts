// Over 300 lines: the bounded chunk walk and one small reader per chunk, all sharing the walk's bounds.
// RIFF chunk walking and the readers for the chunks a WAV one-shot carries beside its samples:
// 'fmt ' (RIFF WAVE 1991 / WAVE_FORMAT_EXTENSIBLE), LIST/INFO tags (RIFF 1991), 'bext' (EBU Tech 3285,
// including the v2 loudness fields), 'smpl' and 'inst' (RIFF sampler / instrument chunks) and 'cue '
// points with their LIST/adtl labels. Every loop is bounded by the bytes it reads from, so a crafted file
// can neither hang nor read out of range.

export interface ChunkRef {
  id: string;
  offset: number; // offset of the chunk header (id) in the file
  dataStart: number; // offset of the chunk body
  size: number; // size the header claims
  available: number; // body bytes actually present in the file (< size when truncated)
}

export interface FmtChunk {
  formatTag: number;
  channels: number;
  sampleRate: number;
  byteRate: number;
  blockAlign: number;
  bitsPerSample: number;
  cbSize: number;
  validBits: number; // = bitsPerSample unless the extensible header says otherwise
  channelMask: number; // 0 when absent
  subFormatTag: number | null; // first 2 bytes of the SubFormat GUID for extensible headers
  subFormatGuidOk: boolean; // the remaining 14 bytes are the standard KSDATAFORMAT suffix
}

export interface BextChunk {
  description: string;
  originator: string;
  originatorReference: string;
  originationDate: string;
  originationTime: string;
  timeReference: number; // samples since midnight (uint64, exact up to 2^53)
  version: number;
  umid: string; // hex of the 64 UMID bytes, "" when all zero
  // Version 2 loudness fields (EBU Tech 3285 v2; stored x100 as int16); null when version < 2.
  loudnessValue: number | null;
  loudnessRange: number | null;
  maxTruePeakLevel: number | null;
  maxMomentaryLoudness: number | null;
  maxShortTermLoudness: number | null;
  codingHistory: string;
}

export interface SmplLoop {
  cuePointId: number;
  type: number; // 0 forward, 1 alternating, 2 backward
  start: number;
  end: number;
  fraction: number;
  playCount: number;
}

export interface SmplChunk {
  manufacturer: number;
  product: number;
  samplePeriodNs: number;
  unityNote: number;
  pitchFraction: number; // raw uint32; 0x80000000 = half a semitone
  pitchFractionCents: number; // the same in cents
  smpteFormat: number;
  smpteOffset: number;
  loops: SmplLoop[];
  samplerDataSize: number;
}

export interface InstChunk {
  unshiftedNote: number;
  fineTuneCents: number;
  gainDb: number;
  lowNote: number;
  highNote: number;
  lowVelocity: number;
  highVelocity: number;
}

export interface CuePoint {
  id: number;
  position: number;
  dataChunkId: string;
  chunkStart: number;
  blockStart: number;
  sampleOffset: number;
  label: string | null;
}

export interface WavMetadata {
  info: Record<string, string>; // LIST/INFO tags by their four-letter id (INAM, IART, ICMT ...)
  bext: BextChunk | null;
  smpl: SmplChunk | null;
  inst: InstChunk | null;
  cuePoints: CuePoint[];
  chunks: { id: string; size: number }[]; // every top-level chunk in file order
}

/** Hard bound on how many chunks we index; a real file has a handful. */
export const MAX_CHUNKS = 4096;

export function fourcc(b: Uint8Array, at: number): string {
  if (at + 4 > b.length) return "";
  return String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);
}

export function u16(b: Uint8Array, at: number): number {
  return b[at] | (b[at + 1] << 8);
}
export function i16(b: Uint8Array, at: number): number {
  const v = u16(b, at);
  return v >= 0x8000 ? v - 0x10000 : v;
}
export function u32(b: Uint8Array, at: number): number {
  return (b[at] | (b[at + 1] << 8) | (b[at + 2] << 16) | (b[at + 3] << 24)) >>> 0;
}
function i8(v: number): number {
  return v >= 0x80 ? v - 0x100 : v;
}

/** A fixed-length or NUL-terminated text field: UTF-8 when valid, else Latin-1; trimmed. */
export function readText(b: Uint8Array, start: number, length: number): string {
  const end = Math.min(b.length, start + Math.max(0, length));
  let stop = start;
  while (stop < end && b[stop] !== 0) stop++;
  const bytes = b.subarray(Math.min(start, end), stop);
  let s: string;
  try {
    s = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    s = "";
    for (let i = 0; i < bytes.length; i++) s += String.fromCharCode(bytes[i]);
  }
  return s.trim();
}

/**
 * Index the chunks of a RIFF body from `start` to the end of the bytes. Sizes are trusted only as far as the
 * file goes: a chunk that runs past the end is recorded with the bytes that are there and ends the walk.
 */
export function walkChunks(b: Uint8Array, start = 12, end = b.length): ChunkRef[] {
  const out: ChunkRef[] = [];
  let at = start;
  while (at + 8 <= end && out.length < MAX_CHUNKS) {
    const id = fourcc(b, at);
    const size = u32(b, at + 4);
    const dataStart = at + 8;
    const available = Math.max(0, Math.min(size, end - dataStart));
    out.push({ id, offset: at, dataStart, size, available });
    if (available < size) break; // runs past the end: nothing can follow
    at = dataStart + size + (size & 1); // odd chunks carry a pad byte
  }
  return out;
}

export function readFmt(b: Uint8Array, c: ChunkRef): FmtChunk | null {
  if (c.available < 16) return null;
  const p = c.dataStart;
  const fmt: FmtChunk = {
    formatTag: u16(b, p),
    channels: u16(b, p + 2),
    sampleRate: u32(b, p + 4),
    byteRate: u32(b, p + 8),
    blockAlign: u16(b, p + 12),
    bitsPerSample: u16(b, p + 14),
    cbSize: 0,
    validBits: u16(b, p + 14),
    channelMask: 0,
    subFormatTag: null,
    subFormatGuidOk: false,
  };
  if (c.available >= 18) fmt.cbSize = u16(b, p + 16);
  if (fmt.formatTag === 0xfffe && c.available >= 40 && fmt.cbSize >= 22) {
    const vb = u16(b, p + 18);
    fmt.validBits = vb === 0 ? fmt.bitsPerSample : vb;
    fmt.channelMask = u32(b, p + 20);
    fmt.subFormatTag = u16(b, p + 24);
    // KSDATAFORMAT_SUBTYPE_* = xxxxxxxx-0000-0010-8000-00aa00389b71 (bytes 2..15 of the GUID)
    const suffix = [0x00, 0x00, 0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71];
    fmt.subFormatGuidOk = suffix.every((v, i) => b[p + 26 + i] === v);
  }
  return fmt;
}

export function readBext(b: Uint8Array, c: ChunkRef): BextChunk | null {
  if (c.available < 348) return null; // not even the version field
  const p = c.dataStart;
  const version = u16(b, p + 346);
  let umid = "";
  if (c.available >= 412) {
    let any = false;
    for (let i = 0; i < 64; i++) {
      const v = b[p + 348 + i];
      if (v !== 0) any = true;
      umid += v.toString(16).padStart(2, "0");
    }
    if (!any) umid = "";
  }
  const hasLoudness = version >= 2 && c.available >= 422;
  const loud = (off: number): number | null => (hasLoudness ? i16(b, p + off) / 100 : null);
  return {
    description: readText(b, p, 256),
    originator: readText(b, p + 256, 32),
    originatorReference: readText(b, p + 288, 32),
    originationDate: readText(b, p + 320, 10),
    originationTime: readText(b, p + 330, 8),
    timeReference: u32(b, p + 338) + u32(b, p + 342) * 2 ** 32,
    version,
    umid,
    loudnessValue: loud(412),
    loudnessRange: loud(414),
    maxTruePeakLevel: loud(416),
    maxMomentaryLoudness: loud(418),
    maxShortTermLoudness: loud(420),
    codingHistory: c.available > 602 ? readText(b, p + 602, c.available - 602) : "",
  };
}

export function readSmpl(b: Uint8Array, c: ChunkRef): SmplChunk | null {
  if (c.available < 36) return null;
  const p = c.dataStart;
  const declared = u32(b, p + 28);
  const fits = Math.floor((c.available - 36) / 24);
  const loops: SmplLoop[] = [];
  for (let i = 0; i < Math.min(declared, fits); i++) {
    const q = p + 36 + i * 24;
    loops.push({
      cuePointId: u32(b, q),
      type: u32(b, q + 4),
      start: u32(b, q + 8),
      end: u32(b, q + 12),
      fraction: u32(b, q + 16),
      playCount: u32(b, q + 20),
    });
  }
  const pitchFraction = u32(b, p + 16);
  return {
    manufacturer: u32(b, p),
    product: u32(b, p + 4),
    samplePeriodNs: u32(b, p + 8),
    unityNote: u32(b, p + 12),
    pitchFraction,
    pitchFractionCents: (pitchFraction / 2 ** 32) * 100,
    smpteFormat: u32(b, p + 20),
    smpteOffset: u32(b, p + 24),
    loops,
    samplerDataSize: u32(b, p + 32),
  };
}

export function readInst(b: Uint8Array, c: ChunkRef): InstChunk | null {
  if (c.available < 7) return null;
  const p = c.dataStart;
  return {
    unshiftedNote: b[p],
    fineTuneCents: i8(b[p + 1]),
    gainDb: i8(b[p + 2]),
    lowNote: b[p + 3],
    highNote: b[p + 4],
    lowVelocity: b[p + 5],
    highVelocity: b[p + 6],
  };
}

export function readCue(b: Uint8Array, c: ChunkRef): CuePoint[] {
  if (c.available < 4) return [];
  const p = c.dataStart;
  const n = Math.min(u32(b, p), Math.floor((c.available - 4) / 24));
  const out: CuePoint[] = [];
  for (let i = 0; i < n; i++) {
    const q = p + 4 + i * 24;
    out.push({
      id: u32(b, q),
      position: u32(b, q + 4),
      dataChunkId: fourcc(b, q + 8),
      chunkStart: u32(b, q + 12),
      blockStart: u32(b, q + 16),
      sampleOffset: u32(b, q + 20),
      label: null,
    });
  }
  return out;
}

/** LIST chunk: 'INFO' text tags, or 'adtl' labels (cue id -> text). */
export function readList(b: Uint8Array, c: ChunkRef): { type: string; info: Record<string, string>; labels: Map<number, string> } {
  const info: Record<string, string> = {};
  const labels = new Map<number, string>();
  if (c.available < 4) return { type: "", info, labels };
  const type = fourcc(b, c.dataStart);
  for (const sub of walkChunks(b, c.dataStart + 4, c.dataStart + c.available)) {
    if (type === "INFO") info[sub.id.trim()] = readText(b, sub.dataStart, sub.available);
    else if (type === "adtl" && sub.id === "labl" && sub.available >= 4) {
      labels.set(u32(b, sub.dataStart), readText(b, sub.dataStart + 4, sub.available - 4));
    }
  }
  return { type, info, labels };
}

/** Everything but the samples, from an already indexed chunk list. */
export function readMetadata(b: Uint8Array, chunks: ChunkRef[]): WavMetadata {
  const meta: WavMetadata = { info: {}, bext: null, smpl: null, inst: null, cuePoints: [], chunks: [] };
  const labels = new Map<number, string>();
  for (const c of chunks) {
    meta.chunks.push({ id: c.id, size: c.size });
    switch (c.id) {
      case "bext":
        meta.bext ??= readBext(b, c);
        break;
      case "smpl":
        meta.smpl ??= readSmpl(b, c);
        break;
      case "inst":
        meta.inst ??= readInst(b, c);
        break;
      case "cue ":
        if (meta.cuePoints.length === 0) meta.cuePoints = readCue(b, c);
        break;
      case "LIST": {
        const l = readList(b, c);
        Object.assign(meta.info, l.info);
        for (const [k, v] of l.labels) labels.set(k, v);
        break;
      }
    }
  }
  for (const p of meta.cuePoints) p.label = labels.get(p.id) ?? null;
  return meta;
}
