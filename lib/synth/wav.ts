// WAV writer for generated one-shots: the canonical 44-byte RIFF/WAVE header (Microsoft/IBM RIFF 1991)
// followed by interleaved little-endian samples. 16/24-bit two's-complement PCM (format tag 1) or 32-bit IEEE
// float (format tag 3). Pure TypeScript; returns bytes, writes nothing.

export type WavBits = 16 | 24 | 32;

export interface WavOptions {
  sampleRate: number;
  /** 16 or 24 = PCM; 32 = IEEE float */
  bits: WavBits;
}

/** Converts a float in [-1, 1] to a PCM integer of `bits` bits (rounded, clamped to the full-scale codes). */
export function floatToPcm(x: number, bits: 16 | 24): number {
  const full = bits === 16 ? 32768 : 8388608;
  let v = Math.round(x * full);
  if (v > full - 1) v = full - 1;
  if (v < -full) v = -full;
  return v;
}

export function encodeWav(channels: readonly Float32Array[], opts: WavOptions): Uint8Array {
  const nch = channels.length;
  if (nch < 1 || nch > 8) throw new RangeError(`channel count must be 1-8, got ${nch}`);
  const frames = channels[0].length;
  for (const c of channels) if (c.length !== frames) throw new RangeError("all channels must have the same length");
  const { sampleRate, bits } = opts;
  if (!Number.isInteger(sampleRate) || sampleRate < 1) throw new RangeError(`bad sample rate: ${sampleRate}`);
  if (bits !== 16 && bits !== 24 && bits !== 32) throw new RangeError(`bits must be 16, 24 or 32, got ${bits}`);
  const bytesPer = bits / 8;
  const blockAlign = nch * bytesPer;
  const dataBytes = frames * blockAlign;
  const pad = dataBytes & 1;
  const buf = new Uint8Array(44 + dataBytes + pad);
  const dv = new DataView(buf.buffer);
  const ascii = (off: number, s: string) => { for (let i = 0; i < 4; i++) buf[off + i] = s.charCodeAt(i); };
  ascii(0, "RIFF");
  dv.setUint32(4, 36 + dataBytes + pad, true);
  ascii(8, "WAVE");
  ascii(12, "fmt ");
  dv.setUint32(16, 16, true);
  dv.setUint16(20, bits === 32 ? 3 : 1, true);
  dv.setUint16(22, nch, true);
  dv.setUint32(24, sampleRate, true);
  dv.setUint32(28, sampleRate * blockAlign, true);
  dv.setUint16(32, blockAlign, true);
  dv.setUint16(34, bits, true);
  ascii(36, "data");
  dv.setUint32(40, dataBytes, true);
  let o = 44;
  if (bits === 32) {
    for (let i = 0; i < frames; i++) for (let c = 0; c < nch; c++, o += 4) dv.setFloat32(o, channels[c][i], true);
  } else if (bits === 16) {
    for (let i = 0; i < frames; i++) for (let c = 0; c < nch; c++, o += 2) dv.setInt16(o, floatToPcm(channels[c][i], 16), true);
  } else {
    for (let i = 0; i < frames; i++) {
      for (let c = 0; c < nch; c++, o += 3) {
        const v = floatToPcm(channels[c][i], 24);
        buf[o] = v & 0xff;
        buf[o + 1] = (v >> 8) & 0xff;
        buf[o + 2] = (v >> 16) & 0xff;
      }
    }
  }
  return buf;
}
