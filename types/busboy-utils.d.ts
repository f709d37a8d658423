// busboy's own Content-Disposition reader (lib/utils.js; busboy has no "exports" map, so the file can be
// required): the upload asks it which parts busboy will read (lib/server/catalogue/upload/multipart-parts.ts).
declare module "busboy/lib/utils.js" {
  export function parseContentType(str: string): { type: string; subtype: string; params: Record<string, string> } | undefined;
  export function parseDisposition(str: string, decoder: (data: string, hint?: number) => string): { type: string; params?: Record<string, string> } | undefined;
}
