"use client";
// The layout editor: the pad grid (or trigger-zone list), the selected pad's settings, MIDI learn (select a
// pad, hit the controller's pad: its note, channel and velocity are captured), the hi-hat pedal editor with
// "learn pedal" (move the pedal: its controller number is captured) and a live MIDI monitor.
import { useCallback, useMemo, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { FormError, Message } from "@/components/form-bits";
import { useSaveLayout } from "@/components/data/layouts";
import { useMidi, type MidiEvent } from "@/components/midi/use-midi";
import { MidiMonitor, MidiStatusLine } from "@/components/midi/midi-panel";
import { MiddleCSetting, noteName, useMiddleC } from "@/components/midi/notes";
import { FAMILIES, FAMILY_ARTICULATIONS, type Family } from "@/lib/catalogue/taxonomy";
import { allStrokes, familyStrokes, type StrokeList } from "@/lib/catalogue/strokes";
import type { HiHatPedal, Layout, LayoutSlot, Pad } from "@/lib/audit/types";
import { PedalEditor } from "./pedal-editor";
import { ViewOnlyNote } from "@/components/view-only";
import { PadView, SharedNoteMark } from "./pad-view";
import type { MiddleC } from "@/components/midi/note-name";
import { PadGrid, type CellProps } from "@/components/pad-chart/pad-grid";
import { Select } from "@/components/ui/select";

export interface KitSlotsChoice { id: string; name: string; slots: LayoutSlot[] }

type Learn = null | "pad" | "pedal";

export function LayoutEditor({ studioId, layout: initial, kits, canWrite, strokes = [] }: { studioId: string; layout: Layout; kits: KitSlotsChoice[]; canWrite: boolean; strokes?: StrokeList }) {
  const router = useRouter();
  const [layout, setLayout] = useState<Layout>(initial);
  const [selected, setSelected] = useState<string | null>(initial.pads[0]?.id ?? null);
  const [learn, setLearn] = useState<Learn>(null);
  const [advance, setAdvance] = useState(true);
  const [lastVelocity, setLastVelocity] = useState<Record<string, number>>({});
  const [events, setEvents] = useState<MidiEvent[]>([]);
  const [dirty, setDirty] = useState(false);
  // what MIDI learn caught; the save's own outcome is the mutation's state
  const [msg, setMsg] = useState<{ kind: "error" | "ok" | "info"; text: string } | null>(null);
  const saveLayout = useSaveLayout(studioId, initial.id);
  const { reset: resetSave } = saveLayout;
  const [middleC, setMiddleC] = useMiddleC();
  const [kitForSlots, setKitForSlots] = useState<string>("");

  const slots: LayoutSlot[] = useMemo(() => {
    const m = new Map<string, LayoutSlot>();
    for (const s of layout.slots ?? []) m.set(s.id, s);
    const k = kits.find((x) => x.id === kitForSlots);
    for (const s of k?.slots ?? []) if (!m.has(s.id)) m.set(s.id, s);
    for (const p of layout.pads) if (p.target && !m.has(p.target.slotId)) m.set(p.target.slotId, { id: p.target.slotId, name: p.target.slotId, family: "other" });
    return [...m.values()];
  }, [layout, kits, kitForSlots]);

  const update = useCallback((fn: (l: Layout) => Layout) => { setLayout((l) => fn(l)); setDirty(true); setMsg(null); resetSave(); }, [resetSave]);
  const patchPad = useCallback((id: string, p: Partial<Pad>) => update((l) => ({ ...l, pads: l.pads.map((x) => (x.id === id ? { ...x, ...p } : x)) })), [update]);

  // MIDI messages can arrive faster than React renders: the learn handler reads and advances refs.
  const selRef = useRef(selected);
  selRef.current = selected;
  const learnRef = useRef(learn);
  learnRef.current = learn;
  const padsRef = useRef(layout.pads);
  padsRef.current = layout.pads;
  const onMidi = useCallback((e: MidiEvent) => {
    setEvents((ev) => [e, ...ev].slice(0, 40));
    const sel = selRef.current;
    if (learnRef.current === "pad" && e.kind === "note-on" && sel) {
      patchPad(sel, { note: e.note!, channel: e.channel });
      setLastVelocity((v) => ({ ...v, [sel]: e.velocity! }));
      setMsg({ kind: "ok", text: `Learned note ${e.note} (${noteName(e.note!, middleC)}), channel ${e.channel}, velocity ${e.velocity}.` });
      if (advance) {
        const i = padsRef.current.findIndex((p) => p.id === sel);
        const next = padsRef.current[i + 1];
        selRef.current = next?.id ?? sel;
        if (next) setSelected(next.id);
        else { learnRef.current = null; setLearn(null); }
      }
    }
    if (learnRef.current === "pedal" && e.kind === "cc") {
      learnRef.current = null;
      update((l) => ({ ...l, hiHatPedal: l.hiHatPedal ? { ...l.hiHatPedal, controller: Math.min(119, e.controller!), channel: e.channel } : null }));
      setLearn(null);
      setMsg({ kind: "ok", text: `Learned the pedal: controller ${e.controller} on channel ${e.channel}.` });
    }
  }, [advance, middleC, patchPad, update]);
  const midi = useMidi(onMidi);

  const pad = layout.pads.find((p) => p.id === selected) ?? null;
  const slotOf = (id: string | undefined) => slots.find((s) => s.id === id);

  function save() {
    const { id: _id, ...content } = layout;
    setMsg(null);
    saveLayout.mutate({ ...content, slots: slots.length ? slots : undefined }, {
      onSuccess: () => {
        setDirty(false);
        router.refresh();
      },
    });
  }

  const noteUse = useMemo(() => {
    const m = new Map<string, number>();
    for (const p of layout.pads) m.set(`${p.note}/${p.channel}`, (m.get(`${p.note}/${p.channel}`) ?? 0) + 1);
    return m;
  }, [layout.pads]);

  const padButton = (p: Pad, cell?: CellProps) => {
    const s = slotOf(p.target?.slotId);
    const shared = (noteUse.get(`${p.note}/${p.channel}`) ?? 0) > 1;
    const isSel = p.id === selected;
    return (
      <button key={p.id} type="button" onClick={() => setSelected(p.id)} aria-pressed={isSel} data-testid="layout-pad" data-pad-id={p.id} {...cell}
        className={`flex h-full min-h-20 w-full flex-col items-start gap-0.5 rounded-md border p-1 text-left text-[11px] sm:p-2 sm:text-xs ${isSel ? "border-brand bg-brand-soft ring-2 ring-brand" : "border-line bg-card hover:bg-paper"}`}>
        <span className="min-w-0 font-medium [overflow-wrap:anywhere]">{p.label || "(no label)"}</span>
        <span className="num">{p.note} · {noteName(p.note, middleC)} · ch {p.channel}{shared && <> <SharedNoteMark /></>}</span>
        <span className="text-muted">{p.target ? `${s?.name ?? p.target.slotId}: ${p.target.articulation}` : "→ no target"}</span>
        {lastVelocity[p.id] !== undefined && <span className="num text-muted">vel {lastVelocity[p.id]}</span>}
      </button>
    );
  };

  const grid = layout.surface.kind === "grid" ? layout.surface : null;
  const fam: Family | undefined = pad?.target ? slotOf(pad.target.slotId)?.family : undefined;

  return (
    <div className="grid grid-cols-1 gap-6 xl:grid-cols-[minmax(0,1fr)_360px]">
      <div className="space-y-4">
        {!canWrite && <ViewOnlyNote what="this layout" />}
        <section className="card space-y-3">
          <div className="flex flex-wrap items-center justify-between gap-3">
            <h2>{grid ? `Pads (${grid.rows} × ${grid.cols} grid)` : `Trigger zones (${layout.pads.length})`}</h2>
            <MiddleCSetting value={middleC} onChange={setMiddleC} />
          </div>
          <PadGrid surface={layout.surface} pads={layout.pads} label="Pads" testId="layout-grid"
            renderPad={(p, cell) => padButton(p, cell)}
            renderEmpty={grid ? (c, cell) => !canWrite ? <div {...cell} className="h-full min-h-20 w-full rounded-md border border-dashed border-line" aria-label="no pad" /> : (
              <button type="button" {...cell} className="h-full min-h-20 w-full rounded-md border border-dashed border-line text-xs text-muted"
                onClick={() => {
                  const ids = new Set(layout.pads.map((x) => x.id));
                  let id = `r${c.row}c${c.col}`;
                  while (ids.has(id)) id += "x";
                  update((l) => ({ ...l, pads: [...l.pads, { id, label: `Pad ${l.pads.length + 1}`, row: c.row, col: c.col, note: 36, channel: 10, target: null }] }));
                  setSelected(id);
                }}>+ pad</button>
            ) : undefined} />
          {!grid && canWrite && (
            <button type="button" className="btn-quiet" disabled={layout.pads.length >= 128} onClick={() => {
              const ids = new Set(layout.pads.map((x) => x.id));
              let n = layout.pads.length + 1;
              while (ids.has(`z${n}`)) n++;
              update((l) => ({ ...l, pads: [...l.pads, { id: `z${n}`, label: `Zone ${n}`, zone: `zone ${n}`, note: 36, channel: 10, target: null }] }));
              setSelected(`z${n}`);
            }}>Add trigger zone</button>
          )}
        </section>

        <section className="card space-y-3">
          <h2>MIDI learn</h2>
          <p className="text-sm text-muted">{canWrite ? <>Connect your controller, select a pad above, press “Learn pads”, then hit the controller’s pad: its note, channel and velocity are captured{advance ? " and the next pad is selected" : ""}.</> : "Connect your controller to see what each pad sends."}</p>
          <MidiStatusLine status={midi.status} message={midi.message} inputs={midi.inputs} onConnect={midi.connect} />
          {canWrite && (
            <div className="flex flex-wrap items-center gap-3">
              <button type="button" className={learn === "pad" ? "btn-primary" : "btn-quiet"} disabled={midi.status !== "ready" || !pad} aria-pressed={learn === "pad"} onClick={() => setLearn(learn === "pad" ? null : "pad")}>
                {learn === "pad" ? "● Learning pads — stop" : "Learn pads"}
              </button>
              <button type="button" className={learn === "pedal" ? "btn-primary" : "btn-quiet"} disabled={midi.status !== "ready" || !layout.hiHatPedal} aria-pressed={learn === "pedal"} onClick={() => setLearn(learn === "pedal" ? null : "pedal")}>
                {learn === "pedal" ? "● Move the pedal…" : "Learn pedal"}
              </button>
              <label className="inline-flex items-center gap-2 text-sm"><input type="checkbox" checked={advance} onChange={(e) => setAdvance(e.target.checked)} /> then select the next pad</label>
            </div>
          )}
          {learn === "pad" && pad && <p className="text-sm" role="status">Waiting for a hit for <strong>{pad.label}</strong>…</p>}
          <MidiMonitor events={events} middleC={middleC} />
        </section>

        <PedalEditor pedal={layout.hiHatPedal} slots={slots} canWrite={canWrite} middleC={middleC}
          onChange={(p: HiHatPedal | null) => update((l) => ({ ...l, hiHatPedal: p }))} />
      </div>

      <aside className="space-y-4">
        <section className="card space-y-3" data-testid="pad-settings">
          <h2>Selected pad</h2>
          {!pad ? <p className="text-sm text-muted">Select a pad.</p> : !canWrite ? <PadView pad={pad} grid={!!grid} slot={slotOf(pad.target?.slotId)} middleC={middleC} shared={(noteUse.get(`${pad.note}/${pad.channel}`) ?? 0) > 1} /> : (
            <fieldset className="space-y-3">
              <div>
                <label className="label" htmlFor="pad-label">Label</label>
                <input id="pad-label" className="field" value={pad.label} maxLength={200} onChange={(e) => patchPad(pad.id, { label: e.target.value })} />
              </div>
              {!grid && (
                <div>
                  <label className="label" htmlFor="pad-zone">Trigger zone</label>
                  <input id="pad-zone" className="field" value={pad.zone ?? ""} maxLength={200} onChange={(e) => patchPad(pad.id, { zone: e.target.value || undefined })} placeholder="snare rim" />
                </div>
              )}
              <div className="grid grid-cols-2 gap-3">
                <div>
                  <label className="label" htmlFor="pad-note">MIDI note</label>
                  <input id="pad-note" type="number" min={0} max={127} className="field num" value={pad.note} onChange={(e) => patchPad(pad.id, { note: Math.max(0, Math.min(127, Math.round(Number(e.target.value) || 0))) })} />
                  <p className="mt-1 text-xs text-muted" data-testid="pad-note-name">{noteName(pad.note, middleC)} (middle C = {middleC})</p>
                </div>
                <div>
                  <label className="label" htmlFor="pad-channel">Channel</label>
                  <input id="pad-channel" type="number" min={1} max={16} className="field num" value={pad.channel} onChange={(e) => patchPad(pad.id, { channel: Math.max(1, Math.min(16, Math.round(Number(e.target.value) || 1))) })} />
                </div>
              </div>
              {(noteUse.get(`${pad.note}/${pad.channel}`) ?? 0) > 1 && <p className="text-xs text-muted"><SharedNoteMark /> Other pads send this note too (fine when they aim at the same target; the audit flags two different targets).</p>}
              <div>
                <label className="label" htmlFor="pad-slot">Target slot</label>
                <Select id="pad-slot" className="field" value={pad.target?.slotId ?? ""} onChange={(e) => {
                  const s = slots.find((x) => x.id === e.target.value);
                  patchPad(pad.id, { target: s ? { slotId: s.id, articulation: pad.target && familyStrokes(s.family, strokes).includes(pad.target.articulation) ? pad.target.articulation : FAMILY_ARTICULATIONS[s.family][0]! } : null });
                }}>
                  <option value="">— no target —</option>
                  {slots.map((s) => <option key={s.id} value={s.id}>{s.name} ({s.family})</option>)}
                </Select>
                {slots.length === 0 && <p className="mt-1 text-xs text-muted">Take the slot list from a kit below, or add a slot.</p>}
              </div>
              {pad.target && (
                <div>
                  <label className="label" htmlFor="pad-art">Stroke</label>
                  <Select id="pad-art" className="field" value={pad.target.articulation} onChange={(e) => patchPad(pad.id, { target: { slotId: pad.target!.slotId, articulation: e.target.value } })}>
                    {fam && <optgroup label={`${fam} strokes`}>{familyStrokes(fam, strokes).map((a) => <option key={a} value={a}>{a}</option>)}</optgroup>}
                    <optgroup label="other strokes">{allStrokes(strokes).filter((a) => !fam || !familyStrokes(fam, strokes).includes(a)).map((a) => <option key={a} value={a}>{a}</option>)}</optgroup>
                  </Select>
                </div>
              )}
              {lastVelocity[pad.id] !== undefined && <p className="text-xs text-muted">Last learned velocity: <span className="num">{lastVelocity[pad.id]}</span></p>}
              {canWrite && <button type="button" className="btn-danger py-1" onClick={() => { update((l) => ({ ...l, pads: l.pads.filter((x) => x.id !== pad.id) })); setSelected(null); }} disabled={layout.pads.length <= 1}>Remove pad</button>}
            </fieldset>
          )}
        </section>

        <section className="card space-y-3">
          <h2>Slots the pads aim at</h2>
          {canWrite && <div>
            <label className="label" htmlFor="slots-from-kit">Take slots from a kit</label>
            <Select id="slots-from-kit" className="field" value={kitForSlots} onChange={(e) => { setKitForSlots(e.target.value); const k = kits.find((x) => x.id === e.target.value); if (k) update((l) => ({ ...l, slots: mergeSlots(l.slots ?? [], k.slots) })); }}>
              <option value="">—</option>
              {kits.map((k) => <option key={k.id} value={k.id}>{k.name} ({k.slots.length} slots)</option>)}
            </Select>
          </div>}
          <ul className="flex max-h-48 flex-wrap gap-1 overflow-y-auto text-xs" data-testid="layout-slots" tabIndex={0} aria-label="Slots of this layout">{slots.map((s) => <li key={s.id} className="tag border-line">{s.name} <span className="ml-1 text-muted">{s.family}</span></li>)}</ul>
          {canWrite && <AddSlot onAdd={(s) => update((l) => ({ ...l, slots: mergeSlots(l.slots ?? [], [s]) }))} taken={new Set(slots.map((s) => s.id))} />}
        </section>

        {canWrite && (
          <div className="no-print space-y-2">
            <div className="flex items-center gap-2">
              <button type="button" className="btn-primary" onClick={save} disabled={saveLayout.isPending || !dirty}>Save layout</button>
              {dirty && <span className="text-sm text-warn">● unsaved changes</span>}
            </div>
          </div>
        )}
        {msg && <Message kind={msg.kind}>{msg.text}</Message>}
        {saveLayout.isSuccess && <Message kind="ok">Layout saved.</Message>}
        <FormError error={saveLayout.error} />
      </aside>
    </div>
  );
}

function mergeSlots(a: LayoutSlot[], b: LayoutSlot[]): LayoutSlot[] {
  const m = new Map(a.map((s) => [s.id, s]));
  for (const s of b) if (!m.has(s.id)) m.set(s.id, { id: s.id, name: s.name, family: s.family });
  return [...m.values()];
}

function AddSlot({ onAdd, taken }: { onAdd: (s: LayoutSlot) => void; taken: Set<string> }) {
  const [name, setName] = useState("");
  const [family, setFamily] = useState<Family>("snare");
  return (
    <div className="flex flex-wrap items-end gap-2">
      <div className="min-w-0 flex-1">
        <label className="label" htmlFor="new-slot-name">New slot</label>
        <input id="new-slot-name" className="field" value={name} onChange={(e) => setName(e.target.value)} placeholder="Snare B" />
      </div>
      <Select aria-label="Family the slot expects" className="field w-auto" value={family} onChange={(e) => setFamily(e.target.value as Family)}>
        {FAMILIES.map((f) => <option key={f} value={f}>{f}</option>)}
      </Select>
      <button type="button" className="btn-quiet" disabled={!name.trim()} onClick={() => {
        let id = name.trim().toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "slot";
        while (taken.has(id)) id += "-2";
        onAdd({ id, name: name.trim(), family });
        setName("");
      }}>Add</button>
    </div>
  );
}
