// Inspection of a streaming file. The SHA-256 value is the "abc" example of FIPS 180-4 (NIST's "Example
// Algorithms" for SHA-256); the zip signature is PKWARE APPNOTE.TXT section
// 4.3.7 (local file header, 0x04034b50 little-endian); RIFF/WAVE and RF64 as lib/audio/sniff.test.ts.
import { createHash } from "node:crypto";
import { Readable, Writable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { describe, expect, it } from "vitest";
import { encodeWav } from "@/lib/audio/encode";
import { sine } from "@/lib/audio/signals";
import { headRefusal, Inspect, isZipHead } from "./inspect";
import { Refusal } from "./outcome";

const ascii = (s: string) => Buffer.from(s, "latin1");

async function run(inspect: Inspect, chunks: Buffer[]): Promise<Buffer> {
  const out: Buffer[] = [];
  await pipeline(Readable.from(chunks), inspect, new Writable({ write: (c, _e, cb) => (out.push(c), cb()) }));
  return Buffer.concat(out);
}

describe("upload inspection", () => {
  it("passes a WAV through unchanged and hashes every byte in order, in any chunking", async () => {
    const wav = Buffer.from(encodeWav([sine(48000, 0.01, 440, 0.5)], { sampleRate: 48000, bits: 16 }));
    const a = new Inspect("wav", 1 << 20, () => undefined);
    expect((await run(a, [wav.subarray(0, 5), wav.subarray(5, 11), wav.subarray(11)])).equals(wav)).toBe(true);
    expect(a.bytes).toBe(wav.length);
    // reference: Node's one-shot SHA-256 of the whole file
    expect(a.hash.digest("hex")).toBe(createHash("sha256").update(wav).digest("hex"));
  });

  it("gives the FIPS 180-4 SHA-256 of \"abc\" (refused only at its end: shorter than a head, so every byte is hashed)", async () => {
    const fips = [
      { chunks: ["abc"], hex: "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad" },
      { chunks: ["a", "bc"], hex: "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad" },
    ];
    for (const { chunks, hex } of fips) {
      const i = new Inspect("zip", 1 << 20, () => undefined);
      await expect(run(i, chunks.map(ascii))).rejects.toMatchObject({ code: "not-zip" });
      expect(i.hash.digest("hex")).toBe(hex);
    }
  });

  it("refuses by the first bytes: RF64, not a WAV, empty; a pack must start PK\\x03\\x04", () => {
    expect(headRefusal("wav", ascii("RIFF\x24\x00\x00\x00WAVEfmt "))).toBeNull();
    expect(headRefusal("wav", ascii("RF64\xff\xff\xff\xffWAVE"))).toMatchObject({ code: "rf64" });
    expect(headRefusal("wav", ascii("BW64"))).toMatchObject({ code: "rf64" });
    expect(headRefusal("wav", ascii("RIFF\x24\x00\x00\x00AVI "))).toMatchObject({ code: "not-wav" });
    expect(headRefusal("wav", ascii("ID3\x03\x00\x00\x00\x00\x00\x00\x00\x00"))).toMatchObject({ code: "not-wav" });
    expect(headRefusal("wav", new Uint8Array(0))).toMatchObject({ code: "empty" });
    expect(isZipHead(ascii("PK\x03\x04"))).toBe(true);
    expect(isZipHead(ascii("PK\x05\x06"))).toBe(false); // end of central directory: an empty pack's first bytes
    expect(headRefusal("zip", ascii("PK\x03\x04\x14\x00"))).toBeNull();
    expect(headRefusal("zip", ascii("RIFF\x24\x00\x00\x00WAVE"))).toMatchObject({ code: "not-zip" });
  });

  it("stops a file over its limit, counting every byte received", async () => {
    let counted = 0;
    const wav = Buffer.concat([ascii("RIFF\x00\x00\x00\x00WAVE"), Buffer.alloc(100)]);
    const i = new Inspect("wav", 50, (n) => (counted += n));
    const err = await run(i, [wav.subarray(0, 40), wav.subarray(40)]).catch((e) => e);
    expect(err).toBeInstanceOf(Refusal);
    expect(err).toMatchObject({ code: "too-large", message: "larger than the 0 MB limit per file" });
    expect(counted).toBe(112);
  });
});
