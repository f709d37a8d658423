// Public API of the audio engine (pure TypeScript: bytes in, plain objects out).
export type { Measurement, WavFormat, SpectralSummary, TailState } from "./types";
export { MEASURE_VERSION } from "./version";
export { WavRefusal, isWavRefusal, type WavRefusalCode } from "./refusal";
export { sniffWav, SNIFF_BYTES, type WavSniff } from "./sniff";
export { decodeWav, DEFAULT_MAX_SECONDS, DEFAULT_MAX_MISSING_FRACTION, type DecodedWav, type DecodeOptions } from "./decode";
export type { WavMetadata, BextChunk, SmplChunk, SmplLoop, InstChunk, CuePoint } from "./chunks";
export { measure, measureBytes, type MeasuredFile } from "./measure";
export { measureWav, PEAK_BUCKETS, type MeasureOutcome, type MeasureWavOptions, type Peaks } from "./measure-wav";
export { computePeaks } from "./peaks";
export { encodeWav, type EncodeOptions } from "./encode";
export { SILENCE_DB } from "./levels";
