// Decode a RIFF/WAVE one-shot (RIFF 1991 layout; WAVE_FORMAT_EXTENSIBLE; Broadcast Wave EBU Tech 3285
// metadata) into float channels in [-1, 1], or refuse it with a specific reason (WavRefusal).
//
// Why our own header reader and sample conversion rather than running wavefile on every upload: wavefile's
// chunk index recurses from every LIST chunk to the end of the file (time doubles with each extra LIST chunk,
// so a crafted file can hang a worker), it throws generic errors we could not turn into specific refusals,
// and its float conversion (toBitDepth) is much slower than a typed loop. wavefile stays the
// reference: the tests decode every format with wavefile and with this reader and require identical samples
// (decode.test.ts, the property test), and `crossCheckWithWavefile` (wavefile-check.ts) is used by the CLI.
// Samples are read little-endian, as the RIFF spec stores them.
import type { WavFormat } from "./types";
import { WavRefusal } from "./refusal";
import { readFmt, readMetadata, u32, walkChunks, type FmtChunk, type WavMetadata } from "./chunks";
import { sniffWav } from "./sniff";

export interface DecodeOptions {
  /** Longest accepted one-shot in seconds (default 60). */
  maxSeconds?: number;
  /** A data chunk missing at most this fraction of the bytes it claims is decoded and flagged (default 0.1). */
  maxMissingFraction?: number;
}

export interface DecodedWav {
  format: WavFormat;
  /** One Float32Array per channel. PCM maps to [-1, 1); float files keep their stored values (see warnings). */
  channels: Float32Array[];
  metadata: WavMetadata;
  /** The data chunk is shorter than its header claims; what was there is decoded. */
  truncated: boolean;
  missingBytes: number;
  /** Smallest positive value that counts as full scale (the top code for PCM, 1.0 for float). */
  clipLevel: number;
  /** dwChannelMask of an extensible header, 0 otherwise. */
  channelMask: number;
  warnings: string[];
}

export const DEFAULT_MAX_SECONDS = 60;
export const DEFAULT_MAX_MISSING_FRACTION = 0.1;

const COMPRESSED_NAMES: Record<number, string> = {
  0x0002: "Microsoft ADPCM",
  0x0006: "A-law",
  0x0007: "mu-law",
  0x0011: "IMA ADPCM",
  0x0022: "TrueSpeech",
  0x0031: "GSM 6.10",
  0x0040: "G.721 ADPCM",
  0x0050: "MPEG audio",
  0x0055: "MPEG layer 3",
  0x0092: "AC-3",
  0x0161: "Windows Media Audio",
  0x00ff: "AAC",
  0x1610: "AAC (HE)",
  0x2000: "AC-3",
  0xf1ac: "FLAC",
};

function tagName(tag: number): string {
  const hex = "0x" + tag.toString(16).padStart(4, "0");
  return COMPRESSED_NAMES[tag] ? `${COMPRESSED_NAMES[tag]} (format tag ${hex})` : `format tag ${hex}`;
}

function magicName(m: string): string {
  const known: Record<string, string> = { "ID3\u0003": "an MP3 file", fLaC: "a FLAC file", OggS: "an Ogg file", FORM: "an AIFF/IFF file" };
  if (known[m]) return known[m];
  if (m.startsWith("ID3")) return "an MP3 file";
  const printable = /^[\x20-\x7e]{4}$/.test(m);
  return printable ? `a file starting with "${m}"` : "a file with no RIFF signature";
}

function validateFormat(fmt: FmtChunk): { encoding: "pcm" | "float" } {
  let tag = fmt.formatTag;
  if (tag === 0xfffe) {
    if (fmt.subFormatTag === null) throw new WavRefusal("bad-header", `extensible fmt chunk is too short (cbSize ${fmt.cbSize}, need 22)`);
    if (fmt.subFormatTag !== 1 && fmt.subFormatTag !== 3) throw new WavRefusal("compressed", `compressed audio is not supported: extensible SubFormat ${tagName(fmt.subFormatTag)}`);
    if (!fmt.subFormatGuidOk) throw new WavRefusal("compressed", "extensible SubFormat GUID is not a standard PCM or IEEE float GUID");
    tag = fmt.subFormatTag;
  }
  if (tag !== 1 && tag !== 3) throw new WavRefusal("compressed", `compressed audio is not supported: ${tagName(tag)}`);
  const encoding = tag === 3 ? "float" : "pcm";
  if (fmt.channels === 0) throw new WavRefusal("bad-header", "fmt chunk says 0 channels");
  if (fmt.sampleRate === 0) throw new WavRefusal("bad-header", "fmt chunk says 0 Hz sample rate");
  const okBits = encoding === "float" ? [32, 64] : [8, 16, 24, 32];
  if (!okBits.includes(fmt.bitsPerSample)) {
    throw new WavRefusal("bad-header", `${fmt.bitsPerSample}-bit ${encoding === "float" ? "IEEE float" : "PCM"} is not a valid sample size (expected ${okBits.join(", ")})`);
  }
  if (fmt.validBits > fmt.bitsPerSample) throw new WavRefusal("bad-header", `valid bits ${fmt.validBits} exceed the ${fmt.bitsPerSample}-bit container`);
  const expectAlign = (fmt.channels * fmt.bitsPerSample) / 8;
  if (fmt.blockAlign !== expectAlign) {
    throw new WavRefusal("bad-header", `block align ${fmt.blockAlign} does not match ${fmt.channels} channel(s) x ${fmt.bitsPerSample} bits (expected ${expectAlign})`);
  }
  const expectRate = fmt.sampleRate * fmt.blockAlign;
  if (fmt.byteRate !== expectRate) {
    throw new WavRefusal("bad-header", `byte rate ${fmt.byteRate} does not match ${fmt.sampleRate} Hz x block align ${fmt.blockAlign} (expected ${expectRate})`);
  }
  if (fmt.channels > 8) throw new WavRefusal("unsupported", `${fmt.channels} channels; one-shots with 1 to 8 channels are supported`);
  if (fmt.sampleRate < 8000 || fmt.sampleRate > 192000) throw new WavRefusal("unsupported", `sample rate ${fmt.sampleRate} Hz is outside 8 kHz to 192 kHz`);
  return { encoding };
}

/** Convert interleaved little-endian samples to one Float32Array per channel. */
export function deinterleave(bytes: Uint8Array, start: number, frames: number, channels: number, bits: number, encoding: "pcm" | "float"): Float32Array[] {
  const out: Float32Array[] = [];
  for (let c = 0; c < channels; c++) out.push(new Float32Array(frames));
  const n = frames * channels;
  const bps = bits / 8;
  const abs = bytes.byteOffset + start;
  // Typed views need aligned offsets; copy the data once when they are not.
  const view = (size: number): ArrayBuffer | null => (abs % size === 0 ? (bytes.buffer as ArrayBuffer) : null);
  const src = (size: number): { buf: ArrayBuffer; off: number } => {
    const b = view(size);
    if (b) return { buf: b, off: abs };
    const copy = bytes.slice(start, start + n * bps);
    return { buf: copy.buffer, off: 0 };
  };
  if (encoding === "pcm" && bits === 8) {
    for (let c = 0; c < channels; c++) {
      const o = out[c];
      for (let i = 0, p = start + c; i < frames; i++, p += channels) o[i] = (bytes[p] - 128) / 128;
    }
  } else if (encoding === "pcm" && bits === 16) {
    const { buf, off } = src(2);
    const s = new Int16Array(buf, off, n);
    for (let c = 0; c < channels; c++) {
      const o = out[c];
      for (let i = 0, p = c; i < frames; i++, p += channels) o[i] = s[p] / 32768;
    }
  } else if (encoding === "pcm" && bits === 24) {
    const stride = 3 * channels;
    for (let c = 0; c < channels; c++) {
      const o = out[c];
      for (let i = 0, p = start + 3 * c; i < frames; i++, p += stride) {
        const v = (bytes[p] << 8) | (bytes[p + 1] << 16) | (bytes[p + 2] << 24); // sign lands in bit 31
        o[i] = (v >> 8) / 8388608;
      }
    }
  } else if (encoding === "pcm" && bits === 32) {
    const { buf, off } = src(4);
    const s = new Int32Array(buf, off, n);
    for (let c = 0; c < channels; c++) {
      const o = out[c];
      for (let i = 0, p = c; i < frames; i++, p += channels) o[i] = s[p] / 2147483648;
    }
  } else if (encoding === "float" && bits === 32) {
    const { buf, off } = src(4);
    const s = new Float32Array(buf, off, n);
    for (let c = 0; c < channels; c++) {
      const o = out[c];
      for (let i = 0, p = c; i < frames; i++, p += channels) o[i] = s[p];
    }
  } else if (encoding === "float" && bits === 64) {
    const { buf, off } = src(8);
    const s = new Float64Array(buf, off, n);
    for (let c = 0; c < channels; c++) {
      const o = out[c];
      for (let i = 0, p = c; i < frames; i++, p += channels) o[i] = s[p];
    }
  } else {
    throw new WavRefusal("bad-header", `cannot decode ${bits}-bit ${encoding}`);
  }
  return out;
}

export function decodeWav(bytes: Uint8Array, opts: DecodeOptions = {}): DecodedWav {
  const maxSeconds = opts.maxSeconds ?? DEFAULT_MAX_SECONDS;
  const maxMissing = opts.maxMissingFraction ?? DEFAULT_MAX_MISSING_FRACTION;
  const warnings: string[] = [];
  if (bytes.length < 12) throw new WavRefusal("not-riff", `file is ${bytes.length} bytes, too short for a RIFF/WAVE header (12 bytes)`);
  const kind = sniffWav(bytes);
  if (kind.kind === "rf64") throw new WavRefusal("rf64", `${kind.magic} (64-bit RIFF, EBU Tech 3306) files are not supported; export as a plain RIFF WAVE`);
  if (kind.kind === "rifx") throw new WavRefusal("not-riff", "big-endian RIFX files are not supported; export as little-endian RIFF WAVE");
  if (kind.kind === "not-riff") throw new WavRefusal("not-riff", `not a WAV file: ${magicName(kind.magic)}`);
  if (kind.kind === "not-wave") throw new WavRefusal("not-riff", `RIFF file of type "${kind.form}", not "WAVE"`);

  const chunks = walkChunks(bytes);
  const fmtRef = chunks.find((c) => c.id === "fmt ");
  if (!fmtRef) throw new WavRefusal("bad-header", "no 'fmt ' chunk");
  const fmt = readFmt(bytes, fmtRef);
  if (!fmt) throw new WavRefusal("bad-header", `'fmt ' chunk is ${fmtRef.available} bytes, needs at least 16`);
  const { encoding } = validateFormat(fmt);

  const dataRef = chunks.find((c) => c.id === "data");
  if (!dataRef) throw new WavRefusal("data-missing", "no 'data' chunk");
  const missingBytes = dataRef.size - dataRef.available;
  const seconds = (b: number) => (b / fmt.byteRate).toFixed(3);
  if (missingBytes > 0 && missingBytes > maxMissing * dataRef.size) {
    throw new WavRefusal(
      "data-missing",
      `data chunk claims ${dataRef.size} bytes but the file holds ${dataRef.available}: ${missingBytes} bytes (${seconds(missingBytes)} s) missing`,
    );
  }
  const truncated = missingBytes > 0;
  const riffSize = u32(bytes, 4);
  if (!truncated && riffSize + 8 !== bytes.length && riffSize + 8 !== bytes.length - 1) {
    warnings.push(`RIFF size field says ${riffSize + 8} bytes, file has ${bytes.length}`);
  }
  if (truncated) warnings.push(`truncated: ${missingBytes} bytes (${seconds(missingBytes)} s) of the data chunk missing; measured what is there`);
  const frames = Math.floor(dataRef.available / fmt.blockAlign);
  if (frames === 0) {
    throw new WavRefusal("no-frames", dataRef.size === 0 ? "data chunk is empty (0 sample frames)" : `data chunk holds ${dataRef.available} bytes, less than one ${fmt.blockAlign}-byte sample frame`);
  }
  if (!truncated && dataRef.available % fmt.blockAlign !== 0) warnings.push(`data chunk ends with ${dataRef.available % fmt.blockAlign} stray bytes (not a whole frame)`);
  const durationSec = frames / fmt.sampleRate;
  if (durationSec > maxSeconds) throw new WavRefusal("too-long", `${durationSec.toFixed(2)} s is longer than the ${maxSeconds} s one-shot limit`);

  const channels = deinterleave(bytes, dataRef.dataStart, frames, fmt.channels, fmt.bitsPerSample, encoding);
  let clipLevel = 1;
  if (encoding === "pcm") clipLevel = (2 ** (fmt.bitsPerSample - 1) - 2 ** (fmt.bitsPerSample - fmt.validBits)) / 2 ** (fmt.bitsPerSample - 1);
  if (encoding === "float") {
    let bad = 0;
    let over = 0;
    for (const ch of channels) {
      for (let i = 0; i < ch.length; i++) {
        const v = ch[i];
        if (!Number.isFinite(v)) {
          ch[i] = 0;
          bad++;
        } else if (v > 1 || v < -1) over++;
      }
    }
    if (bad) warnings.push(`${bad} float samples were NaN or infinite and were read as 0`);
    if (over) warnings.push(`${over} float samples exceed full scale (kept as stored)`);
  }
  return {
    format: {
      formatTag: fmt.formatTag,
      encoding,
      bitsPerSample: fmt.bitsPerSample,
      validBits: fmt.validBits,
      channels: fmt.channels,
      sampleRate: fmt.sampleRate,
      frames,
      durationSec,
    },
    channels,
    metadata: readMetadata(bytes, chunks),
    truncated,
    missingBytes: Math.max(0, missingBytes),
    clipLevel,
    channelMask: fmt.channelMask,
    warnings,
  };
}
