// What the first bytes of a file say it is, as far as a WAV reader cares: a RIFF/WAVE file (RIFF 1991: the
// 'RIFF' chunk id, a size, then the form type 'WAVE'), an RF64 or BW64 file (the 64-bit RIFF of EBU Tech 3306
// and ITU-R BS.2088, refused here), a big-endian RIFX file, a RIFF of another form, or something else. Used by
// the decoder on a whole file and by the upload on the first bytes of a stream, so both refuse the same files.

import { fourcc } from "./chunks";

/** Bytes sniffWav needs to tell every kind apart (chunk id, size, form type). */
export const SNIFF_BYTES = 12;

export type WavSniff =
  | { kind: "wav" }
  | { kind: "rf64"; magic: "RF64" | "BW64" }
  | { kind: "rifx" }
  | { kind: "not-wave"; form: string } // a RIFF file of another form type (AVI, RMID ...)
  | { kind: "not-riff"; magic: string } // the first four bytes are no RIFF chunk id
  | { kind: "short" }; // too few bytes to tell (fewer than 4, or a 'RIFF' id without its form type)

/** Classifies the first bytes of a file (any length; SNIFF_BYTES are enough). Pure, never throws. */
export function sniffWav(head: Uint8Array): WavSniff {
  const magic = fourcc(head, 0);
  if (magic === "RF64" || magic === "BW64") return { kind: "rf64", magic };
  if (magic === "RIFX") return { kind: "rifx" };
  if (magic === "RIFF") {
    if (head.length < SNIFF_BYTES) return { kind: "short" };
    const form = fourcc(head, 8);
    return form === "WAVE" ? { kind: "wav" } : { kind: "not-wave", form };
  }
  return head.length < 4 ? { kind: "short" } : { kind: "not-riff", magic };
}
