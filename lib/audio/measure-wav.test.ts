import { describe, expect, it } from "vitest";
import { computePeaks, decodeWav, encodeWav, measureBytes, measureWav, PEAK_BUCKETS } from "./index";
import { hit, sine } from "./signals";

const fs = 48000;

describe("measureWav(): the pipeline's one entry point (measurement, metadata and peaks, or the refusal)", () => {
  const L = hit(fs, 1.5, { f: 110, tau: 0.12, leadSec: 0.012, noiseDb: -78, seed: 2 });
  const bytes = encodeWav([L, Float32Array.from(L, (v) => 0.8 * v)], { sampleRate: fs, bits: 24 });

  it("a truncated file is measured and flagged; a refused one comes back with its code", () => {
    const t = measureWav(bytes.subarray(0, bytes.length - 3000));
    expect(t.ok && t.measurement.truncated).toBe(true);
    const r = measureWav(new Uint8Array([1, 2, 3]));
    expect(r).toMatchObject({ ok: false, code: "not-riff" });
  });

  it("gives the same record as measureBytes (the file's metadata included), as plain JSON", () => {
    const out = measureWav(bytes);
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect(out.measurement).toEqual(measureBytes(bytes));
    expect(out.measurement.metadata).toBeDefined();
    expect(JSON.parse(JSON.stringify(out))).toEqual(out);
  });

  it(`peaks: ${PEAK_BUCKETS} min/max pairs, computePeaks rounded to 4 decimals`, () => {
    const out = measureWav(bytes);
    if (!out.ok) throw new Error(out.reason);
    const p = computePeaks(decodeWav(bytes), PEAK_BUCKETS);
    expect(out.peaks.min).toHaveLength(PEAK_BUCKETS);
    expect(out.peaks.max).toHaveLength(PEAK_BUCKETS);
    expect(out.peaks.max).toEqual(p.max.map((x) => Math.round(x * 10_000) / 10_000));
    expect(out.peaks.min).toEqual(p.min.map((x) => Math.round(x * 10_000) / 10_000));
  });

  it("a 0.5 amplitude 1 kHz sine at 48 kHz (16-bit: 0.5 is exactly 16384/32768) peaks at +-0.5 in every bucket (handbook sine)", () => {
    // 48 samples per period, so sample 12 of each period is exactly the crest; 120 samples per bucket hold 2.5 periods
    const out = measureWav(encodeWav([sine(fs, 1, 1000, 0.5)], { sampleRate: fs, bits: 16 }));
    if (!out.ok) throw new Error(out.reason);
    expect(new Set(out.peaks.max)).toEqual(new Set([0.5]));
    expect(new Set(out.peaks.min)).toEqual(new Set([-0.5]));
  });

  it("refusals are final; other failures are not (the worker tries those again)", () => {
    const long = measureWav(encodeWav([new Float32Array(fs * 3)], { sampleRate: fs, bits: 16 }), { maxSeconds: 2 });
    expect(long).toMatchObject({ ok: false, code: "too-long", final: true });
    const broken = measureWav(null as unknown as Uint8Array);
    expect(broken).toMatchObject({ ok: false, code: "error", final: false });
    if (!broken.ok) expect(broken.reason).toMatch(/^could not measure: /);
  });

  it("crossCheck compares with wavefile's reader: a clean file gains no warning", () => {
    const plain = measureWav(bytes);
    const checked = measureWav(bytes, { crossCheck: true });
    if (!plain.ok || !checked.ok) throw new Error("refused");
    expect(checked.measurement.warnings).toEqual(plain.measurement.warnings);
  });

  it("crossCheck says so when a file is not handed to wavefile (more than 4 LIST chunks; RIFF 1991 chunk layout)", () => {
    // the canonical 44-byte header: RIFF(12) fmt(24) data(8 + n); five empty LIST/INFO chunks go before data
    const src = encodeWav([sine(fs, 0.1, 1000, 0.5)], { sampleRate: fs, bits: 16 });
    const list = new Uint8Array(12);
    list.set([0x4c, 0x49, 0x53, 0x54, 4, 0, 0, 0, 0x49, 0x4e, 0x46, 0x4f]); // "LIST", 4, "INFO"
    const out = new Uint8Array(src.length + 5 * 12);
    out.set(src.subarray(0, 36));
    for (let i = 0; i < 5; i++) out.set(list, 36 + 12 * i);
    out.set(src.subarray(36), 96);
    new DataView(out.buffer).setUint32(4, out.length - 8, true);
    const checked = measureWav(out, { crossCheck: true });
    if (!checked.ok) throw new Error(checked.reason);
    expect(checked.measurement.warnings).toContain("not cross-checked with wavefile: 5 LIST chunks");
    const plain = measureWav(out);
    expect(plain.ok && plain.measurement.warnings.some((w) => /wavefile/.test(w))).toBe(false);
  });
});
