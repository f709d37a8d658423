import "server-only";
// A file download response with a safe attachment file name (ASCII fallback plus RFC 6266 filename*).
export function attachment(body: string | Uint8Array, type: string, fileName: string): Response {
  const ascii = fileName.replace(/[^A-Za-z0-9._ -]+/g, "_").replace(/\s+/g, "-").slice(0, 120) || "download";
  return new Response(body as BodyInit, {
    status: 200,
    headers: {
      "content-type": type,
      "content-disposition": `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`,
      "cache-control": "no-store",
    },
  });
}
