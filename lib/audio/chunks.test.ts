import { describe, expect, it } from "vitest";
import { decodeWav } from "./decode";
import { encodeWav, littleEndian } from "./encode";
import { sine } from "./signals";

const wav = (chunksBefore: { id: string; data: Uint8Array }[], chunksAfter: { id: string; data: Uint8Array }[] = []) =>
  encodeWav([sine(48000, 0.01, 440, 0.5)], { sampleRate: 48000, bits: 24, chunksBefore, chunksAfter });

describe("metadata chunks built byte by byte per their published layouts", () => {
  it("'smpl' (RIFF sampler chunk offsets, Microsoft/IBM RIFF 1991): unity note, pitch fraction, loops", () => {
    const smpl = littleEndian([
      { u32: 0 }, { u32: 0 }, { u32: 20833 }, // manufacturer, product, sample period (ns)
      { u32: 38 }, { u32: 0x80000000 }, // unity note 38, half a semitone
      { u32: 0 }, { u32: 0 }, // SMPTE format, offset
      { u32: 1 }, { u32: 0 }, // one loop, no sampler data
      { u32: 7 }, { u32: 1 }, { u32: 100 }, { u32: 399 }, { u32: 0 }, { u32: 0 }, // loop: id 7, alternating, 100-399
    ]);
    expect(smpl.length).toBe(36 + 24);
    const m = decodeWav(wav([{ id: "smpl", data: smpl }])).metadata;
    expect(m.smpl).toMatchObject({ samplePeriodNs: 20833, unityNote: 38, pitchFraction: 0x80000000, pitchFractionCents: 50, loops: [{ cuePointId: 7, type: 1, start: 100, end: 399, fraction: 0, playCount: 0 }] });
  });
  it("'smpl' claiming more loops than it holds reads only the loops present", () => {
    const smpl = littleEndian([{ u32: 0 }, { u32: 0 }, { u32: 0 }, { u32: 60 }, { u32: 0 }, { u32: 0 }, { u32: 0 }, { u32: 1000000 }, { u32: 0 }]);
    expect(decodeWav(wav([{ id: "smpl", data: smpl }])).metadata.smpl!.loops).toEqual([]);
  });
  it("'bext' v2 (EBU Tech 3285): text fields, time reference, loudness fields x100, coding history; fixed part 602 bytes", () => {
    const bext = littleEndian([
      { text: "Snare centre, layer 3", size: 256 }, { text: "Kitwright demo", size: 32 }, { text: "KW-0001", size: 32 },
      { text: "2026-05-04", size: 10 }, { text: "12:34:56", size: 8 },
      { u32: 48000 * 3600 }, { u32: 1 }, // TimeReference low, high
      { u16: 2 }, { text: "", size: 64 }, // version 2, UMID
      { i16: -2310 }, { i16: 520 }, { i16: -105 }, { i16: -1800 }, { i16: -2000 }, // loudness fields
      { text: "", size: 180 }, { text: "A=PCM,F=48000,W=24,M=mono\r\n", size: 27 },
    ]);
    expect(bext.length).toBe(602 + 27);
    const b = decodeWav(wav([{ id: "bext", data: bext }])).metadata.bext!;
    expect(b).toMatchObject({
      description: "Snare centre, layer 3", originator: "Kitwright demo", originatorReference: "KW-0001",
      originationDate: "2026-05-04", originationTime: "12:34:56", timeReference: 48000 * 3600 + 2 ** 32, version: 2, umid: "",
      loudnessValue: -23.1, loudnessRange: 5.2, maxTruePeakLevel: -1.05, maxMomentaryLoudness: -18, maxShortTermLoudness: -20,
      codingHistory: "A=PCM,F=48000,W=24,M=mono",
    });
  });
  it("'bext' version 1 has no loudness fields", () => {
    const bext = littleEndian([{ text: "old", size: 256 }, { text: "", size: 90 }, { u16: 1 }, { text: "", size: 64 }, { i16: -2300 }, { text: "", size: 188 }]);
    expect(decodeWav(wav([{ id: "bext", data: bext }])).metadata.bext).toMatchObject({ description: "old", version: 1, loudnessValue: null });
  });
  it("'inst' (7 bytes plus pad): note, signed fine tune and gain, note and velocity ranges", () => {
    const inst = new Uint8Array([38, 0xfb, 0xfd, 36, 40, 64, 127]);
    expect(decodeWav(wav([{ id: "inst", data: inst }])).metadata.inst).toEqual({ unshiftedNote: 38, fineTuneCents: -5, gainDb: -3, lowNote: 36, highNote: 40, lowVelocity: 64, highVelocity: 127 });
  });
  it("'cue ' points with their LIST/adtl 'labl' names, and LIST/INFO tags after the data", () => {
    const cue = littleEndian([{ u32: 2 }, { u32: 1 }, { u32: 0 }, { text: "data", size: 4 }, { u32: 0 }, { u32: 0 }, { u32: 120 }, { u32: 2 }, { u32: 0 }, { text: "data", size: 4 }, { u32: 0 }, { u32: 0 }, { u32: 400 }]);
    const adtl = littleEndian([{ text: "adtl", size: 4 }, { text: "labl", size: 4 }, { u32: 10 }, { u32: 1 }, { text: "strike", size: 6 }]);
    const info = littleEndian([{ text: "INFO", size: 4 }, { text: "INAM", size: 4 }, { u32: 9 }, { text: "Tom 2 hit", size: 10 }, { text: "IART", size: 4 }, { u32: 5 }, { text: "Room", size: 6 }]);
    const m = decodeWav(wav([{ id: "cue ", data: cue }], [{ id: "LIST", data: adtl }, { id: "LIST", data: info }])).metadata;
    expect(m.cuePoints.map((p) => [p.id, p.sampleOffset, p.label])).toEqual([[1, 120, "strike"], [2, 400, null]]);
    expect(m.info).toEqual({ INAM: "Tom 2 hit", IART: "Room" });
  });
});
