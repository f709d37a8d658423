import { describe, expect, it } from "vitest";
import { decodeWav } from "./decode";
import { encodeWav, littleEndian } from "./encode";
import { WavRefusal } from "./refusal";
import { WaveFile, crossCheckWithWavefile, wavefileFloats } from "./wavefile-check";
import { sine } from "./signals";

function refusal(bytes: Uint8Array, opts?: Parameters<typeof decodeWav>[1]): WavRefusal {
  try {
    decodeWav(bytes, opts);
  } catch (e) {
    expect(e).toBeInstanceOf(WavRefusal);
    return e as WavRefusal;
  }
  throw new Error("expected a refusal");
}
const pcm16 = (frames = 100, ch = 2, fs = 48000) => encodeWav(Array.from({ length: ch }, () => sine(fs, frames / fs, 440, 0.5)), { sampleRate: fs, bits: 16 });
const setU16 = (b: Uint8Array, at: number, v: number) => new DataView(b.buffer, b.byteOffset).setUint16(at, v, true);
const setU32 = (b: Uint8Array, at: number, v: number) => new DataView(b.buffer, b.byteOffset).setUint32(at, v, true);

describe("the canonical 44-byte PCM header (RIFF WAVE layout, Microsoft/IBM RIFF 1991)", () => {
  it("a hand-built 16-bit stereo 44.1 kHz file decodes field by field and sample by sample", () => {
    const samples = [[0, 16384, -32768, 32767], [-1, 1, 8192, -16384]];
    const frames = 4, ch = 2, fs = 44100, bits = 16;
    const b = new Uint8Array(44 + frames * ch * 2);
    const dv = new DataView(b.buffer);
    const tag = (at: number, s: string) => [...s].forEach((c, i) => (b[at + i] = c.charCodeAt(0)));
    tag(0, "RIFF"); dv.setUint32(4, 36 + frames * ch * 2, true); tag(8, "WAVE");
    tag(12, "fmt "); dv.setUint32(16, 16, true); dv.setUint16(20, 1, true); dv.setUint16(22, ch, true);
    dv.setUint32(24, fs, true); dv.setUint32(28, (fs * ch * bits) / 8, true); dv.setUint16(32, (ch * bits) / 8, true); dv.setUint16(34, bits, true);
    tag(36, "data"); dv.setUint32(40, frames * ch * 2, true);
    for (let i = 0; i < frames; i++) for (let c = 0; c < ch; c++) dv.setInt16(44 + (i * ch + c) * 2, samples[c][i], true);
    const d = decodeWav(b);
    expect(d.format).toEqual({ formatTag: 1, encoding: "pcm", bitsPerSample: 16, validBits: 16, channels: 2, sampleRate: 44100, frames: 4, durationSec: 4 / 44100 });
    expect(Array.from(d.channels[0])).toEqual(samples[0].map((v) => v / 32768));
    expect(Array.from(d.channels[1])).toEqual(samples[1].map((v) => v / 32768));
    expect(d.truncated).toBe(false);
    expect(d.warnings).toEqual([]);
  });
  it("8-bit samples are unsigned: byte 128 is silence, 0 is -1, 255 is 127/128", () => {
    const b = encodeWav([[0]], { sampleRate: 8000, bits: 8 });
    b.set([128, 0, 255].slice(0, 1), 44);
    const withThree = encodeWav([[0, 0, 0]], { sampleRate: 8000, bits: 8 });
    withThree.set([128, 0, 255], 44);
    expect(Array.from(decodeWav(withThree).channels[0])).toEqual([0, -1, 127 / 128]);
  });
});

describe("decoding every supported format agrees with wavefile's reader (reference library)", () => {
  const fs = 44100;
  const x = [sine(fs, 0.01, 1000, 0.9), sine(fs, 0.01, 300, -0.7)];
  const cases: { bits: 8 | 16 | 24 | 32 | 64; float?: boolean; extensible?: boolean }[] = [
    { bits: 8 }, { bits: 16 }, { bits: 24 }, { bits: 32 }, { bits: 32, float: true }, { bits: 64, float: true },
    { bits: 24, extensible: true }, { bits: 32, float: true, extensible: true },
  ];
  for (const c of cases) {
    it(`${c.bits}-bit ${c.float ? "float" : "PCM"}${c.extensible ? " (extensible)" : ""}`, () => {
      const bytes = encodeWav(x, { sampleRate: fs, ...c });
      const d = decodeWav(bytes);
      expect(d.format.encoding).toBe(c.float ? "float" : "pcm");
      expect(d.format.formatTag).toBe(c.extensible ? 0xfffe : c.float ? 3 : 1);
      expect(crossCheckWithWavefile(bytes, d)).toEqual([]);
      const wf = new WaveFile();
      wf.fromBuffer(bytes);
      expect(d.channels.map((ch) => Array.from(ch))).toEqual(wavefileFloats(wf).map((ch) => Array.from(ch)));
    });
  }
  it("24-bit valid in a 32-bit extensible container keeps the 24-bit values and the clip level", () => {
    const bytes = encodeWav([[0.5, -1, 0.25]], { sampleRate: 48000, bits: 32, extensible: true, validBits: 24 });
    const d = decodeWav(bytes);
    expect(d.format.validBits).toBe(24);
    expect(Array.from(d.channels[0])).toEqual([0.5, -1, 0.25]);
    expect(d.clipLevel).toBe((2 ** 31 - 2 ** 8) / 2 ** 31);
  });
});

describe("chunk handling", () => {
  it("skips unknown chunks and honours the pad byte of odd-sized chunks", () => {
    const bytes = encodeWav([sine(48000, 0.01, 500, 0.5)], { sampleRate: 48000, bits: 24, chunksBefore: [{ id: "junk", data: new Uint8Array(7) }, { id: "zzzz", data: new Uint8Array(3).fill(9) }] });
    const d = decodeWav(bytes);
    expect(d.metadata.chunks.map((c) => c.id)).toEqual(["fmt ", "junk", "zzzz", "data"]);
    expect(crossCheckWithWavefile(bytes, d)).toEqual([]);
  });
  it("a file with 300 LIST chunks and a huge bogus chunk size decodes quickly (every walk is bounded)", () => {
    const lists = Array.from({ length: 300 }, () => ({ id: "LIST", data: littleEndian([{ text: "INFO", size: 4 }, { text: "INAM", size: 4 }, { u32: 2 }, { text: "x", size: 2 }]) }));
    const bytes = encodeWav([sine(48000, 0.01, 500, 0.5)], { sampleRate: 48000, bits: 16, chunksBefore: lists, chunksAfter: [{ id: "huge", data: new Uint8Array(8) }] });
    setU32(bytes, bytes.length - 12, 0xfffffff0); // the trailing chunk now claims 4 GB
    const t = performance.now();
    const d = decodeWav(bytes);
    expect(performance.now() - t).toBeLessThan(500);
    expect(d.metadata.info.INAM).toBe("x");
    expect(crossCheckWithWavefile(bytes, d)[0]).toMatch(/not cross-checked/);
  });
});

describe("refusals: each reason on a crafted file, with a specific message", () => {
  it("not RIFF: an MP3 and random bytes", () => {
    const mp3 = new Uint8Array(64); mp3.set([0x49, 0x44, 0x33, 3]);
    expect(refusal(mp3)).toMatchObject({ code: "not-riff", message: expect.stringMatching(/MP3/) });
    expect(refusal(new Uint8Array(5))).toMatchObject({ code: "not-riff", message: expect.stringMatching(/5 bytes/) });
    const avi = pcm16(); avi.set([65, 86, 73, 32], 8);
    expect(refusal(avi)).toMatchObject({ code: "not-riff", message: expect.stringMatching(/AVI/) });
  });
  it("RF64 (EBU Tech 3306) is refused by name", () => {
    const b = pcm16(); b.set([82, 70, 54, 52], 0); setU32(b, 4, 0xffffffff);
    expect(refusal(b)).toMatchObject({ code: "rf64", message: expect.stringMatching(/RF64/) });
  });
  it("compressed formats: mu-law, IMA ADPCM, an extensible ADPCM subformat", () => {
    const mu = pcm16(); setU16(mu, 20, 7);
    expect(refusal(mu)).toMatchObject({ code: "compressed", message: expect.stringMatching(/mu-law/) });
    const ima = pcm16(); setU16(ima, 20, 0x11);
    expect(refusal(ima)).toMatchObject({ code: "compressed", message: expect.stringMatching(/IMA ADPCM/) });
    const ext = encodeWav([[0, 0]], { sampleRate: 48000, bits: 16, extensible: true }); setU16(ext, 44, 2);
    expect(refusal(ext)).toMatchObject({ code: "compressed", message: expect.stringMatching(/SubFormat.*ADPCM/) });
  });
  it("inconsistent headers: 0 channels, 0 Hz, block align, byte rate, 12-bit container, no fmt chunk", () => {
    const zeroCh = pcm16(); setU16(zeroCh, 22, 0);
    expect(refusal(zeroCh)).toMatchObject({ code: "bad-header", message: expect.stringMatching(/0 channels/) });
    const zeroHz = pcm16(); setU32(zeroHz, 24, 0);
    expect(refusal(zeroHz)).toMatchObject({ code: "bad-header", message: expect.stringMatching(/0 Hz/) });
    const align = pcm16(); setU16(align, 32, 6);
    expect(refusal(align)).toMatchObject({ code: "bad-header", message: expect.stringMatching(/block align 6 .*expected 4/) });
    const rate = pcm16(); setU32(rate, 28, 12345);
    expect(refusal(rate)).toMatchObject({ code: "bad-header", message: expect.stringMatching(/byte rate 12345 .*expected 192000/) });
    const twelve = pcm16(); setU16(twelve, 34, 12);
    expect(refusal(twelve)).toMatchObject({ code: "bad-header", message: expect.stringMatching(/12-bit/) });
    const noFmt = pcm16(); noFmt.set([120, 120, 120, 120], 12);
    expect(refusal(noFmt)).toMatchObject({ code: "bad-header", message: expect.stringMatching(/no 'fmt '/) });
  });
  it("more than 8 channels and rates outside 8-192 kHz are unsupported", () => {
    expect(refusal(encodeWav(Array.from({ length: 10 }, () => [0]), { sampleRate: 48000, bits: 16 })).code).toBe("unsupported");
    expect(refusal(encodeWav([[0]], { sampleRate: 4000, bits: 16 })).message).toMatch(/4000 Hz/);
  });
  it("zero frames", () => {
    expect(refusal(encodeWav([new Float32Array(0)], { sampleRate: 48000, bits: 16 }))).toMatchObject({ code: "no-frames", message: expect.stringMatching(/empty/) });
  });
  it("no data chunk; a data chunk claiming more bytes than the file has says how many are missing", () => {
    const noData = pcm16(); noData.set([120, 120, 120, 120], 36);
    expect(refusal(noData)).toMatchObject({ code: "data-missing", message: expect.stringMatching(/no 'data'/) });
    const b = pcm16(1000, 2); // 4000 data bytes
    const cut = b.subarray(0, 44 + 1000);
    expect(refusal(cut)).toMatchObject({ code: "data-missing", message: expect.stringMatching(/claims 4000 bytes .* holds 1000: 3000 bytes \(0\.016 s\) missing/) });
  });
  it("longer than the one-shot limit (default 60 s, configurable)", () => {
    const long = encodeWav([new Float32Array(8000 * 61)], { sampleRate: 8000, bits: 8 });
    expect(refusal(long)).toMatchObject({ code: "too-long", message: expect.stringMatching(/61\.00 s .* 60 s/) });
    expect(refusal(pcm16(48000, 1), { maxSeconds: 0.5 }).code).toBe("too-long");
  });
  it("a slightly truncated file is decoded and flagged with the missing byte count", () => {
    const b = pcm16(1000, 2);
    const d = decodeWav(b.subarray(0, b.length - 101));
    expect(d.truncated).toBe(true);
    expect(d.missingBytes).toBe(101);
    expect(d.format.frames).toBe(974); // (4000 - 101) / 4 whole frames
    expect(d.warnings.join()).toMatch(/101 bytes/);
  });
});
