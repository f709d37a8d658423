// Hostile input through the decoder: 2,000 files of the seeded corpus (tests/hostile/mutate.ts) go through
// measureWav (lib/audio). Each must end measured (plain-JSON numbers) or refused with a stable code and
// a human reason; nothing throws, nothing hangs (the per-file time is logged, not asserted: shared machine).
// The full 10,000-file run is `npx tsx tests/hostile/run-corpus.ts --count 10000` (figures in bench/RESULTS.md).
// Needs no services; it lives with the integration tests because it is slower than a unit test.
import { describe, expect, it } from "vitest";
import { measureWav } from "@/lib/audio";
import { runCorpus } from "@/tests/hostile/corpus";
import { bases, MUTATION_KINDS, mutateOnce, rng } from "@/tests/hostile/mutate";

describe("hostile WAV corpus through the decoder", () => {
  it("2,000 damaged files (common practice in format fuzzing): measured or refused with a code and reason, never a throw", () => {
    const s = runCorpus(2000, 1);
    console.log(`hostile corpus: measured ${s.measured}, refused ${s.refused}, by code ${JSON.stringify(s.byCode)}, worst ${s.maxMs.toFixed(1)} ms/file`);
    expect(s.problems).toEqual([]);
    expect(s.measured + s.refused).toBe(2000);
    // every kind of damage was produced, and the undamaged controls were all measured
    expect(Object.keys(s.byKind).sort()).toEqual([...MUTATION_KINDS].sort());
    expect(s.byKind.valid!.refused).toBe(0);
    expect(s.byKind.valid!.measured).toBeGreaterThan(100);
    // no catch-all: every refusal carries one of the decoder's own codes
    for (const code of Object.keys(s.byCode)) expect(["not-riff", "rf64", "compressed", "bad-header", "unsupported", "no-frames", "data-missing", "too-long"]).toContain(code);
  });

  const r = rng(42);
  for (const base of bases()) {
    it(`${base.name}: zero channels is a bad header (RIFF fmt: nChannels >= 1, RIFF 1991 spec)`, () => {
      const out = measureWav(mutateOnce(base.bytes, "zero-channels", r));
      expect(out.ok).toBe(false);
      if (!out.ok) expect(out.code).toBe("bad-header");
    });
    it(`${base.name}: an RF64/BW64 header is refused as rf64 (EBU Tech 3306)`, () => {
      const out = measureWav(mutateOnce(base.bytes, "rf64", r));
      expect(out.ok).toBe(false);
      if (!out.ok) expect(out.code).toBe("rf64");
    });
    it(`${base.name}: cut inside the header is refused, never read past the end (RIFF chunk layout)`, () => {
      for (const cut of [0, 3, 11, 12, 20, 36, 43]) {
        const out = measureWav(base.bytes.slice(0, cut));
        expect(out.ok, `cut at ${cut}`).toBe(false);
        if (!out.ok) expect(out.reason.length).toBeGreaterThan(10);
      }
    });
  }

  it("format tag 2 (Microsoft ADPCM, RFC 2361 registry) is refused as compressed", () => {
    const b = bases()[0]!.bytes.slice();
    new DataView(b.buffer).setUint16(20, 2, true); // fmt chunk at 12, tag at 12 + 8
    const out = measureWav(b);
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.code).toBe("compressed");
  });

  it("a data chunk claiming 4 GiB in a 9 kB file is refused as data-missing, without allocating 4 GiB", () => {
    const b = bases()[0]!.bytes.slice();
    new DataView(b.buffer).setUint32(40, 0xffffffff, true); // canonical 44-byte header: data size at 40
    const before = process.memoryUsage().rss;
    const out = measureWav(b);
    expect(process.memoryUsage().rss - before).toBeLessThan(256 * 1024 * 1024);
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.code).toBe("data-missing");
  });

  it("40 nested LIST chunks before the data chunk are skipped as one chunk (RIFF: LIST is opaque to the reader)", () => {
    const base = bases()[0]!;
    const out = measureWav(mutateOnce(base.bytes, "nested-list", () => 0.99));
    expect(out.ok).toBe(true);
    if (out.ok) expect(out.measurement.format.frames).toBe(4410);
  });
});
