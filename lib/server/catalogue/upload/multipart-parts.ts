import "server-only";
// Every part of a multipart/form-data body, as its Content-Disposition header says, in order: busboy skips a
// part whose header it cannot read (a file name with a raw '"' in it, say) without a word, and one bad file must
// never vanish without an outcome. The upload feeds the body through this scanner as well, and asks busboy's own
// header reader which parts it will have skipped (intake.ts).
// RFC 2046 section 5.1.1: a part starts after CRLF "--" boundary, the rest of that line, then header lines up to
// an empty line; "--" right after the boundary closes the body.
import { parseContentType, parseDisposition } from "busboy/lib/utils.js";

/** Longest header block read (busboy refuses more than 16 KB of part headers, and the request fails). */
const MAX_HEADER_BYTES = 16 * 1024 + 1024;
const CRLFCRLF = Buffer.from("\r\n\r\n");

export interface PartHeader {
  /** The raw Content-Disposition value (header folding undone), or null when the part has none. */
  disposition: string | null;
  /** The raw Content-Type value, or null. */
  contentType: string | null;
}

export class PartHeaderScanner {
  private readonly delim: Buffer;
  /** Bytes at the end of what was searched, for a delimiter that spans two chunks. */
  private carry: Buffer;
  /** The header block being read, or null while in a part's body. */
  private header: Buffer[] | null = null;
  private headerBytes = 0;
  private closed = false;

  constructor(boundary: string, private readonly onPart: (p: PartHeader) => void) {
    this.delim = Buffer.from(`\r\n--${boundary}`, "latin1");
    this.carry = Buffer.from("\r\n"); // the first boundary opens the body without a CRLF before it
  }

  write(chunk: Buffer): void {
    let pos = 0;
    while (pos < chunk.length && !this.closed) {
      if (this.header) {
        pos = this.readHeader(chunk, pos);
        continue;
      }
      const found = this.findDelimiter(chunk, pos);
      if (found < 0) break;
      this.header = [];
      this.headerBytes = 0;
      pos = found;
    }
  }

  /** Index just after the next delimiter in chunk (from pos), or -1 (the carry is updated either way). */
  private findDelimiter(chunk: Buffer, pos: number): number {
    const d = this.delim.length;
    if (this.carry.length) {
      const seam = Buffer.concat([this.carry, chunk.subarray(pos, pos + d - 1)]);
      const i = seam.indexOf(this.delim);
      if (i >= 0 && i < this.carry.length) {
        const at = pos + i + d - this.carry.length; // seam[carry.length + k] is chunk[pos + k]
        this.carry = Buffer.alloc(0);
        return at;
      }
    }
    const j = chunk.indexOf(this.delim, pos);
    if (j >= 0) {
      this.carry = Buffer.alloc(0);
      return j + d;
    }
    const rest = chunk.subarray(pos);
    this.carry = rest.length >= d - 1 ? Buffer.from(rest.subarray(rest.length - (d - 1))) : Buffer.concat([this.carry, rest]).subarray(-(d - 1));
    return -1;
  }

  /** Reads header bytes from chunk at pos; returns the position after what it used. */
  private readHeader(chunk: Buffer, pos: number): number {
    const before = this.headerBytes;
    const take = chunk.subarray(pos, pos + Math.max(0, MAX_HEADER_BYTES - before));
    this.header!.push(take);
    this.headerBytes += take.length;
    const block = Buffer.concat(this.header!);
    // "--" right after the boundary: the closing delimiter, nothing after it is a part
    if (block.length >= 2 && block[0] === 0x2d && block[1] === 0x2d) {
      this.closed = true;
      return chunk.length;
    }
    const end = block.indexOf(CRLFCRLF, Math.max(0, before - 3));
    if (end < 0) {
      if (this.headerBytes >= MAX_HEADER_BYTES) {
        // too long to be a header busboy reads: the request fails there, nothing to add
        this.closed = true;
        return chunk.length;
      }
      return pos + take.length;
    }
    this.header = null;
    const head = block.subarray(0, end).toString("latin1");
    this.onPart({ disposition: headerOf(head, "content-disposition"), contentType: headerOf(head, "content-type") });
    this.carry = Buffer.from(block.subarray(Math.max(0, end + 4 - (this.delim.length - 1)), end + 4));
    return pos + (end + 4 - before);
  }
}

/** The first value of a header in a header block (its first line is the rest of the boundary line). */
function headerOf(block: string, name: string): string | null {
  const lines = block.replace(/\r\n[ \t]+/g, " ").split("\r\n").slice(1);
  for (const l of lines) {
    const i = l.indexOf(":");
    if (i > 0 && l.slice(0, i).trim().toLowerCase() === name) return l.slice(i + 1).trim();
  }
  return null;
}

/**
 * Whether busboy emits this part as a file, decided as busboy decides it (its own readers, busboy 1.6
 * lib/types/multipart.js): a readable form-data disposition, and a file name or the type application/octet-stream.
 */
export function busboyReadsAsFile(p: PartHeader): boolean {
  if (p.disposition === null) return false;
  const d = parseDisposition(p.disposition, (s: string) => s);
  if (!d || d.type !== "form-data") return false;
  if (d.params && ("filename" in d.params || "filename*" in d.params)) return true;
  const t = p.contentType ? parseContentType(p.contentType) : undefined;
  return !!t && `${t.type}/${t.subtype}` === "application/octet-stream";
}

/** Whether a part looks like a file at all (its header mentions a file name), readable or not. */
export function mentionsFile(disposition: string | null): boolean {
  return disposition !== null && /\bfilename\*?\s*=/i.test(disposition);
}

/**
 * A file name read leniently from a header busboy could not read: what stands between `filename="` and the
 * last '"' (so a raw '"' inside it is kept), with percent-encoded quotes and line breaks decoded as browsers
 * send them. Control characters are shown as "?".
 */
export function lenientFileName(disposition: string): string {
  const m = /\bfilename\s*=\s*"(.*)"/i.exec(disposition) ?? /\bfilename\s*=\s*([^;]*)/i.exec(disposition);
  const raw = Buffer.from(m?.[1] ?? "", "latin1").toString("utf8");
  return raw.replace(/%22/g, '"').replace(/[\u0000-\u001f\u007f]/g, "?").trim() || "(no name)";
}
