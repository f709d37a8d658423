// The export registry: every format serializes a real audit into what its media type promises. CSV per RFC 4180
// (header line of CSV_COLUMNS, CRLF line ends; media type text/csv, RFC 4180 section 3); JSON per RFC 8259 read back by
// parseAuditJson (media type application/json, RFC 8259 section 11); the MIDI file starts with the header chunk
// "MThd" of length 6 (Standard MIDI Files 1.0); "audio/midi" for .mid is common practice (no IANA registration).
import { describe, expect, it } from "vitest";
import { runAudit } from "./audit";
import { CSV_COLUMNS, parseAuditJson } from "./export";
import { EXPORT_FORMAT_IDS, EXPORT_FORMATS, exportFileName, exportFormat } from "./export-formats";
import { buildDefaultKit } from "./kits";
import { getTemplate } from "./templates";
import { testCatalogue } from "./test-catalogue";

const cat = testCatalogue();
const layout = getTemplate("grid-24")!;
const audit = runAudit(layout, buildDefaultKit(layout, cat), cat);

describe("export formats", () => {
  it("lists csv, json and midi with unique ids, extensions and command-line flags", () => {
    expect(EXPORT_FORMAT_IDS).toEqual(["csv", "json", "midi"]);
    expect(new Set(EXPORT_FORMATS.map((f) => f.extension)).size).toBe(EXPORT_FORMATS.length);
    expect(new Set(EXPORT_FORMATS.map((f) => f.cli.flag)).size).toBe(EXPORT_FORMATS.length);
    expect(EXPORT_FORMATS.map((f) => f.mediaType)).toEqual(["text/csv; charset=utf-8", "application/json", "audio/midi"]);
  });

  it("CSV: the RFC 4180 header line, then one CRLF-ended line per conflict, empty slot, pad and pedal item", () => {
    const csv = exportFormat("csv").serialize(audit) as string;
    const lines = csv.split("\r\n");
    expect(lines[0]).toBe(CSV_COLUMNS.join(","));
    expect(lines.at(-1)).toBe("");
    expect(audit.emptySlots).toHaveLength(2);
    expect(lines.length - 2).toBe(audit.conflicts.length + audit.emptySlots.length + audit.pads.length + (audit.pedal ? audit.pedal.zones.length + (audit.pedal.chick ? 1 : 0) : 0));
  });

  it("JSON: kitwright.audit/v3 that reads back to the same audit", () => {
    const text = exportFormat("json").serialize(audit) as string;
    expect(parseAuditJson(text)).toEqual(audit);
    expect(text.startsWith('{\n  "schema": "kitwright.audit/v3"')).toBe(true);
  });

  it("MIDI: a Standard MIDI File (MThd, header length 6, format 1, two tracks)", () => {
    const smf = exportFormat("midi").serialize(audit) as Uint8Array;
    expect(String.fromCharCode(...smf.subarray(0, 4))).toBe("MThd");
    expect([...smf.subarray(4, 14)]).toEqual([0, 0, 0, 6, 0, 1, 0, 2, 0x01, 0xe0]);
    expect(String.fromCharCode(...smf.subarray(14, 18))).toBe("MTrk");
  });

  it("names the download after its extension", () => {
    expect(exportFileName(exportFormat("midi"), "audit-Grid-2026-01-02")).toBe("audit-Grid-2026-01-02.mid");
    expect(exportFileName(exportFormat("csv"), "a")).toBe("a.csv");
  });
});
