"use client";
// The findings, one row per pad (then pedal zones and the chick note), sortable (TanStack Table v8).
import { useMemo, useState } from "react";
import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import type { AuditResult, PlayFinding } from "@/lib/audit/types";
import { OutcomeBadge } from "./outcome-icon";
import { VelocityBar } from "./velocity-bar";
import { noteName, useMiddleC } from "@/components/midi/notes";

interface Row { kind: string; id: string; label: string; note: number | null; channel: number | null; target: string; f: PlayFinding }

const ORDER = { silent: 0, "stand-in": 1, direct: 2 } as const;
const col = createColumnHelper<Row>();

export function FindingsTable({ result }: { result: AuditResult }) {
  const [middleC] = useMiddleC();
  const [sorting, setSorting] = useState<SortingState>([]);
  const rows = useMemo<Row[]>(() => {
    const out: Row[] = result.pads.map((p) => ({ kind: "pad", id: p.padId, label: p.label, note: p.note, channel: p.channel, target: p.slotName ? `${p.slotName}: ${p.requested ?? "—"}` : p.requested ?? "no target", f: p }));
    for (const z of result.pedal?.zones ?? []) out.push({ kind: "pedal zone", id: `zone ${z.zoneIndex + 1}`, label: `pedal ${z.low}-${z.high}`, note: null, channel: result.pedal!.channel, target: `${z.slotName ?? ""}: ${z.requested}`, f: z });
    const c = result.pedal?.chick;
    if (c) out.push({ kind: "pedal chick", id: c.padId, label: c.label, note: c.note, channel: c.channel, target: `${c.slotName ?? ""}: ${c.requested}`, f: c });
    return out;
  }, [result]);
  const columns = useMemo(() => [
    col.accessor("label", { header: "Pad", cell: (i) => <span><span className="font-medium">{i.getValue()}</span> <span className="text-xs text-muted">{i.row.original.kind !== "pad" ? i.row.original.kind : ""}</span></span> }),
    col.accessor("note", { header: "Note", cell: (i) => (i.getValue() === null ? "—" : <span className="num whitespace-nowrap">{i.getValue()} {noteName(i.getValue()!, middleC)} · ch {i.row.original.channel}</span>) }),
    col.accessor("target", { header: "Asks for" }),
    col.accessor((r) => ORDER[r.f.outcome], { id: "outcome", header: "Outcome", cell: (i) => <OutcomeBadge outcome={i.row.original.f.outcome} /> }),
    col.accessor((r) => r.f.plays ?? "", {
      id: "plays", header: "Plays",
      cell: (i) => {
        const f = i.row.original.f;
        if (f.outcome === "silent") return <span className="text-bad">{f.reason}</span>;
        return <span>{f.instrumentName}: {f.plays}{f.standIn && <span className="block text-xs text-muted">path {f.standIn.path.join(" → ")} (cost {f.standIn.cost}{f.standIn.source === "override" ? ", kit override" : ""})</span>}{f.notes.map((n, k) => <span key={k} className="block text-xs text-muted">{n}</span>)}</span>;
      },
    }),
    col.accessor((r) => r.f.layers.length, { id: "layers", header: "Layers (velocity)", cell: (i) => <div className="w-44 space-y-1"><VelocityBar layers={i.row.original.f.layers} gaps={i.row.original.f.velocityGaps} /><span className="num text-xs">{i.getValue()} layer{i.getValue() === 1 ? "" : "s"}{i.row.original.f.velocityGaps.length ? `, gaps ${i.row.original.f.velocityGaps.map((g) => `${g.low}-${g.high}`).join(" ")}` : ""}</span></div> }),
    col.accessor((r) => r.f.minRoundRobins, { id: "rr", header: "Round robins (min)", cell: (i) => <span className="num">{i.getValue()}</span> }),
  ], [middleC]);
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <div className="table-scroll">
      <table className="w-full text-sm" data-testid="findings-table">
        <thead className="text-left text-muted">
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
        <tbody>
          {table.getRowModel().rows.map((r) => (
            <tr key={r.id} className="border-t border-line align-top" data-outcome={r.original.f.outcome}>
              {r.getVisibleCells().map((c) => <td key={c.id} className="px-2 py-2">{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
