import "server-only";
// The relative path an uploaded file is kept under (from a multipart file name or a zip entry name).

/** Longest relative path kept (characters). */
export const MAX_PATH = 1000;

/**
 * Relative path of an uploaded file: "/" separators, no empty, "." or ".." parts, not absolute, no drive
 * letters. Returns null when the path tries to leave its folder.
 */
export function cleanRelPath(raw: string): string | null {
  const p = raw.replace(/\\/g, "/");
  if (p.startsWith("/") || /^[a-zA-Z]:/.test(p) || p.includes("\0")) return null;
  const parts = p.split("/").filter((x) => x !== "" && x !== ".");
  if (!parts.length || parts.some((x) => x === "..")) return null;
  const out = parts.join("/");
  return out.length > MAX_PATH ? null : out;
}
