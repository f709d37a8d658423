// The first bytes of a file. RIFF 1991 (Multimedia Programming Interface and Data Specifications 1.0): a RIFF
// file starts with the chunk id 'RIFF', a little-endian uint32 size and the form type ('WAVE' for waveform
// audio, 'AVI ' for video); 'RIFX' is the same layout big-endian. EBU Tech 3306 (RF64) writes 'RF64' in place
// of 'RIFF'; ITU-R BS.2088 (BW64) writes 'BW64' (from memory of BS.2088's section 2).
import { describe, expect, it } from "vitest";
import { encodeWav } from "./encode";
import { sine } from "./signals";
import { SNIFF_BYTES, sniffWav } from "./sniff";

const bytes = (s: string) => Uint8Array.from([...s].map((c) => c.charCodeAt(0)));

describe("sniffWav", () => {
  it("a WAV written by our encoder is RIFF....WAVE, from its first 12 bytes or from the whole file", () => {
    const wav = encodeWav([sine(48000, 0.01, 440, 0.5)], { sampleRate: 48000, bits: 16 });
    expect(sniffWav(wav)).toEqual({ kind: "wav" });
    expect(sniffWav(wav.subarray(0, SNIFF_BYTES))).toEqual({ kind: "wav" });
    expect(SNIFF_BYTES).toBe(12);
  });

  it("RF64 and BW64 are told from their first four bytes", () => {
    expect(sniffWav(bytes("RF64\xff\xff\xff\xffWAVEds64"))).toEqual({ kind: "rf64", magic: "RF64" });
    expect(sniffWav(bytes("BW64"))).toEqual({ kind: "rf64", magic: "BW64" });
  });

  it("big-endian RIFX and a RIFF of another form type are not WAVE", () => {
    expect(sniffWav(bytes("RIFX\x00\x00\x00\x24WAVE"))).toEqual({ kind: "rifx" });
    expect(sniffWav(bytes("RIFF\x24\x00\x00\x00AVI LIST"))).toEqual({ kind: "not-wave", form: "AVI " });
  });

  it("other files name their first four bytes; too few bytes cannot be told", () => {
    expect(sniffWav(bytes("fLaC\x00\x00\x00\x22\x10\x00\x10\x00"))).toEqual({ kind: "not-riff", magic: "fLaC" });
    expect(sniffWav(bytes("PK\x03\x04"))).toEqual({ kind: "not-riff", magic: "PK\x03\x04" });
    expect(sniffWav(new Uint8Array(0))).toEqual({ kind: "short" });
    expect(sniffWav(bytes("RI"))).toEqual({ kind: "short" });
    expect(sniffWav(bytes("RIFF\x24\x00\x00\x00"))).toEqual({ kind: "short" });
  });
});
