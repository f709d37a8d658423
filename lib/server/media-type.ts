import "server-only";
// Content-Type headers read as media types (RFC 9110 section 8.3.1): type and subtype compared in lower case,
// parameters apart, so "APPLICATION/JSON" is JSON and "text/plain; charset=application/json" is not.
import { parse as parseContentType } from "content-type";

const TOKEN = "[!#$%&'*+.^_`|~0-9a-z-]+";
const TYPE = new RegExp(`^${TOKEN}/${TOKEN}$`);

/** The media type of a Content-Type header, lower-cased, with its parameters; null when absent or unreadable. */
export function mediaType(header: string | null): { type: string; parameters: Record<string, string> } | null {
  if (!header) return null;
  try {
    const { type, parameters } = parseContentType(header);
    return TYPE.test(type) ? { type, parameters } : null;
  } catch {
    return null;
  }
}
