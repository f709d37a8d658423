// The committed trained sound model (sound-model.data.ts, made by `npm run train:sound`), parsed once on first use.

import { SOUND_MODEL_JSON } from "./sound-model.data";
import { SOUND_MODEL_FORMAT, type SoundModel } from "./sound-model";

let cached: SoundModel | null = null;

export function trainedSoundModel(): SoundModel {
  if (!cached) {
    const m = JSON.parse(SOUND_MODEL_JSON) as SoundModel;
    if (m.format !== SOUND_MODEL_FORMAT) throw new Error(`the committed sound model has format ${m.format}, this code reads ${SOUND_MODEL_FORMAT}: run npm run train:sound`);
    cached = m;
  }
  return cached;
}
