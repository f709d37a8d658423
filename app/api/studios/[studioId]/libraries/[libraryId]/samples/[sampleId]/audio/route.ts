// GET /api/studios/:studioId/libraries/:libraryId/samples/:sampleId/audio – the stored WAV, with HTTP Range
// support (RFC 9110 §14: one byte range → 206 with Content-Range; unsatisfiable → 416 with "bytes */size").
import { Readable } from "node:stream";
import { route } from "@/lib/server/route";
import { sampleFile } from "@/lib/server/catalogue/samples";
import { storage } from "@/lib/server/storage";
import { sampleParams } from "@/lib/validation/library";

/** Parses a single "bytes=a-b" / "bytes=a-" / "bytes=-n" range; "invalid" when unsatisfiable, null when absent or not one range. */
function parseRange(h: string | null, size: number): { start: number; end: number } | "invalid" | null {
  if (!h) return null;
  const m = /^bytes=(\d*)-(\d*)$/.exec(h.trim());
  if (!m) return null; // several ranges or another unit: answer with the whole file
  const [, a, b] = m;
  if (a === "" && b === "") return "invalid";
  let start: number, end: number;
  if (a === "") {
    const n = Number(b);
    if (n === 0) return "invalid";
    start = Math.max(0, size - n);
    end = size - 1;
  } else {
    start = Number(a);
    end = b === "" ? size - 1 : Math.min(Number(b), size - 1);
  }
  if (start >= size || start > end) return "invalid";
  return { start, end };
}

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: sampleParams }, async ({ studio, params, req }) => {
  const f = await sampleFile({ studioId: studio.id, libraryId: params.libraryId, sampleId: params.sampleId });
  const size = (await storage().size(f.key)) ?? f.size;
  const base = {
    "accept-ranges": "bytes",
    "content-type": "audio/wav",
    "cache-control": "private, max-age=3600",
    "content-disposition": `inline; filename="${f.fileName.replace(/[^\w.\- ]/g, "_")}"`,
  };
  const range = parseRange(req.headers.get("range"), size);
  if (range === "invalid") return new Response(null, { status: 416, headers: { ...base, "content-range": `bytes */${size}` } });
  const stream = await storage().getStream(f.key, range ?? undefined);
  const body = Readable.toWeb(stream) as unknown as ReadableStream<Uint8Array>;
  if (!range) return new Response(body, { status: 200, headers: { ...base, "content-length": String(size) } });
  return new Response(body, { status: 206, headers: { ...base, "content-length": String(range.end - range.start + 1), "content-range": `bytes ${range.start}-${range.end}/${size}` } });
});
