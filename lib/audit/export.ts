// Exports of an audit: CSV (one row per conflict, empty slot, pad, pedal zone), JSON in the versioned schema
// kitwright.audit/v3 (see SCHEMA.md; v1 and v2 documents are still read), and the difference between two audits of the
// same layout.

import { currentAuditResult } from "./audit-version";
import type { AuditResult, Conflict, EmptySlotGroup, PadFinding, PedalZoneFinding, PlayFinding } from "./types";

export const AUDIT_SCHEMA = "kitwright.audit/v3";
/** Earlier audit schemas that parseAuditJson still reads (brought to today's shape by currentAuditResult). */
export const OLDER_AUDIT_SCHEMAS = ["kitwright.audit/v1", "kitwright.audit/v2"] as const;

export const CSV_COLUMNS = [
  "kind",
  "id",
  "label",
  "note",
  "channel",
  "row",
  "col",
  "zone",
  "slot",
  "instrument",
  "requested",
  "outcome",
  "plays",
  "path",
  "cost",
  "layers",
  "velocity_gaps",
  "min_round_robins",
  "reason",
  "edges",
] as const;

/** RFC 4180 field: quoted when it holds a comma, quote, CR or LF; quotes doubled. Formula-leading text is prefixed with '. */
export function csvField(v: unknown): string {
  if (v === null || v === undefined) return "";
  let s = typeof v === "number" ? (Number.isFinite(v) ? String(v) : "") : String(v);
  if (/^[=+\-@\t\r]/.test(s) && typeof v !== "number") s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function layersText(f: PlayFinding): string {
  return f.layers.map((l) => `${l.velocityLow}-${l.velocityHigh}x${l.roundRobins}`).join(" ");
}
function gapsText(f: PlayFinding): string {
  return f.velocityGaps.map((g) => (g.low === g.high ? `${g.low}` : `${g.low}-${g.high}`)).join(" ");
}

function playCells(f: PlayFinding): unknown[] {
  return [
    f.slotName ?? f.slotId,
    f.instrumentName ?? f.instrumentId,
    f.requested,
    f.outcome,
    f.plays,
    f.standIn ? f.standIn.path.join(">") : "",
    f.standIn ? f.standIn.cost : f.outcome === "direct" ? 0 : "",
    layersText(f),
    gapsText(f),
    f.minRoundRobins,
    f.reason ?? "",
    f.standIn ? f.standIn.edges.map((e) => `${e.from}>${e.to} ${e.owner}`).join("; ") : "",
  ];
}

/**
 * CSV of the findings, conflicts first. Columns: CSV_COLUMNS. `layers` lists each layer as
 * "low-high x roundRobins" separated by spaces; `velocity_gaps` lists the uncovered velocities; `path`
 * joins the stand-in path with '>'; `edges` names each edge of the fallback graph that path used and whose it is
 * ("buzz-rim-shot>rim-shot studio; rim-shot>centre built-in"). Lines end with CRLF (RFC 4180).
 */
export function auditToCsv(result: AuditResult): string {
  const rows: unknown[][] = [[...CSV_COLUMNS]];
  for (const c of result.conflicts) {
    rows.push(["conflict", c.kind, c.padIds.join(" "), c.note, c.channel, "", "", "", "", "", "", "", "", "", "", "", "", "", c.message, ""]);
  }
  for (const g of result.emptySlots) {
    rows.push(["empty-slot", g.slotId, g.padIds.join(" "), "", "", "", "", "", g.slotName, "", "", "silent", "", "", "", "", "", "", `slot "${g.slotName}" is empty`, ""]);
  }
  const padRow = (kind: string, p: PadFinding) => [kind, p.padId, p.label, p.note, p.channel, p.row, p.col, p.zone, ...playCells(p)];
  for (const p of result.pads) rows.push(padRow("pad", p));
  if (result.pedal) {
    for (const z of result.pedal.zones) {
      rows.push(["pedal-zone", `zone-${z.zoneIndex + 1}`, `CC${result.pedal.controller} ${z.low}-${z.high}`, "", result.pedal.channel, "", "", "", ...playCells(z)]);
    }
    if (result.pedal.chick) rows.push(padRow("pedal-chick", result.pedal.chick));
  }
  return rows.map((r) => r.map(csvField).join(",")).join("\r\n") + "\r\n";
}

export interface AuditFile extends AuditResult {
  schema: typeof AUDIT_SCHEMA;
}

/** The audit as a kitwright.audit/v3 object (plain JSON; Infinity never appears). */
export function auditToJson(result: AuditResult): AuditFile {
  return { schema: AUDIT_SCHEMA, ...structuredClone(result) };
}

/** Read back a kitwright.audit/v3 (or v2, v1) object: checks the schema tag and the main fields; older ones are upgraded. */
export function parseAuditJson(input: unknown): AuditResult {
  const data = typeof input === "string" ? JSON.parse(input) : input;
  const tag = data && typeof data === "object" ? (data as { schema?: unknown }).schema : undefined;
  const known = tag === AUDIT_SCHEMA || (OLDER_AUDIT_SCHEMAS as readonly unknown[]).includes(tag);
  if (!known) throw new Error(`not a ${AUDIT_SCHEMA} document (nor an earlier ${OLDER_AUDIT_SCHEMAS.join(", ")})`);
  const d = data as AuditFile;
  if (!Array.isArray(d.pads) || !Array.isArray(d.conflicts) || typeof d.score?.value !== "number") {
    throw new Error(`${String(tag)}: pads, conflicts and score are required`);
  }
  const { schema: _schema, ...rest } = d;
  return currentAuditResult(rest);
}

// ---------------------------------------------------------------- diff

export interface FindingChange {
  id: string;
  label: string;
  kind: "pad" | "pedal-zone" | "pedal-chick";
  change: "added" | "removed" | "changed";
  /** Human-readable differences ("outcome silent -> stand-in", "layers 2 -> 4"). */
  details: string[];
  before: { outcome: string; plays: string | null } | null;
  after: { outcome: string; plays: string | null } | null;
}

export interface AuditDiff {
  scoreBefore: number;
  scoreAfter: number;
  scoreDelta: number;
  /** The score's sentence before and after. */
  sentenceBefore: string;
  sentenceAfter: string;
  summaryBefore: AuditResult["summary"];
  summaryAfter: AuditResult["summary"];
  conflictsAdded: Conflict[];
  conflictsResolved: Conflict[];
  /** Slots that were empty before and are filled now (as before saw them). */
  emptySlotsFilled: EmptySlotGroup[];
  /** Slots that are empty now and were not before. */
  emptySlotsAdded: EmptySlotGroup[];
  changes: FindingChange[];
}

function compareFindings(a: PlayFinding, b: PlayFinding): string[] {
  const d: string[] = [];
  if (a.outcome !== b.outcome) d.push(`outcome ${a.outcome} -> ${b.outcome}`);
  if (a.plays !== b.plays) d.push(`plays ${a.plays ?? "nothing"} -> ${b.plays ?? "nothing"}`);
  if (a.instrumentId !== b.instrumentId) d.push(`instrument ${a.instrumentName ?? a.instrumentId ?? "none"} -> ${b.instrumentName ?? b.instrumentId ?? "none"}`);
  const pa = a.standIn?.path.join(">") ?? "";
  const pb = b.standIn?.path.join(">") ?? "";
  if (pa !== pb && a.outcome === b.outcome) d.push(`path ${pa || "-"} -> ${pb || "-"}`);
  if (a.layers.length !== b.layers.length) d.push(`layers ${a.layers.length} -> ${b.layers.length}`);
  else if (layersText(a) !== layersText(b)) d.push(`layers ${layersText(a)} -> ${layersText(b)}`);
  if (gapsText(a) !== gapsText(b)) d.push(`velocity gaps ${gapsText(a) || "none"} -> ${gapsText(b) || "none"}`);
  if (a.minRoundRobins !== b.minRoundRobins) d.push(`round robins ${a.minRoundRobins} -> ${b.minRoundRobins}`);
  return d;
}

const conflictKey = (c: Conflict) => `${c.kind}|${c.note}|${c.channel}|${[...c.padIds].sort().join(",")}`;

/** What changed from `before` to `after` (two audits of the same layout, e.g. after new samples arrived). */
export function diffAudits(beforeRaw: AuditResult, afterRaw: AuditResult): AuditDiff {
  const before = currentAuditResult(beforeRaw);
  const after = currentAuditResult(afterRaw);
  const items = (r: AuditResult) => {
    const m = new Map<string, { kind: FindingChange["kind"]; label: string; f: PlayFinding }>();
    for (const p of r.pads) m.set(`pad:${p.padId}`, { kind: "pad", label: p.label, f: p });
    for (const z of r.pedal?.zones ?? []) m.set(`zone:${z.zoneIndex}`, { kind: "pedal-zone", label: zoneLabel(z), f: z });
    if (r.pedal?.chick) m.set("chick", { kind: "pedal-chick", label: r.pedal.chick.label, f: r.pedal.chick });
    return m;
  };
  const a = items(before);
  const b = items(after);
  const brief = (f: PlayFinding) => ({ outcome: f.outcome, plays: f.plays });
  const changes: FindingChange[] = [];
  for (const [k, x] of a) {
    const y = b.get(k);
    if (!y) changes.push({ id: k, label: x.label, kind: x.kind, change: "removed", details: [], before: brief(x.f), after: null });
    else {
      const details = compareFindings(x.f, y.f);
      if (details.length) changes.push({ id: k, label: y.label, kind: y.kind, change: "changed", details, before: brief(x.f), after: brief(y.f) });
    }
  }
  for (const [k, y] of b) if (!a.has(k)) changes.push({ id: k, label: y.label, kind: y.kind, change: "added", details: [], before: null, after: brief(y.f) });
  const ka = new Set(before.conflicts.map(conflictKey));
  const kb = new Set(after.conflicts.map(conflictKey));
  return {
    scoreBefore: before.score.value,
    scoreAfter: after.score.value,
    scoreDelta: after.score.value - before.score.value,
    sentenceBefore: before.score.sentence,
    sentenceAfter: after.score.sentence,
    summaryBefore: before.summary,
    summaryAfter: after.summary,
    conflictsAdded: after.conflicts.filter((c) => !ka.has(conflictKey(c))),
    conflictsResolved: before.conflicts.filter((c) => !kb.has(conflictKey(c))),
    emptySlotsFilled: before.emptySlots.filter((g) => !after.emptySlots.some((x) => x.slotId === g.slotId)),
    emptySlotsAdded: after.emptySlots.filter((g) => !before.emptySlots.some((x) => x.slotId === g.slotId)),
    changes,
  };
}

function zoneLabel(z: PedalZoneFinding): string {
  return `pedal ${z.low}-${z.high} ${z.requested ?? ""}`.trim();
}
