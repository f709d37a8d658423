import "server-only";
// Layouts: a controller's pads (grid or trigger zones) and hi-hat pedal, kept as kitwright.layout/v2
// (the layout object, its id = the row id).
import { adoptStrokes, checkStrokesKnown } from "../strokes";
import { layoutStrokeUses } from "@/lib/audit/schema";
import type { Knex } from "knex";
import { db } from "../db";
import { AppError, notFound } from "../errors";
import { newId } from "../ids";
import { logActivity } from "../activity";
import { jsonColumn } from "../json-column";
import { getTemplate } from "@/lib/audit/templates";
import type { Layout, Pad } from "@/lib/audit/types";
import type { LayoutRecord, LayoutSummary } from "@/lib/api-types/layouts";

const iso = (d: unknown) => new Date(d as string).toISOString();

function toRecord(r: Record<string, unknown>): LayoutRecord {
  const body = jsonColumn(r.body) as Layout;
  return { id: r.id as string, name: r.name as string, layout: { ...body, id: r.id as string, name: r.name as string }, createdAt: iso(r.created_at), updatedAt: iso(r.updated_at) };
}

export async function listLayouts({ studioId }: { studioId: string }): Promise<LayoutSummary[]> {
  const rows = await db()("layouts").where({ studio_id: studioId }).orderBy("name").select("id", "name", "body", "updated_at");
  return rows.map((r) => {
    const l = jsonColumn(r.body) as Layout;
    return {
      id: r.id, name: r.name, kind: l.surface.kind,
      rows: l.surface.kind === "grid" ? l.surface.rows : null, cols: l.surface.kind === "grid" ? l.surface.cols : null,
      pads: l.pads.length, pedal: !!l.hiHatPedal, updatedAt: iso(r.updated_at),
    };
  });
}

export async function getLayout({ studioId, layoutId }: { studioId: string; layoutId: string }, k: Knex = db()): Promise<LayoutRecord> {
  const r = await k("layouts").where({ studio_id: studioId, id: layoutId }).first();
  if (!r) throw notFound("The layout");
  return toRecord(r);
}

/** A blank grid: pads numbered left to right, top to bottom, on channel 10, notes from 36 up, aimed at nothing yet. */
export function blankGrid(rows: number, cols: number): Pad[] {
  const pads: Pad[] = [];
  for (let r = 1; r <= rows; r++) for (let c = 1; c <= cols; c++) {
    const n = pads.length;
    pads.push({ id: `r${r}c${c}`, label: `Pad ${n + 1}`, row: r, col: c, note: Math.min(127, 36 + n), channel: 10, target: null });
  }
  return pads;
}
export function blankZones(count: number): Pad[] {
  return Array.from({ length: count }, (_, i) => ({ id: `z${i + 1}`, label: `Zone ${i + 1}`, zone: `zone ${i + 1}`, note: Math.min(127, 36 + i), channel: 10, target: null }));
}

async function insertLayout(trx: Knex, studioId: string, actorId: string, body: Layout, action: string, details: Record<string, unknown>): Promise<LayoutRecord> {
  await checkStrokesKnown(studioId, layoutStrokeUses(body), trx);
  await trx("layouts").insert({ id: body.id, studio_id: studioId, name: body.name, body: JSON.stringify(body), created_by: actorId });
  await logActivity(trx, { studioId, actorId, action, subjectType: "layout", subjectId: body.id, details: { name: body.name, ...details } });
  return getLayout({ studioId, layoutId: body.id }, trx);
}

export async function createLayout(
  { studioId, actorId, name, template, grid, zones }: { studioId: string; actorId: string; name: string; template?: string; grid?: { rows: number; cols: number }; zones?: number },
): Promise<LayoutRecord> {
  const id = newId();
  let body: Layout;
  if (template) {
    const t = getTemplate(template);
    if (!t) throw new AppError("invalid-input", `Unknown template "${template}".`);
    body = { ...t, id, name };
  } else if (grid) {
    body = { id, name, surface: { kind: "grid", rows: grid.rows, cols: grid.cols }, pads: blankGrid(grid.rows, grid.cols), hiHatPedal: null };
  } else {
    body = { id, name, surface: { kind: "zones" }, pads: blankZones(zones ?? 1), hiHatPedal: null };
  }
  return db().transaction((trx) => insertLayout(trx, studioId, actorId, body, "layout.created", template ? { template } : grid ? { grid: `${grid.rows}x${grid.cols}` } : { zones }));
}

export async function updateLayout(
  { studioId, actorId, layoutId, name, layout }: { studioId: string; actorId: string; layoutId: string; name?: string; layout?: Omit<Layout, "id"> },
): Promise<LayoutRecord> {
  return db().transaction(async (trx) => {
    const before = await getLayout({ studioId, layoutId }, trx);
    const newName = name ?? before.name;
    const body: Layout = { ...(layout ?? before.layout), id: layoutId, name: newName } as Layout;
    if (layout) await checkStrokesKnown(studioId, layoutStrokeUses(body), trx);
    await trx("layouts").where({ studio_id: studioId, id: layoutId }).update({ name: newName, body: JSON.stringify(body), updated_at: trx.fn.now(3) });
    const renamed = newName !== before.name;
    await logActivity(trx, {
      studioId, actorId, action: renamed && !layout ? "layout.renamed" : "layout.updated", subjectType: "layout", subjectId: layoutId,
      details: renamed ? { name: newName, from: before.name, to: newName } : { name: newName, pads: body.pads.length },
    });
    return getLayout({ studioId, layoutId }, trx);
  });
}

export async function copyLayout({ studioId, actorId, layoutId, name }: { studioId: string; actorId: string; layoutId: string; name?: string }): Promise<LayoutRecord> {
  const src = await getLayout({ studioId, layoutId });
  const id = newId();
  const body: Layout = { ...structuredClone(src.layout), id, name: name ?? `${src.name} (copy)` };
  return db().transaction((trx) => insertLayout(trx, studioId, actorId, body, "layout.created", { copiedFrom: src.name }));
}

export async function deleteLayout({ studioId, actorId, layoutId }: { studioId: string; actorId: string; layoutId: string }): Promise<void> {
  await db().transaction(async (trx) => {
    const before = await getLayout({ studioId, layoutId }, trx);
    await trx("layouts").where({ studio_id: studioId, id: layoutId }).delete();
    await logActivity(trx, { studioId, actorId, action: "layout.deleted", subjectType: "layout", subjectId: layoutId, details: { name: before.name } });
  });
}

export async function importLayout({ studioId, actorId, layout, name }: { studioId: string; actorId: string; layout: Layout; name?: string }): Promise<LayoutRecord> {
  const id = newId();
  const { strokes, ...rest } = layout;
  const body: Layout = { ...rest, id, name: name ?? layout.name };
  return db().transaction(async (trx) => {
    // the file's own strokes the studio lacks join the studio (kitwright.layout/v2)
    const added = await adoptStrokes(trx, studioId, actorId, strokes);
    return insertLayout(trx, studioId, actorId, body, "layout.imported", added.length ? { strokesAdded: added } : {});
  });
}
