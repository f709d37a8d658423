import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { encodeWav, measureBytes, measureWav } from "../audio";
import { decodeOnsetWave, onsetWave } from "../audio/onset-wave";
import { renderSound, type SoundSpec } from "../synth/drums";
import { demoScenario } from "../synth/scenario";
import { renderScenarioFile } from "../synth/render";
import { catalogueSamples, type CatalogueSampleInput } from "./catalogue";
import { crossCorrelate, micConsistency, type MicSample } from "./mic-consistency";

const SR = 48_000;
const RIDE: SoundSpec = { family: "ride", instrument: { diameterIn: 21 }, articulation: "bow" };

/** One take through one microphone, measured as the server does; `shiftMs` delays it, `flip` inverts it. */
function take(velocity: number, rr: number, mic: "close" | "overhead", opts: { shiftMs?: number; flip?: boolean } = {}): MicSample {
  const chs = renderSound(RIDE, { sampleRate: SR, velocity, seed: `rr${rr}`, channels: 2, mic, seconds: 1 });
  const shift = Math.round(((opts.shiftMs ?? 0) / 1000) * SR);
  const out = chs.map((c) => {
    const y = new Float32Array(c.length + shift);
    for (let i = 0; i < c.length; i++) y[i + shift] = (opts.flip ? -1 : 1) * c[i]!;
    return y;
  });
  const id = `ride-v${velocity}-rr${rr}-${mic}`;
  return { id, path: `${id}.wav`, group: "Ride 21 / bow", take: `v${velocity} rr${rr}`, mic, measurement: measureBytes(encodeWav(out, { sampleRate: SR, bits: 24 })) };
}

describe("onset wave", () => {
  it("keeps the strike's shape through its base64 signed bytes", () => {
    const x = Float32Array.from({ length: 4800 }, (_, i) => (i < 960 ? 0 : Math.sin((2 * Math.PI * 1000 * (i - 960)) / SR)));
    const w = onsetWave([x], SR, 960);
    expect(w.startMs).toBe(18); // 20 ms onset minus 2 ms
    const v = decodeOnsetWave(w);
    expect(v).toHaveLength(288); // 12 ms at 24 kHz
    // 2 ms of silence, then a 1 kHz sine: a quarter period (0.25 ms = 6 window samples) after the onset is its peak
    expect(v[47]).toBe(0);
    expect(v[48 + 6]).toBeCloseTo(1, 1);
  });

  it("cross-correlation finds a known lag and its sign", () => {
    const a = Float64Array.from({ length: 200 }, (_, i) => Math.exp(-((i - 60) ** 2) / 50) - Math.exp(-((i - 70) ** 2) / 50));
    const b = Float64Array.from({ length: 200 }, (_, i) => -(Math.exp(-((i - 72) ** 2) / 50) - Math.exp(-((i - 82) ** 2) / 50)));
    expect(crossCorrelate(a, b, 20)).toEqual({ lag: 12, r: expect.closeTo(-1, 2) });
  });
});

describe("micConsistency on generated multi-mic takes", () => {
  const clean: MicSample[] = [];
  for (const v of [60, 100, 127]) for (const rr of [1, 2]) clean.push(take(v, rr, "close"), take(v, rr, "overhead"));

  it("finds nothing wrong in consistent takes, with the overhead about 3 ms after the close mic", () => {
    const r = micConsistency(clean);
    expect(r.findings).toEqual([]);
    expect(r.series).toHaveLength(1);
    // 1.0 m at 343 m/s (speed of sound at 20 degrees C, common knowledge) = 2.92 ms for the left channel the
    // window holds; within 0.3 ms (the overhead's low-pass and room sound move the correlation peak a little)
    expect(Math.abs(r.series[0]!.medianOffsetMs - 2.92)).toBeLessThan(0.3);
    expect(r.series[0]!.takes.every((t) => t.polarity === 1)).toBe(true);
  });

  it("finds a take whose overhead was shifted by 2 ms, one whose overhead was flipped, and a missing overhead", () => {
    const planted = clean
      .filter((s) => s.id !== "ride-v100-rr2-overhead") // missing
      .map((s) => (s.id === "ride-v60-rr2-overhead" ? take(60, 2, "overhead", { shiftMs: 2 }) : s.id === "ride-v127-rr1-overhead" ? take(127, 1, "overhead", { flip: true }) : s));
    const r = micConsistency(planted);
    const by = (code: string) => r.findings.filter((f) => f.code === code);
    expect(by("mic-offset").map((f) => f.sampleIds)).toEqual([["ride-v60-rr2-overhead"]]);
    expect(by("mic-offset")[0]!.message).toMatch(/arrives 2\.0 ms later/);
    expect(by("mic-polarity").map((f) => f.sampleIds)).toEqual([["ride-v127-rr1-overhead"]]);
    expect(by("mic-missing")).toHaveLength(1);
    expect(by("mic-missing")[0]!.message).toMatch(/1 take has no overhead microphone \(v100 rr2\)/);
    expect(by("mic-missing")[0]!.sampleIds).toEqual(["ride-v100-rr2-close"]);
  });
});

describe("the demo library's multi-mic groups", () => {
  it("pass clean: kick close + room, crash, ride and china close + overhead", () => {
    const files = demoScenario().filter((f) => /^(Kick_22x18|Cymbals)\//.test(f.path) && !f.duplicateOf);
    const samples: CatalogueSampleInput[] = files.map((f) => {
      const bytes = renderScenarioFile(f);
      const r = measureWav(bytes);
      if (!r.ok) throw new Error(r.reason);
      return { id: f.path, path: f.path, sha256: crypto.createHash("sha256").update(bytes).digest("hex"), measurement: r.measurement };
    });
    const mic = catalogueSamples(samples).health.filter((h) => h.code.startsWith("mic-"));
    expect(mic).toEqual([]);
  }, 120_000);
});
