// Where each pad of a layout sits in the pad chart, the one rule for every page that draws a layout (the layout
// editor, the audit): a grid layout is drawn with its own rows and columns, each pad in its cell, an empty cell
// where no pad is; a trigger-zone layout is drawn in layout order, in ZONE_COLUMNS(n) columns (the square root
// of the pad count rounded up, at least 2 and at most 6; 2 on a narrow screen, below 640 px). Pure.
import type { LayoutSurface } from "@/lib/audit/types";

export interface Placed { row?: number | null; col?: number | null }

export interface ChartCell<P> {
  key: string;
  row: number;
  col: number;
  pad: P | null;
}

export interface ChartGeometry<P> {
  kind: "grid" | "zones";
  rows: number;
  cols: number;
  /** Reading order: row by row, left to right. */
  cells: ChartCell<P>[];
}

/** Columns of a trigger-zone layout of `n` pads (wide screens). */
export function zoneColumns(n: number): number {
  return Math.min(6, Math.max(2, Math.ceil(Math.sqrt(Math.max(1, n)))));
}

/** Columns below 640 px for a trigger-zone layout. */
export const NARROW_ZONE_COLUMNS = 2;

export function chartGeometry<P extends Placed>(surface: LayoutSurface | null, pads: readonly P[]): ChartGeometry<P> {
  if (surface?.kind === "grid") {
    const { rows, cols } = surface;
    const at = new Map<string, P>();
    for (const p of pads) if (p.row && p.col && !at.has(`${p.row},${p.col}`)) at.set(`${p.row},${p.col}`, p);
    const cells: ChartCell<P>[] = [];
    for (let r = 1; r <= rows; r++) for (let c = 1; c <= cols; c++) cells.push({ key: `${r}-${c}`, row: r, col: c, pad: at.get(`${r},${c}`) ?? null });
    return { kind: "grid", rows, cols, cells };
  }
  const cols = zoneColumns(pads.length);
  return { kind: "zones", rows: Math.ceil(pads.length / cols), cols, cells: pads.map((p, i) => ({ key: `z${i}`, row: Math.floor(i / cols) + 1, col: (i % cols) + 1, pad: p })) };
}

/** The surface of a layout as an audit result knows it (pads carry their grid cell when the layout is a grid). */
export function surfaceOfFindings(pads: readonly Placed[], surface?: LayoutSurface | null): LayoutSurface {
  if (surface) return surface;
  const rows = Math.max(0, ...pads.map((p) => p.row ?? 0));
  const cols = Math.max(0, ...pads.map((p) => p.col ?? 0));
  return rows > 0 && cols > 0 && pads.every((p) => p.row && p.col) ? { kind: "grid", rows, cols } : { kind: "zones" };
}

/** Index of the cell an arrow key moves to from `from` (reading order), or `from` when there is none. */
export function moveIndex(from: number, key: string, count: number, cols: number, focusable: (i: number) => boolean): number {
  const step = key === "ArrowRight" ? 1 : key === "ArrowLeft" ? -1 : key === "ArrowDown" ? cols : key === "ArrowUp" ? -cols : key === "Home" ? -Infinity : key === "End" ? Infinity : 0;
  if (step === 0) return from;
  if (step === -Infinity) { for (let i = 0; i < count; i++) if (focusable(i)) return i; return from; }
  if (step === Infinity) { for (let i = count - 1; i >= 0; i--) if (focusable(i)) return i; return from; }
  for (let i = from + step; i >= 0 && i < count; i += step) if (focusable(i)) return i;
  return from;
}
