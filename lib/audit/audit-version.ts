// Audits stored or exported by an earlier version, read in today's shape. Version 1 (kitwright.audit/v1)
// reported a pad aimed at an empty slot twice (a silent pad and an "empty-slot" conflict) and took 5 points per
// conflict off its score. Reading one: its empty-slot conflicts become `emptySlots` groups (the pads named, their
// slot taken from the pad findings) and its score is computed again from its findings by today's formula. The
// findings themselves are kept as they were. Version 2 (kitwright.audit/v2) had no studio strokes: reading one
// adds an empty `strokes` list and, on every stand-in, an empty `edges` list (v2 did not record which edges a
// path used; its path is kept). Pure.

import { scoreAudit, summarizeAudit } from "./audit-score";
import type { AuditResult, Conflict, EmptySlotGroup, PlayFinding } from "./types";

/** The version of the audit result shape this code writes (kitwright.audit/v3). */
export const AUDIT_RESULT_VERSION = 3;

/** True when `r` already has today's shape. */
export function isCurrentAudit(r: unknown): boolean {
  const x = r as Partial<AuditResult> | null;
  return !!x && Array.isArray(x.emptySlots) && x.score?.outOf === 100 && Array.isArray(x.strokes);
}

/** v2 -> v3: the studio strokes met (none were possible) and the edges of each stand-in (not recorded then). */
function withStrokes(r: AuditResult): AuditResult {
  const edgesOn = <T extends PlayFinding>(f: T): T => (f.standIn && !Array.isArray(f.standIn.edges) ? { ...f, standIn: { ...f.standIn, edges: [] } } : f);
  return {
    ...r,
    strokes: Array.isArray(r.strokes) ? r.strokes : [],
    pads: r.pads.map(edgesOn),
    pedal: r.pedal ? { ...r.pedal, zones: r.pedal.zones.map(edgesOn), chick: r.pedal.chick ? edgesOn(r.pedal.chick) : null } : null,
  };
}

/** An audit result of any version in today's shape (a copy; the input is not changed). */
export function currentAuditResult(raw: unknown): AuditResult {
  const r = raw as AuditResult;
  if (!r || typeof r !== "object" || !Array.isArray(r.pads) || !Array.isArray(r.conflicts)) {
    throw new Error("not an audit result: pads and conflicts are required");
  }
  if (isCurrentAudit(r)) return r;
  if (Array.isArray(r.emptySlots) && r.score?.outOf === 100) return withStrokes(r);
  const old = r.conflicts as Array<Conflict | (Omit<Conflict, "kind"> & { kind: "empty-slot" })>;
  const findings = new Map<string, { slotId: string | null; slotName: string | null; label: string }>();
  for (const p of r.pads) findings.set(p.padId, { slotId: p.slotId, slotName: p.slotName, label: p.label });
  for (const z of r.pedal?.zones ?? []) findings.set(`pedal-zone-${z.zoneIndex + 1}`, { slotId: z.slotId, slotName: z.slotName, label: `pedal ${z.low}-${z.high} (${z.requested})` });
  if (r.pedal?.chick) findings.set(r.pedal.chick.padId, { slotId: r.pedal.chick.slotId, slotName: r.pedal.chick.slotName, label: r.pedal.chick.label });
  const emptySlots: EmptySlotGroup[] = [];
  const conflicts: Conflict[] = [];
  for (const c of old) {
    if (c.kind !== "empty-slot") { conflicts.push(c as Conflict); continue; }
    const first = findings.get(c.padIds[0] ?? "");
    const fromMessage = /^slot "(.*)" is empty$/.exec(c.message)?.[1] ?? null;
    emptySlots.push({
      slotId: first?.slotId ?? fromMessage ?? "",
      slotName: first?.slotName ?? fromMessage ?? "",
      padIds: c.padIds.slice(),
      labels: c.padIds.map((id) => findings.get(id)?.label ?? id),
    });
  }
  return withStrokes({
    ...r,
    conflicts,
    emptySlots,
    summary: summarizeAudit(r.pads, r.pedal, conflicts.length),
    score: scoreAudit(r.pads, r.pedal, conflicts, emptySlots),
  });
}
