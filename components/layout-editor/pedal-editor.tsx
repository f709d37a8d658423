"use client";
// The hi-hat pedal: controller number (4 = Foot Controller by default), channel, slot, which end is closed,
// zones over 0-127 aimed at openness articulations, and the pedal-chick note.
import type { Articulation } from "@/lib/catalogue/taxonomy";
import type { HiHatPedal, LayoutSlot } from "@/lib/audit/types";
import { noteName, type MiddleC } from "@/components/midi/note-name";
import { PedalZonesBar } from "@/components/audit/pedal-bar";
import { ReadOnlyValue } from "@/components/view-only";
import { Select } from "@/components/ui/select";

const OPENNESS: Articulation[] = ["closed", "quarter-open", "half-open", "open", "foot-splash"];

export function defaultPedal(slotId: string): HiHatPedal {
  return {
    controller: 4, channel: 10, slotId, closedAt: "high", chickNote: 44,
    zones: [
      { low: 0, high: 31, articulation: "open" },
      { low: 32, high: 63, articulation: "half-open" },
      { low: 64, high: 95, articulation: "quarter-open" },
      { low: 96, high: 127, articulation: "closed" },
    ],
  };
}

const int = (v: string, lo: number, hi: number) => Math.max(lo, Math.min(hi, Math.round(Number(v) || 0)));

export function PedalEditor({ pedal, slots, canWrite, middleC, onChange }: { pedal: HiHatPedal | null; slots: LayoutSlot[]; canWrite: boolean; middleC: MiddleC; onChange: (p: HiHatPedal | null) => void }) {
  const hatSlot = slots.find((s) => s.family === "hi-hat")?.id ?? "hi-hat";
  return (
    <section className="card space-y-3" data-testid="pedal-editor">
      <div className="flex items-center justify-between gap-3">
        <h2>Hi-hat pedal</h2>
        {canWrite && (pedal
          ? <button type="button" className="btn-danger py-1" onClick={() => onChange(null)}>Remove pedal</button>
          : <button type="button" className="btn-quiet py-1" onClick={() => onChange(defaultPedal(hatSlot))}>Add hi-hat pedal</button>)}
      </div>
      {!pedal ? <p className="text-sm text-muted">No pedal on this layout.</p> : !canWrite ? <PedalView pedal={pedal} slots={slots} middleC={middleC} /> : (
        <fieldset className="space-y-3">
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
            <div>
              <label className="label" htmlFor="pedal-cc">Controller (CC)</label>
              <input id="pedal-cc" type="number" min={0} max={119} className="field num" value={pedal.controller} onChange={(e) => onChange({ ...pedal, controller: int(e.target.value, 0, 119) })} />
              <p className="mt-1 text-xs text-muted">4 is the Foot Controller</p>
            </div>
            <div>
              <label className="label" htmlFor="pedal-ch">Channel</label>
              <input id="pedal-ch" type="number" min={1} max={16} className="field num" value={pedal.channel} onChange={(e) => onChange({ ...pedal, channel: int(e.target.value, 1, 16) })} />
            </div>
            <div className="col-span-2">
              <label className="label" htmlFor="pedal-closed">Closed at</label>
              <Select id="pedal-closed" className="field" value={pedal.closedAt} onChange={(e) => onChange({ ...pedal, closedAt: e.target.value as "low" | "high" })}>
                <option value="high">high values (127 = closed)</option>
                <option value="low">low values (0 = closed)</option>
              </Select>
            </div>
            <div>
              <label className="label" htmlFor="pedal-chick">Chick note</label>
              <input id="pedal-chick" type="number" min={0} max={127} className="field num" value={pedal.chickNote ?? ""} placeholder="none" onChange={(e) => onChange({ ...pedal, chickNote: e.target.value === "" ? null : int(e.target.value, 0, 127) })} />
              {pedal.chickNote !== null && <p className="mt-1 text-xs text-muted">{noteName(pedal.chickNote, middleC)}</p>}
            </div>
          </div>
          <div>
            <label className="label" htmlFor="pedal-slot">Slot</label>
            <Select id="pedal-slot" className="field" value={pedal.slotId} onChange={(e) => onChange({ ...pedal, slotId: e.target.value })}>
              {!slots.some((s) => s.id === pedal.slotId) && <option value={pedal.slotId}>{pedal.slotId}</option>}
              {slots.map((s) => <option key={s.id} value={s.id}>{s.name} ({s.family})</option>)}
            </Select>
          </div>
          <PedalZonesBar zones={pedal.zones.map((z) => ({ low: z.low, high: z.high, text: z.articulation, mark: "none" as const }))} closedAt={pedal.closedAt} />
          <div className="table-scroll"><table className="w-full text-sm">
            <thead className="text-left text-muted"><tr><th className="py-1 font-medium">From</th><th className="font-medium">To</th><th className="font-medium">Openness</th><th /></tr></thead>
            <tbody>
              {pedal.zones.map((z, i) => (
                <tr key={i} className="border-t border-line">
                  <td className="py-1 pr-2"><input aria-label={`Zone ${i + 1} from`} type="number" min={0} max={127} className="field num" value={z.low} onChange={(e) => onChange({ ...pedal, zones: pedal.zones.map((x, j) => (j === i ? { ...x, low: int(e.target.value, 0, 127) } : x)) })} /></td>
                  <td className="pr-2"><input aria-label={`Zone ${i + 1} to`} type="number" min={0} max={127} className="field num" value={z.high} onChange={(e) => onChange({ ...pedal, zones: pedal.zones.map((x, j) => (j === i ? { ...x, high: int(e.target.value, 0, 127) } : x)) })} /></td>
                  <td className="pr-2">
                    <Select aria-label={`Zone ${i + 1} openness`} className="field" value={z.articulation} onChange={(e) => onChange({ ...pedal, zones: pedal.zones.map((x, j) => (j === i ? { ...x, articulation: e.target.value as Articulation } : x)) })}>
                      {[...OPENNESS, ...((OPENNESS as readonly string[]).includes(z.articulation) ? [] : [z.articulation])].map((a) => <option key={a} value={a}>{a}</option>)}
                    </Select>
                  </td>
                  <td><button type="button" className="btn-quiet py-1" disabled={pedal.zones.length <= 1} onClick={() => onChange({ ...pedal, zones: pedal.zones.filter((_, j) => j !== i) })}>Remove</button></td>
                </tr>
              ))}
            </tbody>
          </table></div>
          <button type="button" className="btn-quiet py-1" disabled={pedal.zones.length >= 16} onClick={() => onChange({ ...pedal, zones: [...pedal.zones, { low: 0, high: 127, articulation: "closed" }] })}>Add zone</button>
        </fieldset>
      )}
    </section>
  );
}

/** The pedal as text, for members who may not change the layout (the layout's "view only" note covers it). */
function PedalView({ pedal, slots, middleC }: { pedal: HiHatPedal; slots: LayoutSlot[]; middleC: MiddleC }) {
  const slot = slots.find((s) => s.id === pedal.slotId);
  return (
    <div className="space-y-3" data-testid="pedal-view">
      <dl className="grid grid-cols-1 gap-3 sm:grid-cols-4">
        <ReadOnlyValue label="Controller (CC)"><span className="num">{pedal.controller}</span>{pedal.controller === 4 ? " (Foot Controller)" : ""}</ReadOnlyValue>
        <ReadOnlyValue label="Channel"><span className="num">{pedal.channel}</span></ReadOnlyValue>
        <ReadOnlyValue label="Closed at">{pedal.closedAt === "high" ? "high values (127 = closed)" : "low values (0 = closed)"}</ReadOnlyValue>
        <ReadOnlyValue label="Chick note">{pedal.chickNote === null ? "none" : <><span className="num">{pedal.chickNote}</span> · {noteName(pedal.chickNote, middleC)}</>}</ReadOnlyValue>
        <ReadOnlyValue className="sm:col-span-4" label="Slot">{slot ? `${slot.name} (${slot.family})` : pedal.slotId}</ReadOnlyValue>
      </dl>
      <PedalZonesBar zones={pedal.zones.map((z) => ({ low: z.low, high: z.high, text: z.articulation, mark: "none" as const }))} closedAt={pedal.closedAt} />
      <ul className="space-y-1 text-sm">
        {pedal.zones.map((z, i) => <li key={i}><span className="num">{z.low}–{z.high}</span>: {z.articulation}</li>)}
      </ul>
    </div>
  );
}
