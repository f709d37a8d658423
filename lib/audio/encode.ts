// Write a RIFF/WAVE file (RIFF 1991 canonical layout; WAVE_FORMAT_EXTENSIBLE on request) from float
// channels: PCM 8 (unsigned), 16, 24, 32-bit, IEEE float 32 and 64-bit. Used by the tests, the demo
// generator and the benchmark; extra chunks (bext, smpl, LIST ...) can be placed before the data chunk.

export interface EncodeOptions {
  sampleRate: number;
  bits: 8 | 16 | 24 | 32 | 64;
  float?: boolean; // IEEE float (bits 32 or 64)
  extensible?: boolean; // write a WAVE_FORMAT_EXTENSIBLE fmt chunk
  validBits?: number; // extensible only
  channelMask?: number; // extensible only
  chunksBefore?: { id: string; data: Uint8Array }[];
  chunksAfter?: { id: string; data: Uint8Array }[];
}

function ascii(out: Uint8Array, at: number, s: string): void {
  for (let i = 0; i < 4; i++) out[at + i] = s.charCodeAt(i) & 0xff;
}

/** Quantise one float to a signed integer code of `bits` bits (round to nearest, clamp). */
export function quantize(x: number, bits: number): number {
  const scale = 2 ** (bits - 1);
  const v = Math.round(x * scale);
  return v > scale - 1 ? scale - 1 : v < -scale ? -scale : v;
}

export function encodeWav(channels: ArrayLike<number>[], opts: EncodeOptions): Uint8Array {
  const nch = channels.length;
  const frames = nch ? channels[0].length : 0;
  const isFloat = !!opts.float;
  const bits = opts.bits;
  if (isFloat ? bits !== 32 && bits !== 64 : ![8, 16, 24, 32].includes(bits)) throw new Error(`cannot encode ${bits}-bit ${isFloat ? "float" : "PCM"}`);
  const bps = bits / 8;
  const blockAlign = nch * bps;
  const dataBytes = frames * blockAlign;
  const ext = !!opts.extensible;
  const fmtSize = ext ? 40 : isFloat ? 18 : 16;
  const chunk = (c: { data: Uint8Array }) => 8 + c.data.length + (c.data.length & 1);
  const before = (opts.chunksBefore ?? []).reduce((s, c) => s + chunk(c), 0);
  const after = (opts.chunksAfter ?? []).reduce((s, c) => s + chunk(c), 0);
  const total = 12 + 8 + fmtSize + before + 8 + dataBytes + (dataBytes & 1) + after;
  const out = new Uint8Array(total);
  const dv = new DataView(out.buffer);
  ascii(out, 0, "RIFF");
  dv.setUint32(4, total - 8, true);
  ascii(out, 8, "WAVE");
  let p = 12;
  ascii(out, p, "fmt ");
  dv.setUint32(p + 4, fmtSize, true);
  const tag = ext ? 0xfffe : isFloat ? 3 : 1;
  dv.setUint16(p + 8, tag, true);
  dv.setUint16(p + 10, nch, true);
  dv.setUint32(p + 12, opts.sampleRate, true);
  dv.setUint32(p + 16, opts.sampleRate * blockAlign, true);
  dv.setUint16(p + 20, blockAlign, true);
  dv.setUint16(p + 22, bits, true);
  if (fmtSize >= 18) dv.setUint16(p + 24, ext ? 22 : 0, true);
  if (ext) {
    dv.setUint16(p + 26, opts.validBits ?? bits, true);
    dv.setUint32(p + 28, opts.channelMask ?? (nch === 1 ? 0x4 : nch === 2 ? 0x3 : 0), true);
    // SubFormat GUID xxxxxxxx-0000-0010-8000-00aa00389b71
    dv.setUint32(p + 32, isFloat ? 3 : 1, true);
    out.set([0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71], p + 36);
  }
  p += 8 + fmtSize;
  const put = (c: { id: string; data: Uint8Array }) => {
    ascii(out, p, c.id);
    dv.setUint32(p + 4, c.data.length, true);
    out.set(c.data, p + 8);
    p += chunk(c);
  };
  for (const c of opts.chunksBefore ?? []) put(c);
  ascii(out, p, "data");
  dv.setUint32(p + 4, dataBytes, true);
  p += 8;
  for (let i = 0; i < frames; i++) {
    for (let c = 0; c < nch; c++) {
      const x = channels[c][i];
      if (isFloat && bits === 32) dv.setFloat32(p, x, true);
      else if (isFloat) dv.setFloat64(p, x, true);
      else if (bits === 8) out[p] = quantize(x, 8) + 128;
      else if (bits === 16) dv.setInt16(p, quantize(x, 16), true);
      else if (bits === 24) {
        const v = quantize(x, 24);
        out[p] = v & 0xff;
        out[p + 1] = (v >> 8) & 0xff;
        out[p + 2] = (v >> 16) & 0xff;
      } else dv.setInt32(p, quantize(x, 32), true);
      p += bps;
    }
  }
  p += dataBytes & 1;
  for (const c of opts.chunksAfter ?? []) put(c);
  return out;
}

/** Build a chunk body from little-endian fields, for tests and the demo generator. */
export function littleEndian(fields: ({ u8: number } | { u16: number } | { u32: number } | { i16: number } | { text: string; size: number })[]): Uint8Array {
  const size = fields.reduce((s, f) => s + ("u8" in f ? 1 : "u16" in f || "i16" in f ? 2 : "u32" in f ? 4 : f.size), 0);
  const out = new Uint8Array(size);
  const dv = new DataView(out.buffer);
  let p = 0;
  for (const f of fields) {
    if ("u8" in f) out[p++] = f.u8 & 0xff;
    else if ("u16" in f) (dv.setUint16(p, f.u16, true), (p += 2));
    else if ("i16" in f) (dv.setInt16(p, f.i16, true), (p += 2));
    else if ("u32" in f) (dv.setUint32(p, f.u32 >>> 0, true), (p += 4));
    else {
      for (let i = 0; i < f.size && i < f.text.length; i++) out[p + i] = f.text.charCodeAt(i) & 0xff;
      p += f.size;
    }
  }
  return out;
}
