// Read-only parts of the layout editor: a pad's settings as text (for members who may not change the layout) and
// the drawn mark of a note several pads send.
import type { LayoutSlot, Pad } from "@/lib/audit/types";
import { noteName, type MiddleC } from "@/components/midi/note-name";
import { ReadOnlyValue } from "@/components/view-only";

/** The selected pad's settings as text, for members who may not change the layout. */
export function PadView({ pad, grid, slot, middleC, shared }: { pad: Pad; grid: boolean; slot: LayoutSlot | undefined; middleC: MiddleC; shared: boolean }) {
  return (
    <dl className="grid grid-cols-2 gap-3" data-testid="pad-view">
      <ReadOnlyValue className="col-span-2" label="Label" testId="pad-view-label">{pad.label || "(no label)"}</ReadOnlyValue>
      {!grid && <ReadOnlyValue className="col-span-2" label="Trigger zone">{pad.zone ?? "–"}</ReadOnlyValue>}
      <ReadOnlyValue label="MIDI note"><span className="num">{pad.note}</span> · {noteName(pad.note, middleC)}{shared ? " · other pads send it too" : ""}</ReadOnlyValue>
      <ReadOnlyValue label="Channel"><span className="num">{pad.channel}</span></ReadOnlyValue>
      <ReadOnlyValue className="col-span-2" label="Plays">{pad.target ? `${slot?.name ?? pad.target.slotId}${slot ? ` (${slot.family})` : ""}: ${pad.target.articulation}` : "nothing: no target"}</ReadOnlyValue>
    </dl>
  );
}

/** Two overlapping squares: several pads send this note (drawn, so it never depends on a font having the glyph). */
export function SharedNoteMark() {
  return (
    <svg viewBox="0 0 12 12" className="inline h-3 w-3 align-[-1px]" fill="none" stroke="currentColor" strokeWidth="1.3" role="img" aria-label="shared note">
      <title>Several pads send this note</title>
      <rect x="1" y="1" width="7" height="7" rx="1" />
      <rect x="4" y="4" width="7" height="7" rx="1" />
    </svg>
  );
}
