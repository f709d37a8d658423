// The sound model's features are level-free: a file 30 dB quieter (same samples times a gain, re-encoded at
// 24 bits) gives the same vector (within 5 % of the value or 0.05: the faint tail of a soft hit meets the
// 24-bit steps), so the model reads a soft copy and a loud copy by their sound alone.
// (lib/audio's MFCCs, taken of log(1 + energy), fail this: they are not among the features.)
import { describe, expect, it } from "vitest";
import { decodeWav, encodeWav, measureBytes } from "../audio";
import { demoScenario } from "../synth/scenario";
import { renderScenarioFile } from "../synth/render";
import { SOUND_FEATURE_NAMES, soundFeatures } from "./sound-features";

describe("sound features do not move with the file's gain", () => {
  const files = demoScenario({ seed: 1 }).filter((f) => !f.post && !f.duplicateOf && f.truth.roundRobin === 1);
  const picks = ["kick", "snare", "tom", "hi-hat", "ride", "crash", "cowbell"].map((fam) => files.find((f) => f.truth.family === fam)!).filter(Boolean);
  for (const f of picks) {
    it(`${f.truth.family} (${f.path}) at -30 dB`, () => {
      const d = decodeWav(renderScenarioFile(f));
      const at = (g: number) => soundFeatures(measureBytes(encodeWav(d.channels.map((c) => c.map((x) => x * 10 ** (g / 20))), { sampleRate: d.format.sampleRate, bits: 24 })));
      const loud = at(0), quiet = at(-30);
      SOUND_FEATURE_NAMES.forEach((name, i) => {
        expect(Math.abs(quiet[i]! - loud[i]!), name).toBeLessThanOrEqual(0.05 * Math.max(1, Math.abs(loud[i]!)));
      });
    });
  }
});
