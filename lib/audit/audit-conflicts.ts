// Conflicts of a layout: the log every stage of the audit writes to, the checks of notes and channels across
// pads, and the order the findings list them in (by kind, then as met). Pure.

import type { Conflict, ConflictKind, EmptySlotGroup, PadFinding } from "./types";

/** The order conflicts are listed in, by kind. */
export const CONFLICT_ORDER: ConflictKind[] = [
  "note-shared",
  "note-out-of-range",
  "channel-out-of-range",
  "controller-out-of-range",
  "duplicate-pad-id",
  "unknown-slot",
  "unknown-instrument",
  "no-target",
  "outside-grid",
  "pedal-zone-out-of-range",
  "pedal-zone-overlap",
];

export function isInt(x: unknown, lo: number, hi: number): boolean {
  return typeof x === "number" && Number.isInteger(x) && x >= lo && x <= hi;
}

/**
 * The conflicts met while auditing. A problem of a kit slot (unknown, holding an instrument not in the
 * catalogue) is one conflict naming every pad that asked for the slot, however many asked. An empty slot is
 * not a conflict: its pads are silent, and the slot is reported once in the audit's `emptySlots`, with every
 * pad (pedal zone, chick note) that aims at it.
 */
export class ConflictLog {
  private readonly list: Conflict[] = [];
  private readonly slotProblems = new Map<string, { kind: ConflictKind; message: string; padIds: string[] }>();
  private readonly empty = new Map<string, EmptySlotGroup>();

  /** A pad (or pedal zone) aims at a slot the kit leaves empty. */
  emptySlot(slotId: string, slotName: string, askerId: string, askerLabel: string): void {
    const g = this.empty.get(slotId);
    if (g) {
      g.padIds.push(askerId);
      g.labels.push(askerLabel);
    } else this.empty.set(slotId, { slotId, slotName, padIds: [askerId], labels: [askerLabel] });
  }

  /** The empty slots, in the order first met, each with the pads that aim at it. */
  emptySlots(): EmptySlotGroup[] {
    return [...this.empty.values()].map((g) => ({ ...g, padIds: g.padIds.slice(), labels: g.labels.slice() }));
  }

  add(kind: ConflictKind, message: string, padIds: string[], note: number | null = null, channel: number | null = null): void {
    this.list.push({ kind, message, padIds, note, channel });
  }

  slotProblem(kind: ConflictKind, slotId: string, message: string, padId: string): void {
    const key = `${kind}|${slotId}`;
    const p = this.slotProblems.get(key);
    if (p) p.padIds.push(padId);
    else this.slotProblems.set(key, { kind, message, padIds: [padId] });
  }

  /** Every conflict, slot problems last, listed by kind (CONFLICT_ORDER) and then in the order met. */
  sorted(): Conflict[] {
    const all = this.list.slice();
    for (const p of this.slotProblems.values()) all.push({ kind: p.kind, message: p.message, padIds: p.padIds, note: null, channel: null });
    const rank = (k: ConflictKind) => CONFLICT_ORDER.indexOf(k);
    return all.map((c, i) => ({ c, i })).sort((a, b) => rank(a.c.kind) - rank(b.c.kind) || a.i - b.i).map((x) => x.c);
  }
}

/**
 * Notes and channels of everything that sends a note (the pads and the pedal's chick): MIDI 1.0 notes are
 * 0-127 and channels 1-16; one note on one channel aimed at two different targets is a conflict.
 */
export function checkNotesAndChannels(noteOwners: readonly PadFinding[], log: ConflictLog): void {
  const byNote = new Map<string, PadFinding[]>();
  for (const p of noteOwners) {
    if (!isInt(p.note, 0, 127)) log.add("note-out-of-range", `pad "${p.label}" sends note ${p.note}, outside 0-127`, [p.padId], p.note, p.channel);
    if (!isInt(p.channel, 1, 16)) log.add("channel-out-of-range", `pad "${p.label}" sends on channel ${p.channel}, outside 1-16`, [p.padId], p.note, p.channel);
    if (p.requested === null || p.slotId === null) continue;
    const k = `${p.channel}|${p.note}`;
    const list = byNote.get(k);
    if (list) list.push(p);
    else byNote.set(k, [p]);
  }
  for (const list of byNote.values()) {
    const targets = new Set(list.map((p) => `${p.slotId}|${p.requested}`));
    if (targets.size > 1) {
      const first = list[0]!;
      log.add(
        "note-shared",
        `note ${first.note} on channel ${first.channel} is aimed at ${targets.size} different targets: ` +
          list.map((p) => `"${p.label}" -> ${p.slotName ?? p.slotId} ${p.requested}`).join(", "),
        list.map((p) => p.padId),
        first.note,
        first.channel,
      );
    }
  }
}
