"use client";
// The pad chart's frame, shared by the layout editor and the audit page so a layout is drawn the same way
// everywhere (geometry.ts states the rule). It lays the cells out and makes the chart one stop for the keyboard:
// Tab enters it on one pad, the arrow keys (and Home, End) move between pads, Enter or Space presses the pad
// (a native button). Each page draws its own pad inside the cell (renderPad).
import { useCallback, useRef, useState, type CSSProperties, type KeyboardEvent, type ReactNode } from "react";
import type { LayoutSurface } from "@/lib/audit/types";
import { chartGeometry, moveIndex, NARROW_ZONE_COLUMNS, type ChartCell, type Placed } from "./geometry";

export interface CellProps {
  tabIndex: number;
  "data-cell": number;
}

export function PadGrid<P extends Placed>({ surface, pads, renderPad, renderEmpty, label, testId, className = "" }: {
  surface: LayoutSurface | null;
  pads: readonly P[];
  renderPad: (pad: P, cell: CellProps) => ReactNode;
  /** An empty grid cell; focusable (and given cell props) when it is a control, as the editor's "+ pad". */
  renderEmpty?: (cell: ChartCell<P>, props: CellProps) => ReactNode;
  label: string;
  testId: string;
  className?: string;
}) {
  const g = chartGeometry(surface, pads);
  const ref = useRef<HTMLDivElement>(null);
  const [active, setActive] = useState(0);
  const focusable = useCallback((i: number) => !!g.cells[i]?.pad || !!renderEmpty, [g.cells, renderEmpty]);
  const first = g.cells.findIndex((_, i) => focusable(i));
  const current = focusable(active) ? active : first;

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    const el = (e.target as HTMLElement).closest<HTMLElement>("[data-cell]");
    if (!el || !ref.current) return;
    const from = Number(el.dataset.cell);
    // the columns drawn right now (a trigger-zone chart has fewer on a narrow screen)
    const drawn = getComputedStyle(ref.current).gridTemplateColumns.split(" ").filter(Boolean).length || g.cols;
    const to = moveIndex(from, e.key, g.cells.length, drawn, focusable);
    if (to === from && !["ArrowLeft", "ArrowRight", "ArrowUp", "ArrowDown", "Home", "End"].includes(e.key)) return;
    e.preventDefault();
    setActive(to);
    ref.current.querySelector<HTMLElement>(`[data-cell="${to}"]`)?.focus();
  };

  const style: CSSProperties = g.kind === "grid"
    ? { gridTemplateColumns: `repeat(${g.cols}, minmax(2.75rem, 1fr))` }
    : ({ "--pad-cols": g.cols, "--pad-cols-narrow": NARROW_ZONE_COLUMNS } as CSSProperties);
  return (
    <div className={`overflow-x-auto ${className}`}>
      <div ref={ref} role="group" aria-label={`${label}: ${g.kind === "grid" ? `${g.rows} rows of ${g.cols} pads` : `${pads.length} trigger zones`}. Arrow keys move between pads.`}
        data-testid={testId} data-cols={g.cols} data-kind={g.kind}
        className={`grid gap-1.5 sm:gap-2 ${g.kind === "zones" ? "grid-cols-[repeat(var(--pad-cols-narrow),minmax(0,1fr))] sm:grid-cols-[repeat(var(--pad-cols),minmax(0,1fr))]" : ""}`}
        style={style} onKeyDown={onKeyDown} onFocus={(e) => { const c = (e.target as HTMLElement).closest<HTMLElement>("[data-cell]"); if (c) setActive(Number(c.dataset.cell)); }}>
        {g.cells.map((c, i) => {
          const props: CellProps = { tabIndex: i === current ? 0 : -1, "data-cell": i };
          if (c.pad) return <div key={c.key} className="min-w-0">{renderPad(c.pad, props)}</div>;
          return <div key={c.key} className="min-w-0">{renderEmpty ? renderEmpty(c, props) : <div aria-hidden className="h-full min-h-16 rounded-md border border-dashed border-line" />}</div>;
        })}
      </div>
    </div>
  );
}
