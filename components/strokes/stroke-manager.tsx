"use client";
// The studio's own strokes: the list, a form to add or change one (name, families, file-name words, nearest
// strokes with a closeness), and removing one. A change that would leave samples, kits or layouts pointing at a
// stroke that is gone asks first, shows what uses it, and moves those uses where the member says.
import { useMemo, useState } from "react";
import { FAMILIES, type Family } from "@/lib/catalogue/taxonomy";
import { CLOSENESS, closenessOf, familyStrokes, strokeIdFromName, type StudioStroke } from "@/lib/catalogue/strokes";
import { strokeInputSchema } from "@/lib/validation/strokes";
import type { StrokeListAnswer, StrokeUses } from "@/lib/api-types/strokes";
import { ApiError } from "@/components/data/api";
import { paths } from "@/components/data/paths";
import { useAddStroke, useDeleteStroke, useStrokes, useStrokeUses, useUpdateStroke } from "@/components/data/strokes";
import { Field, FormError, Message, useFieldCheck } from "@/components/form-bits";
import { Select } from "@/components/ui/select";
import { Dialog } from "@/components/ui/dialog";
import { ViewOnlyNote } from "@/components/view-only";

const words = (id: string) => id.replace(/-/g, " ");

/** What uses a stroke, as a list a person reads. */
function UsesList({ uses }: { uses: StrokeUses }) {
  return (
    <ul className="list-disc space-y-1 pl-5 text-sm" data-testid="stroke-uses">
      {uses.samples.map((s) => <li key={s.libraryId}>{s.count} sample{s.count === 1 ? "" : "s"} in “{s.libraryName}”</li>)}
      {uses.kits.map((k) => <li key={k.id}>kit “{k.name}”: the stroke map of {k.slots.map((x) => `“${x}”`).join(", ")}</li>)}
      {uses.layouts.map((l) => <li key={l.id}>layout “{l.name}”: {[l.pads.length ? `pads ${l.pads.map((p) => `“${p}”`).join(", ")}` : "", l.pedalZones ? `${l.pedalZones} pedal zone${l.pedalZones === 1 ? "" : "s"}` : ""].filter(Boolean).join(" and ")}</li>)}
      {uses.strokes.length > 0 && <li>the nearest strokes of {uses.strokes.map((x) => `“${words(x)}”`).join(", ")}</li>}
    </ul>
  );
}

type Draft = { name: string; families: Family[]; words: string; neighbours: { to: string; cost: number }[] };
const emptyDraft: Draft = { name: "", families: [], words: "", neighbours: [] };
const toDraft = (s: StudioStroke): Draft => ({ name: s.name, families: [...s.families], words: s.words.join(", "), neighbours: s.neighbours.map((e) => ({ ...e })) });

function StrokeForm({ studioId, list, editing, onDone }: { studioId: string; list: StudioStroke[]; editing: StudioStroke | null; onDone: () => void }) {
  const [d, setD] = useState<Draft>(editing ? toDraft(editing) : emptyDraft);
  const [pendingMove, setPendingMove] = useState<{ uses: StrokeUses; moveTo: string } | null>(null);
  const { fields, check } = useFieldCheck();
  const add = useAddStroke(studioId);
  const update = useUpdateStroke(studioId);
  const id = strokeIdFromName(d.name);
  // neighbours: strokes of the chosen families (built-in first, then the studio's), never the stroke itself
  const choices = useMemo(() => {
    const out: string[] = [];
    for (const f of d.families.length ? d.families : FAMILIES) for (const s of familyStrokes(f, list)) if (!out.includes(s) && s !== id && s !== editing?.id) out.push(s);
    return out;
  }, [d.families, list, id, editing]);
  const body = () => ({ name: d.name, families: d.families, words: d.words.split(",").map((w) => w.trim()).filter(Boolean), neighbours: d.neighbours });
  const submit = (moveUses?: boolean) => {
    const parsed = check(strokeInputSchema, body());
    if (!parsed) return;
    const done = () => { setD(emptyDraft); setPendingMove(null); onDone(); };
    if (editing) {
      update.mutate({ strokeId: editing.id, body: { ...parsed, ...(moveUses ? { moveUses: true } : {}) } }, {
        onSuccess: done,
        onError: (e) => {
          if (e instanceof ApiError && e.status === 409 && e.details && typeof e.details === "object" && "uses" in e.details) setPendingMove(e.details as { uses: StrokeUses; moveTo: string });
        },
      });
    } else add.mutate(parsed, { onSuccess: done });
  };
  const m = editing ? update : add;
  return (
    <form className="card space-y-4" noValidate onSubmit={(e) => { e.preventDefault(); submit(); }} data-testid="stroke-form">
      <h3 className="text-base font-semibold">{editing ? `Change “${editing.name}”` : "Add a stroke"}</h3>
      <Field label="Name" name="name" value={d.name} maxLength={60} onChange={(e) => setD({ ...d, name: e.target.value })} error={fields.name}
        hint={d.name ? `Its id in files and exports: ${id || "—"}` : "As a drummer would say it: “tip”, “buzz rim shot”, “heel tone”."} />
      <fieldset>
        <legend className="label">Recorded on</legend>
        <div className="mt-1 flex flex-wrap gap-2">
          {FAMILIES.map((f) => (
            <label key={f} className={`tag cursor-pointer select-none has-[:focus-visible]:ring-2 has-[:focus-visible]:ring-brand ${d.families.includes(f) ? "border-brand bg-brand-soft text-brand" : "border-line"}`}>
              <input type="checkbox" className="sr-only" checked={d.families.includes(f)} onChange={(e) => setD({ ...d, families: e.target.checked ? FAMILIES.filter((x) => x === f || d.families.includes(x)) : d.families.filter((x) => x !== f) })} />
              {words(f)}
            </label>
          ))}
        </div>
        {fields.families && <p className="mt-1 text-xs text-bad">{fields.families}</p>}
      </fieldset>
      <Field label="Words in file names" name="words" value={d.words} onChange={(e) => setD({ ...d, words: e.target.value })} error={fields.words}
        hint="Comma-separated; a file whose name holds one of them is sorted into this stroke (“tip, tp”, “buzz rim”)." />
      <fieldset className="space-y-2">
        <legend className="label">Nearest strokes (played instead when this one was not recorded)</legend>
        {d.neighbours.map((n, i) => (
          <div key={i} className="flex flex-wrap items-center gap-2" data-testid="neighbour-row">
            <Select aria-label={`Neighbour ${i + 1}`} className="field w-auto min-w-40" value={n.to} onChange={(e) => setD({ ...d, neighbours: d.neighbours.map((x, j) => (j === i ? { ...x, to: e.target.value } : x)) })}>
              {[...(choices.includes(n.to) ? [] : [n.to]), ...choices].map((s) => <option key={s} value={s}>{words(s)}</option>)}
            </Select>
            <Select aria-label={`Closeness ${i + 1}`} className="field w-auto" value={String(closenessOf(n.cost).cost)} onChange={(e) => setD({ ...d, neighbours: d.neighbours.map((x, j) => (j === i ? { ...x, cost: Number(e.target.value) } : x)) })}>
              {CLOSENESS.map((c) => <option key={c.id} value={String(c.cost)}>{c.label}</option>)}
            </Select>
            <button type="button" className="btn-quiet py-1" onClick={() => setD({ ...d, neighbours: d.neighbours.filter((_, j) => j !== i) })}>Remove</button>
          </div>
        ))}
        {fields.neighbours && <p className="text-xs text-bad">{fields.neighbours}</p>}
        <button type="button" className="btn-quiet" disabled={!choices.length || d.neighbours.length >= 20}
          onClick={() => setD({ ...d, neighbours: [...d.neighbours, { to: choices.find((c) => !d.neighbours.some((n) => n.to === c)) ?? choices[0]!, cost: 1 }] })}>
          Add a nearest stroke
        </button>
      </fieldset>
      {!(m.error instanceof ApiError && m.error.status === 409 && pendingMove) && <FormError error={m.error} />}
      <div className="flex flex-wrap gap-2">
        <button className="btn-primary" disabled={m.isPending}>{editing ? "Save the stroke" : "Add the stroke"}</button>
        {editing && <button type="button" className="btn-quiet" onClick={() => { setD(emptyDraft); onDone(); }}>Cancel</button>}
      </div>
      <Dialog open={!!pendingMove} onOpenChange={(o) => { if (!o) setPendingMove(null); }} title={`Rename “${editing?.name}” to “${d.name}”?`}
        description="The new name is a new id. These use the stroke now; they move to the new name:">
        {pendingMove && <UsesList uses={pendingMove.uses} />}
        <div className="mt-4 flex flex-wrap justify-end gap-2">
          <button type="button" className="btn-quiet" onClick={() => setPendingMove(null)}>Keep the old name</button>
          <button type="button" className="btn-primary" disabled={update.isPending} onClick={() => submit(true)}>Rename and move them</button>
        </div>
      </Dialog>
    </form>
  );
}

function RemoveStroke({ studioId, stroke, list }: { studioId: string; stroke: StudioStroke; list: StudioStroke[] }) {
  const [open, setOpen] = useState(false);
  const uses = useStrokeUses(studioId, open ? stroke.id : null);
  const del = useDeleteStroke(studioId);
  const targets = useMemo(() => {
    const out: string[] = [];
    for (const f of stroke.families) for (const s of familyStrokes(f, list)) if (s !== stroke.id && !out.includes(s)) out.push(s);
    return out;
  }, [stroke, list]);
  const [moveTo, setMoveTo] = useState(stroke.neighbours[0]?.to ?? targets[0] ?? "");
  const used = (uses.data?.total ?? 0) > 0;
  return (
    <Dialog open={open} onOpenChange={setOpen} title={`Remove “${stroke.name}”?`} trigger={<button type="button" className="btn-quiet py-1">Remove</button>}>
      {uses.isPending ? <p className="text-sm text-muted">Looking for what uses it…</p> : uses.isError ? <FormError error={uses.error} /> : used ? (
        <div className="space-y-3">
          <p className="text-sm">These use it now. Nothing is dropped: say where they move.</p>
          <UsesList uses={uses.data!} />
          <div>
            <label className="label" htmlFor={`move-${stroke.id}`}>Move them to</label>
            <Select id={`move-${stroke.id}`} className="field" value={moveTo} onChange={(e) => setMoveTo(e.target.value)}>
              {targets.map((s) => <option key={s} value={s}>{words(s)}</option>)}
            </Select>
          </div>
        </div>
      ) : <p className="text-sm">No sample, kit, layout or other stroke uses it.</p>}
      <FormError error={del.error} />
      <div className="mt-4 flex flex-wrap justify-end gap-2">
        <button type="button" className="btn-quiet" onClick={() => setOpen(false)}>Keep it</button>
        <button type="button" className="btn-danger" disabled={uses.isPending || del.isPending || (used && !moveTo)}
          onClick={() => del.mutate({ strokeId: stroke.id, moveTo: used ? moveTo : undefined }, { onSuccess: () => setOpen(false) })}>
          {used ? "Remove and move them" : "Remove"}
        </button>
      </div>
    </Dialog>
  );
}

export function StrokeManager({ studioId, initial, canWrite }: { studioId: string; initial: StrokeListAnswer; canWrite: boolean }) {
  const q = useStrokes(studioId, initial);
  const data = q.data ?? initial;
  const [editing, setEditing] = useState<StudioStroke | null>(null);
  const [done, setDone] = useState<string | null>(null);
  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_360px]">
      <section className="space-y-4">
        {!canWrite && <ViewOnlyNote what="strokes" permission="studio:write" />}
        <div className="card space-y-3" data-testid="studio-strokes">
          <h2 className="text-lg">Your studio’s strokes</h2>
          {data.strokes.length === 0 ? (
            <p className="text-sm text-muted">None yet. Add the strokes your recordings hold that the list on the right lacks (a cowbell’s throat, a hi-hat’s tight closed, a cymbal grab); files named with their words are sorted into them, and pads can aim at them.</p>
          ) : (
            <ul className="divide-y divide-line">
              {data.strokes.map((s) => (
                <li key={s.id} className="flex flex-wrap items-start justify-between gap-3 py-3" data-testid={`stroke-${s.id}`}>
                  <div className="min-w-0 space-y-1">
                    <p className="font-medium">{s.name} <span className="text-xs text-muted">({s.id})</span></p>
                    <p className="text-sm text-muted">on {s.families.map(words).join(", ")}{s.words.length ? <> · names with {s.words.map((w) => `“${w}”`).join(", ")}</> : null}</p>
                    {s.neighbours.length > 0 && <p className="text-sm">nearest: {s.neighbours.map((e) => `${words(e.to)} (${closenessOf(e.cost).label})`).join(", ")}</p>}
                  </div>
                  {canWrite && (
                    <div className="flex gap-1">
                      <button type="button" className="btn-quiet py-1" onClick={() => { setEditing(s); setDone(null); }}>Change</button>
                      <RemoveStroke studioId={studioId} stroke={s} list={data.strokes} />
                    </div>
                  )}
                </li>
              ))}
            </ul>
          )}
          <p className="text-sm"><a className="underline" href={paths.strokesFile(studioId)} download>Download the stroke list</a> <span className="text-muted">(for <code>kitwright catalogue|audit|suggest --strokes</code>)</span></p>
        </div>
        {done && <Message kind="ok">{done}</Message>}
        {canWrite && <StrokeForm key={editing?.id ?? "new"} studioId={studioId} list={data.strokes} editing={editing} onDone={() => { setDone(editing ? "Stroke saved. The libraries are being catalogued again." : "Stroke added. The libraries are being catalogued again, so files named with its words move into it."); setEditing(null); }} />}
      </section>
      <aside className="card space-y-3" data-testid="built-in-strokes">
        <h2 className="text-lg">Built-in strokes</h2>
        <p className="text-sm text-muted">The strokes Kitwright knows for every studio, by family.</p>
        <dl className="space-y-2 text-sm">
          {FAMILIES.map((f) => (
            <div key={f}>
              <dt className="font-medium">{words(f)}</dt>
              <dd className="text-muted">{data.builtIn[f].map(words).join(", ")}</dd>
            </div>
          ))}
        </dl>
      </aside>
    </div>
  );
}
