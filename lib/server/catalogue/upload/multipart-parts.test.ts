// The part-header scanner against hand-written multipart bodies (RFC 2046 section 5.1.1 delimiters, RFC 7578
// form-data parts), cut into chunks at every possible place.
import { describe, expect, it } from "vitest";
import { busboyReadsAsFile, lenientFileName, mentionsFile, PartHeaderScanner, type PartHeader } from "./multipart-parts";

const B = "----kwBoundary7";
const part = (disp: string, body: string) => `--${B}\r\nContent-Disposition: ${disp}\r\nContent-Type: application/octet-stream\r\n\r\n${body}\r\n`;
const body =
  part('form-data; name="file"; filename="one.wav"', "RIFF....WAVE one\r\n--not-the-boundary") +
  part('form-data; name="file"; filename="a"b.wav"', "RIFF two") +
  `--${B}\r\nContent-Disposition: form-data;\r\n name="note"\r\n\r\nhello\r\n` +
  part('form-data; name="file"; filename="three.wav"', "") +
  `--${B}--\r\nepilogue --${B}\r\nContent-Disposition: form-data; name="x"; filename="after-close.wav"\r\n\r\n`;

function scan(chunks: Buffer[]): (string | null)[] {
  return scanParts(chunks).map((p) => p.disposition);
}
function scanParts(chunks: Buffer[]): PartHeader[] {
  const seen: PartHeader[] = [];
  const s = new PartHeaderScanner(B, (p) => seen.push(p));
  for (const c of chunks) s.write(c);
  return seen;
}

const expected = ['form-data; name="file"; filename="one.wav"', 'form-data; name="file"; filename="a"b.wav"', 'form-data; name="note"', 'form-data; name="file"; filename="three.wav"'];

describe("part header scanner", () => {
  it("finds every part's Content-Disposition in order, folded lines joined, nothing after the closing delimiter", () => {
    expect(scan([Buffer.from(body)])).toEqual(expected);
  });

  it("reads the same whatever the chunks (every split into two, and single bytes)", () => {
    const all = Buffer.from(body);
    for (let i = 1; i < all.length; i++) expect(scan([all.subarray(0, i), all.subarray(i)]), `split at ${i}`).toEqual(expected);
    expect(scan([...all].map((b) => Buffer.from([b])))).toEqual(expected);
  });

  it("tells which parts busboy reads as files (its own header reader) and which it would drop", () => {
    const parts = scanParts([Buffer.from(body)]);
    expect(parts.map((p) => p.contentType)).toEqual(["application/octet-stream", "application/octet-stream", null, "application/octet-stream"]);
    expect(parts.map(busboyReadsAsFile)).toEqual([true, false, false, true]);
    expect(expected.map(mentionsFile)).toEqual([true, true, false, true]);
    expect(busboyReadsAsFile({ disposition: "form-data; name=\"file\"; filename*=UTF-8''a%22b.wav", contentType: null })).toBe(true);
    // no file name, but typed as bytes: busboy hands it over as a file all the same
    expect(busboyReadsAsFile({ disposition: 'form-data; name="blob"', contentType: "Application/Octet-Stream" })).toBe(true);
    expect(busboyReadsAsFile({ disposition: 'form-data; name="note"', contentType: "text/plain" })).toBe(false);
    expect(busboyReadsAsFile({ disposition: null, contentType: null })).toBe(false);
  });

  it("reads a file name leniently from a header busboy cannot read", () => {
    expect(lenientFileName('form-data; name="file"; filename="a"b.wav"')).toBe('a"b.wav');
    expect(lenientFileName('form-data; name="file"; filename="Kit/"quoted" snare.wav"')).toBe('Kit/"quoted" snare.wav');
    expect(lenientFileName('form-data; filename="x\u0001y.wav"')).toBe("x?y.wav");
    expect(lenientFileName('form-data; name="file"; filename=')).toBe("(no name)");
  });
});
