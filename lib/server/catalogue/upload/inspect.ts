import "server-only";
// Inspection of one incoming file while it streams past, never held in memory: its first bytes (a WAV as
// lib/audio's sniffWav reads them, RF64 refused; a zip pack by its signature), its SHA-256 and size, and the
// size limit (per file, or the batch's for a pack).
import crypto from "node:crypto";
import { Transform, type TransformCallback } from "node:stream";
import { SNIFF_BYTES, sniffWav } from "@/lib/audio/sniff";
import { mb, Refusal } from "./outcome";

/**
 * Bytes each stage of an upload (parser, file stream, hash) may hold ahead of the next. With Node's 16 KB
 * defaults the request waited on every disk write in turn; 256 KB per stage, with the 1 MB file write buffer in
 * storage.ts, keeps the socket, the hash and the disk busy at once. Larger stages gained nothing more and left
 * more memory to the garbage collector (bench/RESULTS.md, "Measurements behind design choices").
 */
export const STREAM_BUFFER = 256 * 1024;

/** A zip pack starts with a local file header, signature PK\x03\x04 (PKWARE APPNOTE.TXT section 4.3.7). */
export function isZipHead(head: Uint8Array): boolean {
  return head.length >= 4 && head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04;
}

/** Why the first bytes of a file are not what was wanted (null: they are). */
export function headRefusal(want: "wav" | "zip", head: Uint8Array): Refusal | null {
  if (want === "zip") return isZipHead(head) ? null : new Refusal("not-zip", "not a zip pack (its first bytes are not PK\\x03\\x04)");
  const kind = sniffWav(head).kind;
  if (kind === "wav") return null;
  if (kind === "rf64") return new Refusal("rf64", "RF64/BW64 (64-bit RIFF, EBU Tech 3306) files are not supported; export as a plain RIFF WAVE");
  if (head.length === 0) return new Refusal("empty", "the file is empty");
  return new Refusal("not-wav", "not a WAV file (its first bytes are not RIFF....WAVE)");
}

/** Passes bytes through while hashing, counting, enforcing a size limit and checking the magic bytes. */
export class Inspect extends Transform {
  readonly hash = crypto.createHash("sha256");
  bytes = 0;
  private head = Buffer.alloc(0);
  private checked = false;
  constructor(private readonly want: "wav" | "zip", private readonly maxBytes: number, private readonly onBytes: (n: number) => void) {
    super({ highWaterMark: STREAM_BUFFER });
  }
  private check(final: boolean): Error | null {
    if (this.checked || (!final && this.head.length < SNIFF_BYTES)) return null;
    this.checked = true;
    return headRefusal(this.want, this.head);
  }
  _transform(chunk: Buffer, _enc: BufferEncoding, cb: TransformCallback): void {
    this.bytes += chunk.length;
    this.onBytes(chunk.length);
    if (this.bytes > this.maxBytes) return cb(new Refusal("too-large", `larger than the ${mb(this.maxBytes)} limit per file`));
    if (!this.checked) {
      this.head = Buffer.concat([this.head, chunk.subarray(0, SNIFF_BYTES)]);
      const err = this.check(false);
      if (err) return cb(err);
    }
    this.hash.update(chunk);
    cb(null, chunk);
  }
  _flush(cb: TransformCallback): void {
    cb(this.check(true));
  }
}
