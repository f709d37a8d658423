"use client";
// The kit editor: an ordered list of named slots, each expecting a family and holding one catalogued instrument
// (offered from one library or every library of the studio, the slot's expected family first), with per-slot
// stand-in overrides; toms can be ordered by measured pitch, high to low. Members who may not edit see the kit
// as text with a "view only" note.
import { useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import { FormError, Message } from "@/components/form-bits";
import { useSaveKitSlots } from "@/components/data/kits";
import { ViewOnlyNote } from "@/components/view-only";
import { FAMILIES, FAMILY_ARTICULATIONS, type Family, type Stroke } from "@/lib/catalogue/taxonomy";
import { allStrokes, familyStrokes, type StrokeList } from "@/lib/catalogue/strokes";
import { proposeStrokeMap, strokeMapOverrides } from "@/lib/audit/stroke-map";
import { orderTomsByPitch } from "@/lib/audit/kits";
import { choicesForSlot, slotNameKey } from "@/lib/audit/kit-fill";
import type { Kit, KitSlot } from "@/lib/audit/types";
import type { InstrumentChoice } from "@/lib/api-types/kits";
import { Select } from "@/components/ui/select";
import { Tip } from "@/components/ui/tooltip";

/** Assign the instruments held by tom slots to those slots from high to low measured pitch (slot order kept). */
export function orderTomSlots(slots: KitSlot[], instruments: InstrumentChoice[]): KitSlot[] {
  const byId = new Map(instruments.map((i) => [i.id, i]));
  const tomIdx = slots.map((s, i) => (s.family === "tom" ? i : -1)).filter((i) => i >= 0);
  const held = tomIdx.map((i) => slots[i]!.instrumentId).filter((x): x is string => !!x && byId.has(x));
  const ordered = orderTomsByPitch(held.map((id) => ({ ...byId.get(id)!, articulations: [] })));
  const out = slots.map((s) => ({ ...s }));
  let k = 0;
  for (const i of tomIdx) {
    if (!out[i]!.instrumentId || !byId.has(out[i]!.instrumentId!)) continue;
    out[i]!.instrumentId = ordered[k++]!.id;
  }
  return out;
}

export function KitEditor({ studioId, kit, instruments, canWrite, strokes = [] }: { studioId: string; kit: Kit; instruments: InstrumentChoice[]; canWrite: boolean; strokes?: StrokeList }) {
  if (!canWrite) return <KitView kit={kit} instruments={instruments} />;
  return <KitForm studioId={studioId} kit={kit} instruments={instruments} strokes={strokes} />;
}

const instLabel = (i: InstrumentChoice) => `${i.name} — ${i.libraryName} · ${i.sampleCount} samples${i.pitchHz ? ` · ${Math.round(i.pitchHz)} Hz` : ""}`;

/** The libraries the kit's instruments come from, most used first (the picker starts on the first). */
function librariesOf(slots: KitSlot[], byId: Map<string, InstrumentChoice>): string[] {
  const n = new Map<string, number>();
  for (const s of slots) {
    const i = s.instrumentId ? byId.get(s.instrumentId) : undefined;
    if (i) n.set(i.libraryId, (n.get(i.libraryId) ?? 0) + 1);
  }
  return [...n].sort((a, b) => b[1] - a[1]).map(([id]) => id);
}

function KitForm({ studioId, kit, instruments, strokes }: { studioId: string; kit: Kit; instruments: InstrumentChoice[]; strokes: StrokeList }) {
  /** Per slot index, why each stroke of the last proposal plays what it plays. */
  const [proposals, setProposals] = useState<Record<number, Record<string, string>>>({});
  const router = useRouter();
  const [slots, setSlots] = useState<KitSlot[]>(kit.slots);
  const [dirty, setDirty] = useState(false);
  const saveSlots = useSaveKitSlots(studioId, kit.id);
  const byId = useMemo(() => new Map(instruments.map((i) => [i.id, i])), [instruments]);
  const libraries = useMemo(() => [...new Map(instruments.map((i) => [i.libraryId, i.libraryName])).entries()].sort((a, b) => a[1].localeCompare(b[1])), [instruments]);
  // only one library's instruments are offered, unless the kit already mixes libraries
  const [libraryId, setLibraryId] = useState<string>(() => {
    const used = librariesOf(kit.slots, new Map(instruments.map((i) => [i.id, i])));
    return used.length === 1 ? used[0]! : used.length === 0 && libraries.length === 1 ? libraries[0]![0] : "";
  });
  const clash = useMemo(() => {
    const n = new Map<string, number>();
    for (const s of slots) n.set(slotNameKey(s.name), (n.get(slotNameKey(s.name)) ?? 0) + 1);
    return new Set([...n].filter(([, c]) => c > 1).map(([k]) => k));
  }, [slots]);

  const change = (next: KitSlot[]) => { setSlots(next); setDirty(true); saveSlots.reset(); };
  const patch = (i: number, p: Partial<KitSlot>) => change(slots.map((s, j) => (j === i ? { ...s, ...p } : s)));
  const move = (i: number, d: number) => {
    const j = i + d;
    if (j < 0 || j >= slots.length) return;
    const next = [...slots];
    [next[i], next[j]] = [next[j]!, next[i]!];
    change(next);
  };
  const addSlot = () => {
    const ids = new Set(slots.map((s) => s.id));
    const names = new Set(slots.map((s) => slotNameKey(s.name)));
    let n = slots.length + 1;
    while (ids.has(`slot-${n}`) || names.has(slotNameKey(`Slot ${n}`))) n++;
    change([...slots, { id: `slot-${n}`, name: `Slot ${n}`, family: "snare", instrumentId: null }]);
  };

  const save = () =>
    saveSlots.mutate(slots, {
      onSuccess: () => {
        setDirty(false);
        router.refresh();
      },
    });

  return (
    <div className="space-y-4">
      {instruments.length === 0 && (
        <Message kind="info">This studio has no catalogued instruments yet. Upload samples to a library; once they are measured and catalogued, their instruments appear here.</Message>
      )}
      {libraries.length > 1 && (
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <label htmlFor="kit-library-filter" className="font-medium">Offer instruments from</label>
          <Select id="kit-library-filter" className="field w-auto" value={libraryId} onChange={(e) => setLibraryId(e.target.value)}>
            {libraries.map(([id, name]) => <option key={id} value={id}>{name}</option>)}
            <option value="">every library</option>
          </Select>
        </div>
      )}
      <div className="hidden grid-cols-[2rem_1fr_9rem_2fr_auto] gap-2 px-3 text-xs font-medium text-muted md:grid" aria-hidden><span>#</span><span>Slot</span><span>Expects</span><span>Instrument (family · library · samples)</span><span /></div>
      <ol className="card p-0" data-testid="kit-slots">
        {slots.map((s, i) => {
          const inst = s.instrumentId ? byId.get(s.instrumentId) : undefined;
          const otherFamily = inst && inst.family !== s.family;
          const overrides = Object.entries(s.standIns ?? {}) as Array<[Stroke, Stroke]>;
          const fam = inst?.family ?? s.family;
          const slotStrokes = familyStrokes(s.family, strokes);
          const playable = [...familyStrokes(fam, strokes), ...allStrokes(strokes).filter((a) => !familyStrokes(fam, strokes).includes(a))];
          const why = proposals[i];
          return (
            <li key={i} className="space-y-1 border-t border-line px-3 py-2" data-testid="kit-slot">
              <div className="grid items-start gap-2 md:grid-cols-[2rem_1fr_9rem_2fr_auto]">
                <span className="num pt-2 text-muted">{i + 1}.</span>
                <div>
                  <label className="sr-only" htmlFor={`slot-name-${i}`}>Slot name</label>
                  <input id={`slot-name-${i}`} className="field py-1.5" value={s.name} aria-invalid={clash.has(slotNameKey(s.name))} aria-describedby={clash.has(slotNameKey(s.name)) ? `slot-name-${i}-clash` : undefined} onChange={(e) => patch(i, { name: e.target.value })} />
                  {clash.has(slotNameKey(s.name)) && <p id={`slot-name-${i}-clash`} className="mt-0.5 text-xs text-warn">⚠ another slot has this name</p>}
                </div>
                <div>
                  <label className="sr-only" htmlFor={`slot-family-${i}`}>Expects</label>
                  <Select id={`slot-family-${i}`} className="field py-1.5" value={s.family} onChange={(e) => patch(i, { family: e.target.value as Family })}>
                    {FAMILIES.map((f) => <option key={f} value={f}>{f}</option>)}
                  </Select>
                </div>
                <div>
                  <label className="sr-only" htmlFor={`slot-inst-${i}`}>Instrument</label>
                  <Select id={`slot-inst-${i}`} className="field py-1.5" value={s.instrumentId ?? ""} onChange={(e) => patch(i, { instrumentId: e.target.value || null })}>
                    <option value="">— empty slot (its pads stay silent) —</option>
                    {s.instrumentId && !inst && <option value={s.instrumentId}>missing instrument {s.instrumentId}</option>}
                    {inst && libraryId && inst.libraryId !== libraryId && <option value={inst.id}>{instLabel(inst)}</option>}
                    {(() => {
                      const c = choicesForSlot(s.family, instruments, libraryId || null);
                      return (<>
                        <optgroup label={c.expected.length ? `${s.family} (what this slot expects)` : `no ${s.family} in this library`}>
                          {c.expected.map((x) => <option key={x.id} value={x.id}>{instLabel(x)}</option>)}
                        </optgroup>
                        {c.others.map((g) => (
                          <optgroup key={g.family} label={`other families: ${g.family}`}>
                            {g.instruments.map((x) => <option key={x.id} value={x.id}>{instLabel(x)}</option>)}
                          </optgroup>
                        ))}
                      </>);
                    })()}
                  </Select>
                  {inst && <p className="mt-0.5 text-xs text-muted">Recorded: {inst.articulations.join(", ") || "nothing yet"}</p>}
                  {otherFamily && (overrides.length
                    ? <p className="mt-0.5 text-xs text-muted">Holds a {inst.family} in a {s.family} slot: its stroke map below says which {inst.family} stroke answers each {s.family} stroke.</p>
                    : <p className="mt-0.5 text-xs text-warn">⚠ holds a {inst.family} in a {s.family} slot: without a stroke map the {inst.family}’s own strokes answer (a {s.family} rim shot falls to its main stroke). Propose a stroke map below.</p>)}
                  {s.instrumentId && !inst && <p className="mt-0.5 text-xs text-bad">✕ this instrument is no longer in the catalogue.</p>}
                </div>
                <div className="flex gap-1">
                  <button type="button" className="btn-quiet px-2 py-1" onClick={() => move(i, -1)} disabled={i === 0} aria-label={`Move ${s.name} up`}>↑</button>
                  <button type="button" className="btn-quiet px-2 py-1" onClick={() => move(i, 1)} disabled={i === slots.length - 1} aria-label={`Move ${s.name} down`}>↓</button>
                  <button type="button" className="btn-danger px-2 py-1" onClick={() => change(slots.filter((_, j) => j !== i))} aria-label={`Remove slot ${s.name}`}>✕</button>
                </div>
              </div>
              <details className="md:ml-10" open={otherFamily || undefined} data-testid="stroke-map">
                <summary className="cursor-pointer text-xs text-muted">Stroke map ({overrides.length})</summary>
                <div className="mt-2 space-y-2">
                  <p className="text-xs text-muted">When a pad asks this slot for a stroke the instrument lacks, play this one instead (used when it is recorded; otherwise the closeness graph decides).</p>
                  {inst && (
                    <button type="button" className="btn-quiet py-1" onClick={() => {
                      const entries = proposeStrokeMap(s.family, inst.family, inst.articulations, strokes);
                      const map = strokeMapOverrides(entries);
                      setProposals({ ...proposals, [i]: Object.fromEntries(entries.filter((e) => map[e.requested]).map((e) => [e.requested, e.why])) });
                      patch(i, { standIns: Object.keys(map).length ? map : undefined });
                    }}>Propose a stroke map</button>
                  )}
                  {overrides.map(([req, play], k) => (
                    <div key={k} className="flex flex-wrap items-center gap-2 text-sm">
                      <Select aria-label="Requested stroke" className="field w-auto" value={req} onChange={(e) => {
                        const next = { ...(s.standIns ?? {}) };
                        delete next[req];
                        next[e.target.value] = play;
                        patch(i, { standIns: next });
                      }}>
                        {[...slotStrokes, ...allStrokes(strokes).filter((a) => !slotStrokes.includes(a))].map((a) => <option key={a} value={a}>{a}</option>)}
                      </Select>
                      <span aria-hidden>→</span>
                      <Select aria-label="Plays instead" className="field w-auto" value={play} onChange={(e) => patch(i, { standIns: { ...(s.standIns ?? {}), [req]: e.target.value } })}>
                        {playable.map((a) => <option key={a} value={a}>{a}</option>)}
                      </Select>
                      <button type="button" className="btn-quiet py-1" onClick={() => { const next = { ...(s.standIns ?? {}) }; delete next[req]; patch(i, { standIns: Object.keys(next).length ? next : undefined }); }}>Remove</button>
                      {why?.[req] && <span className="basis-full text-xs text-muted">{why[req]}</span>}
                    </div>
                  ))}
                  <button type="button" className="btn-quiet py-1" onClick={() => {
                    const used = new Set(Object.keys(s.standIns ?? {}));
                    const req = slotStrokes.find((a) => !used.has(a) && !inst?.articulations.includes(a)) ?? allStrokes(strokes).find((a) => !used.has(a))!;
                    patch(i, { standIns: { ...(s.standIns ?? {}), [req]: FAMILY_ARTICULATIONS[fam][0]! } });
                  }}>Add a row</button>
                </div>
              </details>
            </li>
          );
        })}
      </ol>
      {slots.length === 0 && <p className="text-sm text-muted">No slots yet.</p>}
      <div className="no-print sticky bottom-0 flex flex-wrap items-center gap-2 border-t border-line bg-paper py-3">
        <button type="button" className="btn-quiet" onClick={addSlot}>Add slot</button>
        <Tip content="Tom slots keep their places; the toms they hold are reordered from the highest measured pitch to the lowest"><button type="button" className="btn-quiet" onClick={() => change(orderTomSlots(slots, instruments))}>Order toms by pitch (high → low)</button></Tip>
        <button type="button" className="btn-primary" onClick={save} disabled={saveSlots.isPending || !dirty}>Save kit</button>
        {dirty && <span className="text-sm text-warn">● unsaved changes</span>}
        {saveSlots.isSuccess && <Message kind="ok">Kit saved.</Message>}
        <FormError error={saveSlots.error} />
      </div>
    </div>
  );
}

/** The kit as text, for members who may not change it: one row per slot, stacked on a phone. */
function KitView({ kit, instruments }: { kit: Kit; instruments: InstrumentChoice[] }) {
  const byId = new Map(instruments.map((i) => [i.id, i]));
  const grid = "md:grid md:grid-cols-[13rem_7rem_minmax(0,1fr)_11rem] md:gap-3";
  return (
    <div className="space-y-3">
      <ViewOnlyNote what="this kit" />
      {kit.slots.length === 0 ? <p className="text-sm text-muted">This kit has no slots yet.</p> : (
        <div className="card p-0">
          <div className={`hidden px-4 py-2 text-xs font-medium text-muted ${grid}`} aria-hidden><span>Slot</span><span>Expects</span><span>Instrument</span><span>Stroke map</span></div>
          <ol className="text-sm" data-testid="kit-slots" aria-label="Slots of the kit">
            {kit.slots.map((s, i) => {
              const inst = s.instrumentId ? byId.get(s.instrumentId) : undefined;
              const overrides = Object.entries(s.standIns ?? {});
              return (
                <li key={s.id} className={`space-y-1 border-t border-line px-4 py-2 md:space-y-0 ${grid}`} data-testid="kit-slot">
                  <p className="flex gap-2 font-medium">
                    <span className="num w-6 shrink-0 text-muted">{i + 1}.</span>
                    <span data-testid="kit-slot-name">{s.name}</span>
                    <span className="font-normal text-muted md:hidden">expects {s.family}</span>
                  </p>
                  <p className="hidden md:block">{s.family}</p>
                  <div className="pl-8 md:pl-0">
                    {!s.instrumentId ? <span className="text-muted">empty: its pads stay silent</span>
                      : !inst ? <span className="text-bad">✕ no longer in the catalogue</span>
                      : <>{instLabel(inst)}<span className="block text-xs text-muted">Recorded: {inst.articulations.join(", ") || "nothing yet"}</span></>}
                    {inst && inst.family !== s.family && <span className="block text-xs text-warn">⚠ a {inst.family} in a {s.family} slot</span>}
                  </div>
                  <p className={`pl-8 text-xs md:pl-0 ${overrides.length ? "" : "hidden md:block"}`}><span className="md:hidden">Stroke map: </span>{overrides.length ? overrides.map(([req, play]) => `${req} → ${play}`).join(", ") : <span className="text-muted">none</span>}</p>
                </li>
              );
            })}
          </ol>
        </div>
      )}
    </div>
  );
}
