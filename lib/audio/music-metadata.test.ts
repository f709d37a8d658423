// Cross-check of our header and tag reading against music-metadata (general-purpose reference library).
// music-metadata is asynchronous and heavy, so it is used here and in the CLI, not in the measuring path.
import { describe, expect, it } from "vitest";
import { parseBuffer } from "music-metadata";
import { decodeWav } from "./decode";
import { encodeWav, littleEndian } from "./encode";
import { sine } from "./signals";

describe("format and tags agree with music-metadata", () => {
  const info = littleEndian([{ text: "INFO", size: 4 }, { text: "INAM", size: 4 }, { u32: 12 }, { text: "Floor tom 1", size: 12 }, { text: "IART", size: 4 }, { u32: 6 }, { text: "Kitwr", size: 6 }]);
  const cases: { fs: number; bits: 8 | 16 | 24 | 32 | 64; float?: boolean; ch: number }[] = [
    { fs: 44100, bits: 16, ch: 1 }, { fs: 48000, bits: 24, ch: 2 }, { fs: 96000, bits: 32, float: true, ch: 2 }, { fs: 22050, bits: 8, ch: 1 }, { fs: 192000, bits: 64, float: true, ch: 6 },
  ];
  for (const c of cases) {
    it(`${c.fs} Hz ${c.bits}-bit${c.float ? " float" : ""} ${c.ch} ch with LIST/INFO`, async () => {
      const bytes = encodeWav(Array.from({ length: c.ch }, () => sine(c.fs, 0.05, 440, 0.5)), { sampleRate: c.fs, bits: c.bits, float: c.float, chunksAfter: [{ id: "LIST", data: info }] });
      const ours = decodeWav(bytes);
      const mm = await parseBuffer(bytes, { mimeType: "audio/wav" });
      expect(mm.format.sampleRate).toBe(ours.format.sampleRate);
      expect(mm.format.numberOfChannels).toBe(ours.format.channels);
      expect(mm.format.bitsPerSample).toBe(ours.format.bitsPerSample);
      expect(mm.format.numberOfSamples).toBe(ours.format.frames);
      expect(mm.common.title).toBe(ours.metadata.info.INAM);
      expect(mm.common.artist).toBe(ours.metadata.info.IART);
    });
  }
});
