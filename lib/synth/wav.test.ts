import { describe, expect, it } from "vitest";
import * as ns from "wavefile";
import { encodeWav, floatToPcm } from "./wav";

// eslint-disable-next-line @typescript-eslint/no-explicit-any
const WaveFile = (ns as any).WaveFile ?? (ns as any).default.WaveFile;

const ascii = (b: Uint8Array, at: number) => String.fromCharCode(...b.subarray(at, at + 4));

describe("WAV writer", () => {
  it("writes the canonical 44-byte PCM header (Microsoft/IBM RIFF 1991, RIFF WAVE)", () => {
    const L = new Float32Array([0, 0.5, -0.5, 1]);
    const R = new Float32Array([0.25, -1, 0, 0]);
    const b = encodeWav([L, R], { sampleRate: 48000, bits: 24 });
    const dv = new DataView(b.buffer);
    const data = 4 * 2 * 3;
    expect(b.length).toBe(44 + data);
    expect(ascii(b, 0)).toBe("RIFF");
    expect(dv.getUint32(4, true)).toBe(36 + data);
    expect(ascii(b, 8)).toBe("WAVE");
    expect(ascii(b, 12)).toBe("fmt ");
    expect(dv.getUint32(16, true)).toBe(16);
    expect(dv.getUint16(20, true)).toBe(1);
    expect(dv.getUint16(22, true)).toBe(2);
    expect(dv.getUint32(24, true)).toBe(48000);
    expect(dv.getUint32(28, true)).toBe(48000 * 2 * 3);
    expect(dv.getUint16(32, true)).toBe(6);
    expect(dv.getUint16(34, true)).toBe(24);
    expect(ascii(b, 36)).toBe("data");
    expect(dv.getUint32(40, true)).toBe(data);
    // interleaved little-endian two's complement: frame 1 left = 0.5 -> 0x400000, right = -1 -> 0x800000
    expect([...b.subarray(50, 53)]).toEqual([0x00, 0x00, 0x40]);
    expect([...b.subarray(53, 56)]).toEqual([0x00, 0x00, 0x80]);
  });

  it("clamps +1.0 to the largest positive code (two's complement has one more negative code)", () => {
    expect(floatToPcm(1, 24)).toBe(8388607);
    expect(floatToPcm(-1, 24)).toBe(-8388608);
    expect(floatToPcm(1, 16)).toBe(32767);
    expect(floatToPcm(-0.5, 16)).toBe(-16384);
  });

  it("reads back through wavefile (general-purpose reference library) at 16 and 24 bits and 32-bit float", () => {
    const x = new Float32Array(101).map((_, i) => Math.sin(i / 7) * 0.9);
    for (const bits of [16, 24, 32] as const) {
      const wav = new WaveFile(encodeWav([x], { sampleRate: 44100, bits }));
      expect(wav.fmt.sampleRate).toBe(44100);
      expect(wav.fmt.numChannels).toBe(1);
      expect(wav.fmt.audioFormat).toBe(bits === 32 ? 3 : 1);
      const s = wav.getSamples(false, Float64Array) as Float64Array;
      const scale = bits === 32 ? 1 : 2 ** (bits - 1);
      for (let i = 0; i < x.length; i++) expect(s[i] / scale).toBeCloseTo(x[i], bits === 16 ? 4 : 6);
    }
  });

  it("pads an odd-sized data chunk and refuses bad input", () => {
    const b = encodeWav([new Float32Array(3)], { sampleRate: 48000, bits: 24 });
    expect(b.length).toBe(44 + 9 + 1);
    expect(new DataView(b.buffer).getUint32(40, true)).toBe(9);
    expect(() => encodeWav([], { sampleRate: 48000, bits: 24 })).toThrow(RangeError);
    expect(() => encodeWav([new Float32Array(2), new Float32Array(3)], { sampleRate: 48000, bits: 24 })).toThrow(RangeError);
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    expect(() => encodeWav([new Float32Array(2)], { sampleRate: 48000, bits: 8 as any })).toThrow(RangeError);
  });
});
