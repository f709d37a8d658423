"use client";
// The samples browser: a TanStack Table over one page of samples at a time; sorting, filtering and paging
// happen on the server and live in the URL. Members who may write can select samples and relabel or confirm
// them in bulk; viewers browse and listen.
import { useEffect, useMemo, useState } from "react";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef } from "@tanstack/react-table";
import { FormError, Message } from "../form-bits";
import { useConfirmSamples, useRelabelSamples, useSamplesPage } from "../data/samples";
import { StateTag } from "./state-counts";
import { SampleDetail } from "./sample-detail";
import { FAMILIES } from "@/lib/catalogue/taxonomy";
import { allStrokes, type StrokeList } from "@/lib/catalogue/strokes";
import { MIC_POSITIONS } from "@/lib/catalogue/names";
import { formatConfidence, soundUnsure } from "@/lib/catalogue/confidence";
import type { RelabelBody, SampleRow } from "@/lib/api-types/samples";
import { SAMPLE_FLAGS, SAMPLE_STATES, type SampleFlag } from "@/lib/validation/library";
import { Select as UiSelect } from "@/components/ui/select";
import { Tip } from "@/components/ui/tooltip";

const FLAG_WORDS: Record<SampleFlag, string> = { review: "either reason", conflict: "name ≠ sound", unsure: "sound unsure" };

type Inst = { key: string; name: string; family: string };

const SORTABLE: Record<string, string> = { path: "path", state: "state", family: "family", articulation: "articulation", instrument: "instrument", layer: "layer", rr: "roundRobin", mic: "mic", strike: "strike", truePeak: "truePeak", duration: "duration", confidence: "confidence" };
/** The URL parameters that narrow the list (an empty list with any of them set is "no match", not "no samples"). */
const FILTERS = ["q", "family", "articulation", "state", "instrument", "flag"] as const;
const fmt = (x: number | null, d = 1) => (x === null || !Number.isFinite(x) ? "–" : x.toFixed(d));
const SRC: Record<string, string> = { name: "from the name", sound: "from the sound", person: "confirmed by a member" };
const srcMark = (s: string | null) => (s === "person" ? "✓" : s === "sound" ? "~" : s === "name" ? "" : "");

export function SamplesBrowser({ studioId, libraryId, canWrite, instruments, strokes = [] }: { studioId: string; libraryId: string; canWrite: boolean; instruments: Inst[]; strokes?: StrokeList }) {
  const sp = useSearchParams();
  const router = useRouter();
  const pathname = usePathname();
  const params = useMemo(() => {
    const p = new URLSearchParams();
    for (const k of ["page", "pageSize", "sort", "dir", "q", "family", "articulation", "state", "instrument", "flag"]) {
      const v = sp.get(k);
      if (v) p.set(k, v);
    }
    return p;
  }, [sp]);
  const setParams = (patch: Record<string, string | null>, resetPage = true) => {
    const p = new URLSearchParams(sp.toString());
    for (const [k, v] of Object.entries(patch)) (v === null || v === "" ? p.delete(k) : p.set(k, v));
    if (resetPage && !("page" in patch)) p.delete("page");
    router.replace(`${pathname}?${p.toString()}`, { scroll: false });
  };
  const [q, setQ] = useState(sp.get("q") ?? "");
  useEffect(() => {
    const t = setTimeout(() => (q !== (sp.get("q") ?? "") ? setParams({ q }) : undefined), 300);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [q]);

  const query = useSamplesPage(studioId, libraryId, params.toString());
  const data = query.data;
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const sort = sp.get("sort") ?? "path";
  const dir = sp.get("dir") ?? "asc";
  const page = Number(sp.get("page") ?? "1");
  const pageSize = Number(sp.get("pageSize") ?? "50");
  const openId = sp.get("sample");
  const filtered = FILTERS.some((k) => sp.get(k));
  const clearFilters = () => {
    setQ("");
    setParams(Object.fromEntries(FILTERS.map((k) => [k, null])));
  };

  const columns = useMemo<ColumnDef<SampleRow>[]>(() => {
    const cols: ColumnDef<SampleRow>[] = [];
    if (canWrite)
      cols.push({
        id: "select",
        header: () => null,
        cell: ({ row }) => (
          <input
            type="checkbox"
            aria-label={`Select ${row.original.path}`}
            checked={selected.has(row.original.id)}
            onChange={(e) => setSelected((s) => {
              const n = new Set(s);
              if (e.target.checked) n.add(row.original.id);
              else n.delete(row.original.id);
              return n;
            })}
          />
        ),
      });
    cols.push(
      {
        id: "path",
        header: "File",
        cell: ({ row }) => (
          <button type="button" className="max-w-72 truncate text-left text-brand hover:underline" title={row.original.path} onClick={() => setParams({ sample: row.original.id }, false)}>
            {row.original.path}
          </button>
        ),
      },
      { id: "state", header: "State", cell: ({ row }) => <span title={row.original.rejectReason ?? undefined}><StateTag state={row.original.state} />{row.original.rejectReason && <span className="ml-1 block max-w-48 truncate text-xs text-bad">{row.original.rejectReason}</span>}</span> },
      { id: "family", header: "Family", cell: ({ row }) => <span title={SRC[row.original.familySource ?? ""]}>{row.original.family ?? "–"} <span className="text-muted">{srcMark(row.original.familySource)}</span></span> },
      { id: "articulation", header: "Articulation", cell: ({ row }) => <span title={SRC[row.original.articulationSource ?? ""]}>{row.original.articulation ?? "–"} <span className="text-muted">{srcMark(row.original.articulationSource)}</span></span> },
      { id: "instrument", header: "Instrument", cell: ({ row }) => row.original.instrumentName ?? row.original.instrumentKey ?? "–" },
      { id: "layer", header: "Layer", cell: ({ row }) => (row.original.layerIndex === null ? "–" : <span className="num" title={`velocity ${row.original.velocityLow}–${row.original.velocityHigh}`}>{row.original.layerIndex + 1}/{row.original.layerCount}</span>) },
      { id: "rr", header: "RR", cell: ({ row }) => <span className="num">{row.original.roundRobin ?? "–"}</span> },
      { id: "mic", header: "Mic", cell: ({ row }) => row.original.mic ?? "–" },
      { id: "strike", header: "Strike LUFS", cell: ({ row }) => <span className="num">{fmt(row.original.strikeLufs)}</span> },
      { id: "truePeak", header: "True peak dBTP", cell: ({ row }) => <span className={`num ${row.original.truePeakDbtp !== null && row.original.truePeakDbtp > 0 ? "font-semibold text-bad" : ""}`}>{fmt(row.original.truePeakDbtp)}{row.original.truePeakDbtp !== null && row.original.truePeakDbtp > 0 ? " ▲" : ""}</span> },
      { id: "duration", header: "Length s", cell: ({ row }) => <span className="num">{fmt(row.original.durationSec, 2)}</span> },
      { id: "confidence", header: "Confidence", cell: ({ row }) => <span className="num" title="How sure Kitwright is of the family and articulation">{row.original.confidence === null ? "–" : formatConfidence(row.original.confidence)}</span> },
      { id: "flags", header: "Review", cell: ({ row }) => (row.original.conflict === "strong" ? <Tip focusable content="The name and the sound disagree: check this sample"><span className="tag border-warn/40 bg-warn-soft text-warn">⚑ name ≠ sound</span></Tip> : soundUnsure(row.original.familySource, row.original.confidence) ? <Tip focusable content={`Only the sound says ${row.original.family ?? "this"}, and answers this unsure were right about ${formatConfidence(row.original.confidence)} of the time: listen, then confirm or relabel`}><span className="tag border-line-strong/40 text-muted" data-testid="unsure-tag">? sound unsure</span></Tip> : row.original.conflict === "mild" ? <span className="text-xs text-muted" title="The sound only partly fits the name">~ check</span> : null) },
    );
    return cols;
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [canWrite, selected, sp]);

  const table = useReactTable({ data: data?.rows ?? [], columns, getCoreRowModel: getCoreRowModel(), manualPagination: true, manualSorting: true, manualFiltering: true, rowCount: data?.total ?? 0, getRowId: (r) => r.id });
  const pages = data ? Math.max(1, Math.ceil(data.total / pageSize)) : 1;
  const allOnPage = (data?.rows ?? []).map((r) => r.id);

  return (
    <section className="space-y-3">
      <div className="card flex flex-wrap items-end gap-3 p-3 text-sm" role="search">
        <div>
          <label className="label" htmlFor="f-q">Search paths</label>
          <input id="f-q" className="field w-56" value={q} onChange={(e) => setQ(e.target.value)} placeholder="e.g. snare top rr2" aria-describedby="f-q-hint" title="Finds folder and file names with words starting with each word you type, up to 8 words (snare_top, SnareTop and Snare Top all count)" />
          {data?.search === "contains" && sp.get("q") && (
            <p id="f-q-hint" className="mt-1 max-w-56 text-xs text-muted">
              {data.total > 0 ? <>No path word starts with “{sp.get("q")}”: showing paths that contain it.</> : <>No path holds “{sp.get("q")}”.</>}
            </p>
          )}
        </div>
        <Select id="f-family" label="Family" value={sp.get("family")} options={FAMILIES} onChange={(v) => setParams({ family: v })} />
        <Select id="f-art" label="Articulation" value={sp.get("articulation")} options={allStrokes(strokes)} onChange={(v) => setParams({ articulation: v })} />
        <Select id="f-state" label="State" value={sp.get("state")} options={SAMPLE_STATES} onChange={(v) => setParams({ state: v })} />
        <Select id="f-inst" label="Instrument" value={sp.get("instrument")} options={instruments.map((i) => i.key)} labels={Object.fromEntries(instruments.map((i) => [i.key, i.name]))} onChange={(v) => setParams({ instrument: v })} />
        <Select id="f-flag" label="Needs review" value={sp.get("flag")} options={SAMPLE_FLAGS} labels={FLAG_WORDS} onChange={(v) => setParams({ flag: v })} />
      </div>

      {canWrite && <BulkBar studioId={studioId} libraryId={libraryId} selected={[...selected]} instruments={instruments} strokes={strokes} onDone={() => setSelected(new Set())} onSelectPage={() => setSelected(new Set(allOnPage))} onClear={() => setSelected(new Set())} />}

      <div className={openId ? "grid items-start gap-3 xl:grid-cols-[minmax(0,1fr)_380px]" : ""}>
        <div className="card table-scroll min-w-0 p-0">
          <table className="w-full text-sm" data-testid="samples-table">
            <caption className="sr-only">Samples of the library</caption>
            <thead className="text-left text-xs text-muted">
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id}>
                  {hg.headers.map((h) => {
                    const key = SORTABLE[h.column.id];
                    const active = key === sort;
                    return (
                      <th key={h.id} className="whitespace-nowrap px-2 py-2 font-medium" aria-sort={active ? (dir === "asc" ? "ascending" : "descending") : key ? "none" : undefined}>
                        {key ? (
                          <button type="button" className="inline-flex items-center gap-1 hover:text-ink" onClick={() => setParams({ sort: key, dir: active && dir === "asc" ? "desc" : "asc" })}>
                            {flexRender(h.column.columnDef.header, h.getContext())} <span aria-hidden className={active ? "" : "text-line-strong"}>{active ? (dir === "asc" ? "▲" : "▼") : "↕"}</span>
                          </button>
                        ) : (
                          flexRender(h.column.columnDef.header, h.getContext())
                        )}
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((r) => (
                <tr key={r.id} className={`border-t border-line ${openId === r.id ? "bg-brand-soft" : ""}`} data-testid="sample-row">
                  {r.getVisibleCells().map((c) => <td key={c.id} className="whitespace-nowrap px-2 py-1.5">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
                </tr>
              ))}
              {data && data.rows.length === 0 && (
                <tr><td colSpan={columns.length} className="px-3 py-6 text-center" data-testid="samples-empty">
                  {filtered ? (
                    <span className="text-muted">No samples match these filters. <button type="button" className="text-brand underline underline-offset-2" onClick={clearFilters}>Clear filters</button></span>
                  ) : (
                    <span className="text-muted">No samples yet{canWrite ? <> — drop a folder of WAV one-shots on <a href="#add-samples">Add samples</a>.</> : "."}</span>
                  )}
                </td></tr>
              )}
            </tbody>
          </table>
          <div className="flex flex-wrap items-center justify-between gap-2 border-t border-line px-3 py-2 text-xs">
            <span><span className="num">{data?.total ?? 0}</span> samples{query.isFetching ? " · updating…" : ""}</span>
            <span className="flex items-center gap-2">
              <button type="button" className="btn-quiet px-2 py-1" disabled={page <= 1} onClick={() => setParams({ page: String(page - 1) }, false)}>← Previous</button>
              <span>page <span className="num">{page}</span> of <span className="num">{pages}</span></span>
              <button type="button" className="btn-quiet px-2 py-1" disabled={page >= pages} onClick={() => setParams({ page: String(page + 1) }, false)}>Next →</button>
              <UiSelect aria-label="Rows per page" className="field w-auto py-1" value={pageSize} onChange={(e) => setParams({ pageSize: e.target.value })}>
                {[25, 50, 100, 200].map((n) => <option key={n} value={n}>{n} per page</option>)}
              </UiSelect>
            </span>
          </div>
        </div>
        {openId && <SampleDetail key={openId} studioId={studioId} libraryId={libraryId} sampleId={openId} onClose={() => setParams({ sample: null }, false)} />}
      </div>
      <p className="text-xs text-muted">Label marks: no mark = from the file or folder name, ~ = suggested from the sound, ✓ = confirmed by a member.</p>
    </section>
  );
}

function Select({ id, label, value, options, labels, onChange }: { id: string; label: string; value: string | null; options: readonly string[]; labels?: Record<string, string>; onChange: (v: string | null) => void }) {
  return (
    <div>
      <label className="label" htmlFor={id}>{label}</label>
      <UiSelect id={id} className="field w-40" value={value ?? ""} onChange={(e) => onChange(e.target.value || null)}>
        <option value="">any</option>
        {options.map((o) => <option key={o} value={o}>{labels?.[o] ?? o}</option>)}
      </UiSelect>
    </div>
  );
}

function BulkBar({ studioId, libraryId, selected, instruments, strokes, onDone, onSelectPage, onClear }: { studioId: string; libraryId: string; selected: string[]; instruments: Inst[]; strokes: StrokeList; onDone: () => void; onSelectPage: () => void; onClear: () => void }) {
  const [family, setFamily] = useState("");
  const [art, setArt] = useState("");
  const [mic, setMic] = useState("");
  const [inst, setInst] = useState("");
  // the line under the bar tells what the last of the two writes did (or why it failed): each resets the other
  const relabel = useRelabelSamples(studioId, libraryId);
  const confirm = useConfirmSamples(studioId, libraryId);
  const doRelabel = () => {
    confirm.reset();
    relabel.mutate(
      { sampleIds: selected, ...(family && { family }), ...(art && { articulation: art }), ...(mic && { mic: mic === "none" ? null : mic }), ...(inst && { instrumentKey: inst }) } as RelabelBody,
      { onSuccess: onDone },
    );
  };
  const doConfirm = () => {
    relabel.reset();
    confirm.mutate(selected, { onSuccess: onDone });
  };
  const none = !family && !art && !mic && !inst;
  return (
    <div className="card space-y-2 p-3 text-sm" data-testid="bulk-bar">
      <div className="flex flex-wrap items-end gap-3">
        <span className="pb-2"><span className="num">{selected.length}</span> selected · <button type="button" className="text-brand hover:underline" onClick={onSelectPage}>select this page</button>{selected.length > 0 && <> · <button type="button" className="text-brand hover:underline" onClick={onClear}>clear</button></>}</span>
        <Select id="b-family" label="Set family" value={family || null} options={FAMILIES} onChange={(v) => setFamily(v ?? "")} />
        <Select id="b-art" label="Set articulation" value={art || null} options={allStrokes(strokes)} onChange={(v) => setArt(v ?? "")} />
        <Select id="b-mic" label="Set mic" value={mic || null} options={["none", ...MIC_POSITIONS]} onChange={(v) => setMic(v ?? "")} />
        <Select id="b-inst" label="Move to instrument" value={inst || null} options={instruments.map((i) => i.key)} labels={Object.fromEntries(instruments.map((i) => [i.key, i.name]))} onChange={(v) => setInst(v ?? "")} />
        <button type="button" className="btn-primary" disabled={!selected.length || none || relabel.isPending} onClick={doRelabel}>Relabel {selected.length || ""}</button>
        <button type="button" className="btn-quiet" disabled={!selected.length || confirm.isPending} onClick={doConfirm} title="Keep the current labels and mark them as confirmed by you">Confirm suggestions</button>
      </div>
      {relabel.isSuccess && <Message kind="ok">{`Relabelled ${relabel.data.updated} samples; the library is being catalogued again.`}</Message>}
      {confirm.isSuccess && <Message kind="ok">{`Confirmed ${confirm.data.confirmed} samples${confirm.data.skipped ? ` (${confirm.data.skipped} not catalogued yet, skipped)` : ""}.`}</Message>}
      <FormError error={relabel.error ?? confirm.error} fallback={relabel.isError ? "Could not relabel." : "Could not confirm."} />
    </div>
  );
}
