// Sample-level statistics of a one-shot: sample peak, RMS and crest factor (handbook definitions:
// RMS = sqrt(mean x^2), crest = peak / RMS in dB), DC offset (mean), clipped runs (consecutive samples at
// full scale) and stereo correlation (zero-lag normalised cross-correlation, as a phase-correlation meter).

/** Levels of silence are reported as this many dB instead of -Infinity (JSON-safe); real 24-bit floors are near -144 dB. */
export const SILENCE_DB = -200;

export function toDb(linear: number): number {
  return linear > 0 ? Math.max(SILENCE_DB, 20 * Math.log10(linear)) : SILENCE_DB;
}

export interface Levels {
  samplePeak: number; // linear, all channels
  rms: number; // linear, over all channels and samples
  dcOffset: number; // mean of the channel with the largest |mean|
  clippedRuns: number;
  clippedSamples: number;
  loudestChannel: number; // index of the channel holding the sample peak
  perChannel: { peak: number; rms: number; dc: number; clippedRuns: number; blockMax: Float64Array }[];
}

export const MIN_CLIP_RUN = 3;
/** Block length of the per-channel maxima handed to the true-peak search (saves it a pass over the samples). */
export const PEAK_BLOCK = 64;

export function levels(channels: ArrayLike<number>[], clipLevel = 1): Levels {
  let peak = 0, sumSq = 0, count = 0, dc = 0, runs = 0, clipped = 0, loudest = 0;
  const perChannel: Levels["perChannel"] = [];
  const hi = clipLevel - 1e-9;
  for (let ci = 0; ci < channels.length; ci++) {
    const x = channels[ci];
    let sum = 0, run = 0, chPeak = 0, chSq = 0, chRuns = 0;
    const n = x.length;
    const blockMax = new Float64Array(Math.ceil(n / PEAK_BLOCK));
    for (let b = 0; b < blockMax.length; b++) {
      let bm = 0;
      const end = Math.min(n, (b + 1) * PEAK_BLOCK);
      for (let i = b * PEAK_BLOCK; i < end; i++) {
        const v = x[i];
        const a = v < 0 ? -v : v;
        if (a > bm) bm = a;
        sum += v;
        chSq += v * v;
        if (v >= hi || v <= -1) run++;
        else if (run) {
          if (run >= MIN_CLIP_RUN) (chRuns++, (clipped += run));
          run = 0;
        }
      }
      blockMax[b] = bm;
      if (bm > chPeak) chPeak = bm;
    }
    if (run >= MIN_CLIP_RUN) (chRuns++, (clipped += run));
    runs += chRuns;
    sumSq += chSq;
    if (chPeak > peak) { peak = chPeak; loudest = ci; }
    count += n;
    const mean = n ? sum / n : 0;
    if (Math.abs(mean) > Math.abs(dc)) dc = mean;
    perChannel.push({ peak: chPeak, rms: n ? Math.sqrt(chSq / n) : 0, dc: mean, clippedRuns: chRuns, blockMax });
  }
  return { samplePeak: peak, rms: count ? Math.sqrt(sumSq / count) : 0, dcOffset: dc, clippedRuns: runs, clippedSamples: clipped, loudestChannel: loudest, perChannel };
}

/** sum(LR) / sqrt(sum(L^2) sum(R^2)) of the first two channels; null for mono or when a channel is silent. */
export function stereoCorrelation(channels: ArrayLike<number>[]): number | null {
  if (channels.length < 2) return null;
  const l = channels[0], r = channels[1];
  let lr = 0, ll = 0, rr = 0;
  for (let i = 0; i < l.length; i++) {
    lr += l[i] * r[i];
    ll += l[i] * l[i];
    rr += r[i] * r[i];
  }
  if (ll === 0 || rr === 0) return null;
  return lr / Math.sqrt(ll * rr);
}

/** Stereo correlation of the first two channels and the mono mix (mean of all channels) in one pass. */
export function correlationAndMono(channels: Float32Array[]): { correlation: number | null; mono: Float32Array } {
  if (channels.length === 1) return { correlation: null, mono: channels[0] };
  const n = channels[0].length;
  const mono = new Float32Array(n);
  const l = channels[0], r = channels[1];
  let lr = 0, ll = 0, rr = 0;
  if (channels.length === 2) {
    for (let i = 0; i < n; i++) {
      const a = l[i], b = r[i];
      lr += a * b; ll += a * a; rr += b * b;
      mono[i] = 0.5 * (a + b);
    }
  } else {
    const g = 1 / channels.length;
    for (let i = 0; i < n; i++) { const a = l[i], b = r[i]; lr += a * b; ll += a * a; rr += b * b; }
    for (const x of channels) for (let i = 0; i < n; i++) mono[i] += x[i] * g;
  }
  return { correlation: ll === 0 || rr === 0 ? null : lr / Math.sqrt(ll * rr), mono };
}
