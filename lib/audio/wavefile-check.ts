// Cross-check of our WAV reader against wavefile (the general-purpose reference reader): the fmt fields
// and every sample must agree. Used by the tests and by `kitwright measure --verify`; not in the hot path
// (see decode.ts for why). Files with more than 4 LIST chunks are not handed to wavefile, whose chunk
// index time doubles with each LIST chunk.
import * as wavefileNs from "wavefile";
import type { DecodedWav } from "./decode";
import { walkChunks } from "./chunks";

type WaveFileLike = {
  fromBuffer(b: Uint8Array, samples?: boolean): void;
  getSamples(interleaved?: boolean, Out?: unknown): Float64Array | Float64Array[];
  fmt: { audioFormat: number; numChannels: number; sampleRate: number; bitsPerSample: number; blockAlign: number; subformat?: number[] };
  bitDepth: string;
};
const ns = wavefileNs as unknown as { WaveFile?: new () => WaveFileLike; default?: { WaveFile: new () => WaveFileLike } };
export const WaveFile: new () => WaveFileLike = (ns.WaveFile ?? ns.default!.WaveFile) as new () => WaveFileLike;

/** wavefile's raw sample values scaled to floats the way decode.ts does (8-bit unsigned: minus 128). */
export function wavefileFloats(wf: WaveFileLike): Float32Array[] {
  const raw = wf.getSamples(false);
  const chans = (wf.fmt.numChannels === 1 ? [raw] : raw) as Float64Array[];
  const code = wf.bitDepth;
  const bits = parseInt(code, 10);
  const isFloat = code === "32f" || code === "64";
  // wavefile reads an extensible header with the IEEE float SubFormat as 32-bit integers: reinterpret the bits.
  const extFloat32 = !isFloat && bits === 32 && wf.fmt.audioFormat === 0xfffe && wf.fmt.subformat?.[0] === 3;
  const i32 = new Int32Array(1), f32 = new Float32Array(i32.buffer);
  const asFloat = (v: number) => ((i32[0] = v), f32[0]);
  return chans.map((c) => Float32Array.from(c, (v) => (isFloat ? v : extFloat32 ? asFloat(v) : bits === 8 ? (v - 128) / 128 : v / 2 ** (bits - 1))));
}

export function crossCheckWithWavefile(bytes: Uint8Array, decoded: DecodedWav): string[] {
  const lists = walkChunks(bytes).filter((c) => c.id === "LIST").length;
  if (lists > 4) return [`not cross-checked with wavefile: ${lists} LIST chunks`];
  const problems: string[] = [];
  let wf: WaveFileLike;
  try {
    wf = new WaveFile();
    wf.fromBuffer(bytes);
  } catch (e) {
    return [`wavefile could not read the file: ${(e as Error).message}`];
  }
  const f = decoded.format;
  if (wf.fmt.numChannels !== f.channels) problems.push(`channels: ours ${f.channels}, wavefile ${wf.fmt.numChannels}`);
  if (wf.fmt.sampleRate !== f.sampleRate) problems.push(`sample rate: ours ${f.sampleRate}, wavefile ${wf.fmt.sampleRate}`);
  if (wf.fmt.bitsPerSample !== f.bitsPerSample) problems.push(`bits: ours ${f.bitsPerSample}, wavefile ${wf.fmt.bitsPerSample}`);
  if (problems.length) return problems;
  const theirs = wavefileFloats(wf);
  let diff = 0;
  decoded.channels.forEach((ch, c) => {
    const t = theirs[c];
    const n = Math.min(ch.length, t.length);
    for (let i = 0; i < n; i++) if (ch[i] !== t[i] && !(Number.isNaN(t[i]) && ch[i] === 0)) diff++;
    if (t.length < ch.length) diff += ch.length - t.length;
  });
  if (diff) problems.push(`${diff} samples differ from wavefile's reading`);
  return problems;
}
