"use client";
// Instruments of a library: rename (kept when the library is catalogued again) and merge several into one.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { FormError, Message } from "../form-bits";
import { useMergeInstruments, useRenameInstrument } from "../data/instruments";
import { ViewOnlyNote } from "../view-only";
import type { InstrumentRow } from "@/lib/api-types/instruments";
import { Select } from "@/components/ui/select";

export function InstrumentsList({ studioId, libraryId, instruments, canWrite }: { studioId: string; libraryId: string; instruments: InstrumentRow[]; canWrite: boolean }) {
  const router = useRouter();
  const [picked, setPicked] = useState<Set<string>>(new Set());
  const [target, setTarget] = useState("");
  const merge = useMergeInstruments(studioId, libraryId);
  const mergePicked = () =>
    merge.mutate({ sourceIds: [...picked].filter((x) => x !== target), targetId: target }, {
      onSuccess: () => {
        setPicked(new Set());
        setTimeout(() => router.refresh(), 2500);
      },
    });
  const byFamily = new Map<string, InstrumentRow[]>();
  for (const i of instruments) byFamily.set(i.family, [...(byFamily.get(i.family) ?? []), i]);
  return (
    <div className="space-y-4">
      {!canWrite && <ViewOnlyNote what="instrument names or merge instruments" />}
      {canWrite && (
        <div className="card flex flex-wrap items-end gap-3 p-3 text-sm">
          <span className="pb-2"><span className="num">{picked.size}</span> selected</span>
          <div>
            <label className="label" htmlFor="merge-target">Merge the selected into</label>
            <Select id="merge-target" className="field w-64" value={target} onChange={(e) => setTarget(e.target.value)}>
              <option value="">choose an instrument</option>
              {instruments.filter((i) => picked.has(i.id)).map((i) => <option key={i.id} value={i.id}>{i.name}</option>)}
            </Select>
          </div>
          <button type="button" className="btn-primary" disabled={picked.size < 2 || !target || merge.isPending} onClick={mergePicked}>Merge</button>
          {merge.isSuccess && <Message kind="ok">{`Moved ${merge.data.moved} samples; the library is being catalogued again.`}</Message>}
          <FormError error={merge.error} fallback="Could not merge." />
        </div>
      )}
      {instruments.length === 0 && <p className="card text-sm text-muted">No instruments yet: they appear once samples are measured and sorted.</p>}
      {[...byFamily.entries()].map(([family, list]) => (
        <section key={family} className="card p-0">
          <h3 className="px-4 pt-3 font-semibold capitalize">{family}</h3>
          <ul className="divide-y divide-line text-sm">
            {list.map((i) => (
              <li key={i.id} className="flex flex-wrap items-center gap-3 px-4 py-2">
                {canWrite && <input type="checkbox" aria-label={`Select ${i.name}`} checked={picked.has(i.id)} onChange={(e) => setPicked((s) => { const n = new Set(s); if (e.target.checked) n.add(i.id); else n.delete(i.id); return n; })} />}
                <RenameField studioId={studioId} libraryId={libraryId} inst={i} canWrite={canWrite} />
                <span className="text-xs text-muted"><span className="num">{i.sampleCount}</span> samples{i.pitchHz ? <> · pitch <span className="num">{Math.round(i.pitchHz)}</span> Hz</> : null}{i.nameSource === "person" ? " · named by a member" : ""}</span>
                <a className="ml-auto text-xs" href={`/s/${studioId}/libraries/${libraryId}?instrument=${encodeURIComponent(i.key)}`}>samples →</a>
              </li>
            ))}
          </ul>
        </section>
      ))}
    </div>
  );
}

function RenameField({ studioId, libraryId, inst, canWrite }: { studioId: string; libraryId: string; inst: InstrumentRow; canWrite: boolean }) {
  const router = useRouter();
  const [name, setName] = useState(inst.name);
  const m = useRenameInstrument(studioId, libraryId, inst.id);
  if (!canWrite) return <span className="font-medium">{inst.name}</span>;
  return (
    <form className="flex items-center gap-2" onSubmit={(e) => { e.preventDefault(); if (name.trim()) m.mutate(name, { onSuccess: () => router.refresh() }); }}>
      <input className="field w-56 py-1" value={name} onChange={(e) => setName(e.target.value)} aria-label={`Name of ${inst.name}`} maxLength={160} />
      {name !== inst.name && <button className="btn-quiet px-2 py-1" disabled={m.isPending}>Rename</button>}
      <FormError error={m.error} fallback="Could not rename." compact />
    </form>
  );
}
