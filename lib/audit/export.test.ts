import { describe, expect, it } from "vitest";
import { AUDIT_SCHEMA, CSV_COLUMNS, auditToCsv, auditToJson, csvField, diffAudits, parseAuditJson } from "./export";
import { runAudit } from "./audit";
import { buildDefaultKit } from "./kits";
import { getTemplate } from "./templates";
import { evenLayers, instrument, testCatalogue } from "./test-catalogue";
import { parseCatalogueFile, parseKitFile, parseLayoutFile, SchemaError, kitToFile, catalogueToFile } from "./schema";

const cat = testCatalogue();
const layout = getTemplate("grid-24")!;
const audit = runAudit(layout, buildDefaultKit(layout, cat), cat);

/** A small RFC 4180 reader (quoted fields, doubled quotes, CRLF), written from the RFC's grammar. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = "";
  let q = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (q) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') q = false;
      else field += c;
    } else if (c === '"') q = true;
    else if (c === ",") {
      row.push(field);
      field = "";
    } else if (c === "\r" && text[i + 1] === "\n") {
      row.push(field);
      rows.push(row);
      row = [];
      field = "";
      i++;
    } else field += c;
  }
  return rows;
}

describe("CSV export (RFC 4180 quoting)", () => {
  const rows = readCsv(auditToCsv(audit));
  it("header, conflicts first (none here), the empty slots once each, then one row per pad", () => {
    expect(audit.conflicts).toEqual([]);
    expect(rows[0]).toEqual([...CSV_COLUMNS]);
    expect(rows.slice(1, 3).map((r) => [r[0], r[1], r[2], r[8]])).toEqual([["empty-slot", "splash", "r1c5", "Splash"], ["empty-slot", "crash-2", "r1c6", "Crash 2"]]);
    expect(rows.slice(3).map((r) => r[0])).toEqual(Array(24).fill("pad"));
    expect(rows.every((r) => r.length === CSV_COLUMNS.length)).toBe(true);
  });
  it("a stand-in row carries path, cost, layers, gaps and round robins", () => {
    const col = (name: (typeof CSV_COLUMNS)[number]) => CSV_COLUMNS.indexOf(name);
    const half = rows.find((r) => r[2] === "Snare half-edge")!;
    expect([half[col("outcome")], half[col("plays")], half[col("path")], half[col("cost")]]).toEqual(["stand-in", "centre", "half-edge>centre", "1"]);
    expect(half[col("layers")]).toBe("1-31x3 32-63x3 64-95x3 96-127x3");
    const edge = rows.find((r) => r[2] === "Snare edge")!;
    expect([edge[col("velocity_gaps")], edge[col("min_round_robins")]]).toEqual(["61-79", "1"]);
    const splash = rows.find((r) => r[2] === "Splash")!;
    expect([splash[col("outcome")], splash[col("reason")]]).toEqual(["silent", 'slot "Splash" is empty']);
  });
  it("quotes commas, quotes and line breaks, and defuses formula-leading text", () => {
    expect(csvField('Snare "A", top')).toBe('"Snare ""A"", top"');
    expect(csvField("a\nb")).toBe('"a\nb"');
    expect(csvField("=SUM(A1)")).toBe("'=SUM(A1)");
    expect(csvField(-3)).toBe("-3");
    expect(csvField(null)).toBe("");
  });
  it("pedal zones and the chick note get rows of their own", () => {
    const t = getTemplate("trigger-five")!;
    const r = readCsv(auditToCsv(runAudit(t, buildDefaultKit(t, cat), cat)));
    expect(r.filter((x) => x[0] === "pedal-zone").map((x) => [x[2], x[CSV_COLUMNS.indexOf("requested")], x[CSV_COLUMNS.indexOf("plays")]])).toEqual([
      ["CC4 0-31", "open", "open"],
      ["CC4 32-63", "half-open", "open"],
      ["CC4 64-95", "quarter-open", "closed"],
      ["CC4 96-127", "closed", "closed"],
    ]);
    expect(r.filter((x) => x[0] === "pedal-chick")).toHaveLength(1);
  });
});

describe("JSON export (kitwright.audit/v3)", () => {
  it("round-trips through JSON text", () => {
    const j = auditToJson(audit);
    expect(j.schema).toBe(AUDIT_SCHEMA);
    const text = JSON.stringify(j);
    expect(text).not.toMatch(/Infinity|NaN/);
    expect(parseAuditJson(text)).toEqual(audit);
    expect(Object.keys(j).slice(0, 6)).toEqual(["schema", "layoutId", "layoutName", "kitId", "kitName", "conflicts"]);
  });
  it("refuses other documents with a clear error", () => {
    expect(() => parseAuditJson({ schema: "something/v9" })).toThrow(/kitwright.audit\/v2/);
  });
});

describe("diff of two audits", () => {
  it("shows what changed after new samples arrived", () => {
    const more = testCatalogue();
    const snare = more.find((i) => i.id === "snare-14")!;
    snare.articulations.push(evenLayers("snare-14", "half-edge", 3, 2));
    more.push(instrument("splash-10", "Splash 10", "splash", [["crash-hit", 2, 2]]));
    const after = runAudit(layout, buildDefaultKit(layout, more), more);
    const d = diffAudits(audit, after);
    expect(d.changes.map((c) => [c.label, c.details[0]])).toEqual([
      ["Splash", "outcome silent -> direct"],
      ["Snare half-edge", "outcome stand-in -> direct"],
    ]);
    expect(d.changes[1]!.details).toContain("plays centre -> half-edge");
    expect(d.emptySlotsFilled.map((g) => [g.slotName, g.padIds])).toEqual([["Splash", ["r1c5"]]]);
    expect(d.emptySlotsAdded).toEqual([]);
    expect(d.conflictsResolved).toEqual([]);
    expect(d.conflictsAdded).toEqual([]);
    expect(d.scoreDelta).toBeCloseTo(after.score.value - audit.score.value, 6);
    expect(d.scoreDelta).toBeGreaterThan(0);
    expect(diffAudits(audit, audit).changes).toEqual([]);
  });
});

describe("layout, kit and catalogue files (kitwright.layout/v1, kitwright.kit/v1, kitwright.catalogue/v1)", () => {
  it("kit and catalogue round-trip", () => {
    const kit = buildDefaultKit(layout, cat);
    kit.slots[1]!.standIns = { "half-edge": "edge" };
    expect(parseKitFile(JSON.stringify(kitToFile(kit)))).toEqual(kit);
    expect(parseCatalogueFile(JSON.stringify(catalogueToFile(cat)))).toEqual(cat);
  });
  it("bad input gets a clear error naming the field", () => {
    const bad = { schema: "kitwright.layout/v1", layout: { ...getTemplate("grid-2x8")!, surface: { kind: "grid", rows: 9, cols: 9 } } };
    expect(() => parseLayoutFile(bad)).toThrow(SchemaError);
    expect(() => parseLayoutFile(bad)).toThrow(/1 to 64 pads/);
    const badNote = structuredClone(getTemplate("grid-2x8")!);
    badNote.pads[0]!.note = 128;
    expect(() => parseLayoutFile({ schema: "kitwright.layout/v1", layout: badNote })).toThrow(/pads\.0\.note/);
    expect(() => parseLayoutFile("{not json")).toThrow(/not JSON/);
    expect(() => parseKitFile({ schema: "kitwright.kit/v2", kit: {} })).toThrow(SchemaError);
    expect(() => parseKitFile({ schema: "kitwright.kit/v1", kit: { id: "k", name: "K", slots: [{ id: "a", name: "A", family: "bongo", instrumentId: null }] } })).toThrow(/slots\.0\.family/);
  });
  it("a pedal defaults to controller 4 (Foot Controller, MIDI 1.0) and channel 10", () => {
    const l = getTemplate("trigger-five")!;
    const raw = JSON.parse(JSON.stringify(l));
    delete raw.hiHatPedal.controller;
    delete raw.hiHatPedal.channel;
    const parsed = parseLayoutFile({ schema: "kitwright.layout/v1", layout: raw });
    expect(parsed.hiHatPedal).toMatchObject({ controller: 4, channel: 10 });
  });
});
