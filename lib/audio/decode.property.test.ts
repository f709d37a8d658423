// Property test: random valid files of every format written by wavefile (reference writer) read back by
// our decoder with identical samples (int / 2^(bits-1), unsigned 8-bit minus 128, floats as Float32).
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { decodeWav } from "./decode";
import { measure } from "./measure";
import { WavRefusal } from "./refusal";
import { WaveFile } from "./wavefile-check";

type Writer = { fromScratch(ch: number, fs: number, depth: string, s: number[][] | number[]): void; toBuffer(): Uint8Array };
const depths = ["8", "16", "24", "32", "32f", "64"] as const;
const rates = [8000, 11025, 22050, 44100, 48000, 88200, 96000, 176400, 192000];

function sampleArb(depth: (typeof depths)[number]): fc.Arbitrary<number> {
  if (depth === "8") return fc.integer({ min: 0, max: 255 });
  if (depth === "32f" || depth === "64") return fc.double({ min: -1, max: 1, noNaN: true });
  const b = Number(depth);
  return fc.integer({ min: -(2 ** (b - 1)), max: 2 ** (b - 1) - 1 });
}

const fileArb = fc
  .record({ depth: fc.constantFrom(...depths), channels: fc.integer({ min: 1, max: 8 }), fs: fc.constantFrom(...rates), frames: fc.integer({ min: 1, max: 200 }) })
  .chain((h) => fc.record({ h: fc.constant(h), data: fc.array(fc.array(sampleArb(h.depth), { minLength: h.frames, maxLength: h.frames }), { minLength: h.channels, maxLength: h.channels }) }));

describe("round trip through wavefile's writer and our reader (property test, fast-check)", () => {
  it("every format, 1-8 channels, 8-192 kHz: identical samples and header", () => {
    fc.assert(
      fc.property(fileArb, ({ h, data }) => {
        const wf = new WaveFile() as unknown as Writer;
        wf.fromScratch(h.channels, h.fs, h.depth, h.channels === 1 ? data[0] : data);
        const d = decodeWav(wf.toBuffer());
        expect(d.format.channels).toBe(h.channels);
        expect(d.format.sampleRate).toBe(h.fs);
        expect(d.format.frames).toBe(h.frames);
        expect(d.format.encoding).toBe(h.depth === "32f" || h.depth === "64" ? "float" : "pcm");
        const bits = parseInt(h.depth, 10);
        const expected = data.map((ch) => ch.map((v) => Math.fround(h.depth === "8" ? (v - 128) / 128 : h.depth === "32f" || h.depth === "64" ? v : v / 2 ** (bits - 1))));
        if (h.depth === "32f") {
          // wavefile's float32 packer may round to the neighbouring float32: require our reading to equal what
          // wavefile itself reads back, and to lie within one float32 step of the value written.
          const back = new WaveFile();
          back.fromBuffer(wf.toBuffer());
          const raw = back.getSamples(false) as unknown as Float64Array | Float64Array[];
          const theirs = (h.channels === 1 ? [raw] : raw) as Float64Array[];
          expect(d.channels.map((c) => Array.from(c))).toEqual(theirs.map((c) => Array.from(c, Math.fround)));
          d.channels.forEach((c, ci) => c.forEach((v, i) => expect(Math.abs(v - expected[ci][i])).toBeLessThanOrEqual(2 ** -23)));
        } else {
          expect(d.channels.map((c) => Array.from(c))).toEqual(expected);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe("damaged files never crash or hang (fuzz with fast-check)", () => {
  const base = new WaveFile() as unknown as Writer;
  base.fromScratch(2, 48000, "24", [Array.from({ length: 300 }, (_, i) => Math.round(4e6 * Math.sin(i / 7))), Array.from({ length: 300 }, (_, i) => Math.round(-3e6 * Math.sin(i / 5)))]);
  const good = base.toBuffer();
  it("random byte changes in the headers and random truncation: a decoded file or a WavRefusal, and measure() copes", () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ at: fc.integer({ min: 0, max: 60 }), v: fc.integer({ min: 0, max: 255 }) }), { maxLength: 6 }),
        fc.integer({ min: 0, max: good.length }),
        (edits, cut) => {
          const b = good.slice(0, cut);
          for (const e of edits) if (e.at < b.length) b[e.at] = e.v;
          let decoded;
          try {
            decoded = decodeWav(b, { maxSeconds: 5 });
          } catch (err) {
            expect(err).toBeInstanceOf(WavRefusal);
            expect((err as WavRefusal).message.length).toBeGreaterThan(10);
            return;
          }
          const m = measure(decoded);
          expect(JSON.parse(JSON.stringify(m))).toEqual(m);
        },
      ),
      { numRuns: 400 },
    );
  });
});
