"use client";
// Every pad (then the pedal zones and the chick note) in a drummer's words: what it plays, its velocity bar with
// its layers and round robins, sortable (TanStack Table v8). Pads aimed at an empty slot are already told once, grouped, above
// the table: they are folded away until asked for. Below 768 px each row is a stacked block.
import { useMemo, useState } from "react";
import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import type { AuditResult, PlayFinding } from "@/lib/audit/types";
import { OutcomeIcon } from "./outcome-icon";
import { VelocityBar, VelocityLegend } from "./velocity-bar";
import { gapsInWords, onEmptySlot, playDetail, playsInWords } from "./words";
import { noteName, useMiddleC } from "@/components/midi/notes";

interface Row { kind: string; id: string; label: string; note: number | null; channel: number | null; f: PlayFinding }

const ORDER = { silent: 0, "stand-in": 1, direct: 2 } as const;
const col = createColumnHelper<Row>();

function Cell({ title, children }: { title: string; children: React.ReactNode }) {
  return <><span className="mb-0.5 block text-xs font-medium text-muted md:hidden">{title}</span>{children}</>;
}

export function FindingsTable({ result }: { result: AuditResult }) {
  const [middleC] = useMiddleC();
  const [sorting, setSorting] = useState<SortingState>([]);
  const [showEmpty, setShowEmpty] = useState(false);
  const all = useMemo<Row[]>(() => {
    const out: Row[] = result.pads.map((p) => ({ kind: "pad", id: p.padId, label: p.label, note: p.note, channel: p.channel, f: p }));
    for (const z of result.pedal?.zones ?? []) out.push({ kind: "pedal zone", id: `zone ${z.zoneIndex + 1}`, label: `Pedal ${z.low}–${z.high}`, note: null, channel: result.pedal!.channel, f: z });
    const c = result.pedal?.chick;
    if (c) out.push({ kind: "pedal chick", id: c.padId, label: c.label, note: c.note, channel: c.channel, f: c });
    return out;
  }, [result]);
  const folded = all.filter((r) => onEmptySlot(r.f)).length;
  const rows = useMemo(() => (showEmpty ? all : all.filter((r) => !onEmptySlot(r.f))), [all, showEmpty]);
  const columns = useMemo(() => [
    col.accessor("label", {
      header: "Pad",
      cell: (i) => {
        const r = i.row.original;
        return (
          <span className="flex items-start gap-1.5">
            <OutcomeIcon outcome={r.f.outcome} />
            <span><span className="font-medium">{i.getValue()}</span>
              <span className="num block text-xs text-muted">{r.note === null ? r.kind : <>note {r.note} {noteName(r.note, middleC)} · channel {r.channel}</>}</span></span>
          </span>
        );
      },
    }),
    col.accessor((r) => ORDER[r.f.outcome], {
      id: "plays", header: "What plays",
      cell: (i) => {
        const f = i.row.original.f;
        return (
          <Cell title="What plays">
            <span className={`block cursor-help underline decoration-dotted decoration-muted/60 underline-offset-2 ${f.outcome === "silent" ? "text-bad" : ""}`} title={playDetail(f)} data-testid="finding-plays">
              {playsInWords(f)}{f.instrumentName && f.outcome !== "silent" ? <span className="text-muted"> · {f.instrumentName}</span> : null}
            </span>
            {f.notes.map((n, k) => <span key={k} className="block text-xs text-muted">{n}</span>)}
          </Cell>
        );
      },
    }),
    col.accessor((r) => r.f.layers.length * 1000 + r.f.minRoundRobins, {
      id: "layers", header: "Velocity layers and round robins",
      cell: (i) => {
        const f = i.row.original.f;
        if (f.outcome === "silent") return <Cell title="Velocity layers"><span className="text-muted">—</span></Cell>;
        return (
          <Cell title="Velocity layers and round robins">
            <div className="w-full space-y-0.5 md:w-72">
              <VelocityBar layers={f.layers} gaps={f.velocityGaps} />
              <span className="block text-xs">{f.layers.length} layer{f.layers.length === 1 ? "" : "s"}, {f.minRoundRobins === 1 ? "1 take in the thinnest" : `at least ${f.minRoundRobins} takes each`}{f.velocityGaps.length ? <span className="text-bad">; nothing at {gapsInWords(f)}</span> : null}</span>
            </div>
          </Cell>
        );
      },
    }),
  ], [middleC]);
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <div className="space-y-3">
      <VelocityLegend />
      {folded > 0 && (
        <label className="inline-flex items-center gap-2 text-sm">
          <input type="checkbox" checked={showEmpty} onChange={(e) => setShowEmpty(e.target.checked)} data-testid="show-empty-slot-pads" />
          Also list the {folded} pad{folded === 1 ? "" : "s"} aimed at empty slots (grouped above)
        </label>
      )}
      <div className="table-scroll">
      <table className="block w-full text-sm md:table" data-testid="findings-table">
        <thead className="hidden text-left text-muted md:table-header-group">
          {table.getHeaderGroups().map((hg) => (
            <tr key={hg.id}>
              {hg.headers.map((h) => (
                <th key={h.id} className="px-2 py-2 font-medium" aria-sort={h.column.getIsSorted() === "asc" ? "ascending" : h.column.getIsSorted() === "desc" ? "descending" : "none"}>
                  <button type="button" className="inline-flex items-center gap-1 hover:underline" onClick={h.column.getToggleSortingHandler()}>
                    {flexRender(h.column.columnDef.header, h.getContext())}
                    <span aria-hidden className="text-xs">{h.column.getIsSorted() === "asc" ? "▲" : h.column.getIsSorted() === "desc" ? "▼" : "↕"}</span>
                  </button>
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody className="block md:table-row-group">
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id} className="block border-t border-line py-2 align-top md:table-row md:py-0" data-outcome={r.original.f.outcome} data-finding={r.original.id}>
              {r.getVisibleCells().map((c) => <td key={c.id} className="block px-1 py-1 md:table-cell md:px-2 md:py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
      </div>
    </div>
  );
}
