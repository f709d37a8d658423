// Why a WAV file is refused (RIFF/WAVE per the 1991 RIFF spec, RF64 per EBU Tech 3306): a stable code for
// programs and a human message naming the specific problem.
export type WavRefusalCode =
  | "not-riff" // not a RIFF/WAVE file at all (or big-endian RIFX)
  | "rf64" // RF64 / BW64 64-bit container (EBU Tech 3306), not supported
  | "compressed" // a format tag other than PCM or IEEE float (ADPCM, A-law, mu-law, MPEG ...)
  | "bad-header" // inconsistent fmt: 0 channels, 0 Hz, block align or byte rate that do not match, bad bit depth
  | "unsupported" // consistent but outside what we accept (more than 8 channels, rate outside 8-192 kHz)
  | "no-frames" // the data chunk holds no whole sample frame
  | "data-missing" // no data chunk, or it claims far more bytes than the file has
  | "too-long"; // longer than the one-shot limit

export class WavRefusal extends Error {
  readonly code: WavRefusalCode;
  constructor(code: WavRefusalCode, message: string) {
    super(message);
    this.name = "WavRefusal";
    this.code = code;
  }
}

export function isWavRefusal(e: unknown): e is WavRefusal {
  return e instanceof WavRefusal || (e instanceof Error && e.name === "WavRefusal" && typeof (e as WavRefusal).code === "string");
}
