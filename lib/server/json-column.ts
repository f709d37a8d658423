import "server-only";
// Reading JSON columns. MariaDB's JSON type is an alias of LONGTEXT with a JSON_VALID check (MariaDB
// Knowledge Base, "JSON Data Type"), so mysql2 hands every JSON column back as a string; a value that is already
// parsed (a row built in code) or SQL NULL passes through. Every server module and the demo seed read JSON
// columns through these two functions.

/** The parsed value of a JSON column (SQL NULL reads as null). Throws on text that is not JSON. */
export function jsonColumn<T = unknown>(v: unknown): T {
  return (v == null ? null : typeof v === "string" ? JSON.parse(v) : v) as T;
}

/** As jsonColumn, but text that is not JSON reads as null (for readers that report such a row themselves). */
export function jsonColumnOrNull<T = unknown>(v: unknown): T | null {
  try {
    return jsonColumn<T>(v);
  } catch {
    return null;
  }
}
