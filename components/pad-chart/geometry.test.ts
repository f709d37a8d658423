// The one rule for drawing a layout (geometry.ts): a grid by its own rows and columns, a trigger-zone list in
// ceil(√n) columns between 2 and 6; arrow keys move in reading order and by the drawn columns.
// Kitwright's own rule (no published source); the General MIDI percussion map has 47 notes (35-81, GM 1).
import { describe, expect, it } from "vitest";
import { chartGeometry, moveIndex, surfaceOfFindings, zoneColumns } from "./geometry";
import { getTemplate } from "@/lib/audit/templates";

describe("pad chart geometry", () => {
  it("draws a grid layout with its own rows and columns, an empty cell where no pad is", () => {
    const g = chartGeometry({ kind: "grid", rows: 2, cols: 3 }, [{ id: "a", row: 1, col: 1 }, { id: "b", row: 2, col: 3 }]);
    expect([g.kind, g.rows, g.cols, g.cells.length]).toEqual(["grid", 2, 3, 6]);
    expect(g.cells.map((c) => c.pad?.id ?? null)).toEqual(["a", null, null, null, null, "b"]);
    const t = getTemplate("grid-24")!;
    expect(chartGeometry(t.surface, t.pads).cols).toBe(6);
  });
  it("draws a trigger-zone layout in ceil(√n) columns, at least 2, at most 6", () => {
    expect([1, 4, 5, 16, 17, 47, 128].map(zoneColumns)).toEqual([2, 2, 3, 4, 5, 6, 6]);
    const gm = getTemplate("gm-percussion")!;
    const g = chartGeometry(gm.surface, gm.pads);
    expect([g.kind, g.cols, g.rows]).toEqual(["zones", 6, 8]);
    expect(g.cells[6]).toMatchObject({ row: 2, col: 1 });
  });
  it("knows a grid from an audit's pads when the layout's surface is not given", () => {
    expect(surfaceOfFindings([{ row: 1, col: 2 }, { row: 2, col: 1 }])).toEqual({ kind: "grid", rows: 2, cols: 2 });
    expect(surfaceOfFindings([{ row: null, col: null }])).toEqual({ kind: "zones" });
  });
  it("moves focus by arrow keys, skipping cells that hold no pad", () => {
    const has = (i: number) => i !== 1;
    expect(moveIndex(0, "ArrowRight", 6, 3, has)).toBe(2);
    expect(moveIndex(0, "ArrowDown", 6, 3, has)).toBe(3);
    expect(moveIndex(4, "ArrowUp", 6, 3, has)).toBe(4); // cell 1 is empty, nothing above it
    expect(moveIndex(5, "ArrowRight", 6, 3, has)).toBe(5);
    expect(moveIndex(4, "Home", 6, 3, has)).toBe(0);
    expect(moveIndex(0, "End", 6, 3, has)).toBe(5);
  });
});
