// Renders one scenario file to WAV bytes: synthesize the take, apply the file's deliberate damage (if any),
// encode. Pure: no file system.

import { renderSound, NOISE_FLOOR_DBFS } from "./drums";
import { rngFromKey } from "./rng";
import type { ScenarioFile } from "./scenario";
import { encodeWav } from "./wav";

/** The channels of a scenario file after its deliberate damage, before encoding. */
export function renderScenarioChannels(f: ScenarioFile): Float32Array[] {
  let chs = renderSound(f.sound, {
    sampleRate: f.sampleRate, velocity: f.velocity, seed: f.seed, mic: f.mic, channels: f.channels, seconds: f.seconds,
  });
  const post = f.post;
  if (post?.clipGainDb !== undefined) {
    // driven into the converter: hard clipping at full scale
    const g = Math.pow(10, post.clipGainDb / 20);
    chs = chs.map((c) => c.map((x) => Math.max(-1, Math.min(1, x * g))));
  }
  if (post?.leadingSilenceMs !== undefined) {
    // the recorder started early: room noise (at the noise floor) before the strike, same total length kept + lead
    const lead = Math.round((post.leadingSilenceMs / 1000) * f.sampleRate);
    const rng = rngFromKey(`${f.seed}:lead`);
    const floor = Math.pow(10, NOISE_FLOOR_DBFS / 20);
    chs = chs.map((c) => {
      const out = new Float32Array(c.length + lead);
      for (let i = 0; i < lead; i++) out[i] = floor * (rng.next() - 0.5) * 3.4;
      out.set(c, lead);
      return out;
    });
  }
  if (post?.truncateAtSec !== undefined) {
    const n = Math.round(post.truncateAtSec * f.sampleRate);
    chs = chs.map((c) => c.slice(0, n));
  }
  return chs;
}

/** WAV bytes of a scenario file. */
export function renderScenarioFile(f: ScenarioFile): Uint8Array {
  return encodeWav(renderScenarioChannels(f), { sampleRate: f.sampleRate, bits: f.bits });
}
