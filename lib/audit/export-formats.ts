// The export formats of an audit, as data: for each, the id the URL and the command line use, the label of the
// audit page's button, the media type, the file name extension, how the command line writes it, and the
// serializer. The export route, the audit page, the route's query schema and `kitwright audit` all read this
// list; a new format is one entry here (and its serializer beside it, with a test). Pure.

import { auditToCsv, auditToJson } from "./export";
import { auditToSmf } from "./smf";
import type { AuditResult } from "./types";

export interface ExportFormat {
  /** `?format=` of the export route, and the key of this list. */
  id: string;
  /** Text of the audit page's download button. */
  label: string;
  /** Content-Type of the download. */
  mediaType: string;
  /** File name extension, without the dot. */
  extension: string;
  /** How `kitwright audit` writes it: to standard output when its flag is given, or to the file the flag names. */
  cli: { flag: string; to: "stdout" } | { flag: string; to: "file"; placeholder: string };
  serialize(result: AuditResult): string | Uint8Array;
}

export const EXPORT_FORMATS = [
  {
    id: "csv",
    label: "CSV",
    mediaType: "text/csv; charset=utf-8",
    extension: "csv",
    cli: { flag: "--csv", to: "stdout" },
    serialize: auditToCsv,
  },
  {
    id: "json",
    label: "JSON",
    mediaType: "application/json",
    extension: "json",
    cli: { flag: "--json", to: "stdout" },
    serialize: (result: AuditResult) => JSON.stringify(auditToJson(result), null, 2),
  },
  {
    id: "midi",
    label: "MIDI file",
    mediaType: "audio/midi",
    extension: "mid",
    cli: { flag: "--smf", to: "file", placeholder: "<out.mid>" },
    serialize: (result: AuditResult) => auditToSmf(result),
  },
] as const satisfies readonly ExportFormat[];

export type ExportFormatId = (typeof EXPORT_FORMATS)[number]["id"];

/** Every format id, in the list's order (a non-empty tuple, as z.enum wants it). */
export const EXPORT_FORMAT_IDS = EXPORT_FORMATS.map((f) => f.id) as [ExportFormatId, ...ExportFormatId[]];

export function exportFormat(id: ExportFormatId): ExportFormat {
  return EXPORT_FORMATS.find((f) => f.id === id)!;
}

/** The download's file name: `<base>.<extension>`. */
export function exportFileName(format: ExportFormat, base: string): string {
  return `${base}.${format.extension}`;
}
