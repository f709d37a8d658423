import "server-only";
// A studio's own strokes (lib/catalogue/strokes.ts) in the database: list, add, change, remove. Changing a stroke's
// name changes its id; renaming or removing a stroke that samples, kits, layouts or other strokes use first answers
// 409 with what uses it, and goes ahead only when the caller says where the uses move (`moveTo`; for a rename, the
// new id). Nothing is dropped silently: samples sorted into a removed stroke get the stroke they were moved to as a
// member's label (so cataloguing again keeps them there), kits' stroke maps and layouts' pads are rewritten, and
// other strokes' edges follow. The libraries whose samples could change are catalogued again.
import type { Knex } from "knex";
import { db } from "./db";
import { AppError, notFound } from "./errors";
import { logActivity } from "./activity";
import { jsonColumn } from "./json-column";
import { enqueueCataloguing } from "./catalogue/queue";
import { findStroke, isKnownStroke, MAX_STUDIO_STROKES, strokeIdFromName, strokeListProblems, tidyStroke, type StudioStroke } from "@/lib/catalogue/strokes";
import { FAMILY_ARTICULATIONS, isArticulation, type Family } from "@/lib/catalogue/taxonomy";
import type { Kit, Layout } from "@/lib/audit/types";
import type { StrokeInput, StrokeListAnswer, StrokeUses } from "@/lib/api-types/strokes";

function fromRow(r: Record<string, unknown>): StudioStroke {
  return {
    id: r.stroke_id as string,
    name: r.name as string,
    families: jsonColumn<Family[]>(r.families),
    words: jsonColumn<string[]>(r.words),
    neighbours: jsonColumn<StudioStroke["neighbours"]>(r.neighbours),
  };
}

/** The studio's own strokes, in the order they were added. */
export async function loadStudioStrokes(studioId: string, k: Knex = db()): Promise<StudioStroke[]> {
  const rows = await k("studio_strokes").where({ studio_id: studioId }).orderBy([{ column: "position" }, { column: "created_at" }, { column: "stroke_id" }]);
  return rows.map(fromRow);
}

/** The built-in strokes per family and the studio's own (GET .../strokes, the strokes page). */
export async function strokeListAnswer(studioId: string): Promise<StrokeListAnswer> {
  const builtIn = Object.fromEntries(Object.entries(FAMILY_ARTICULATIONS).map(([f, list]) => [f, [...list]])) as StrokeListAnswer["builtIn"];
  return { builtIn, strokes: await loadStudioStrokes(studioId) };
}

function toStroke(input: StrokeInput): StudioStroke {
  return tidyStroke({ id: strokeIdFromName(input.name), name: input.name, families: input.families, words: input.words, neighbours: input.neighbours });
}

function invalid(problems: { path: (string | number)[]; message: string }[]): AppError {
  return new AppError("invalid-input", problems.map((p) => p.message).join("; "), { issues: problems.map((p) => ({ path: `body.${p.path.join(".")}`, message: p.message })) });
}

/** Check the studio's list with `next` in place of `replacing` (or added). */
function checkList(list: StudioStroke[], next: StudioStroke, replacing: string | null): StudioStroke[] {
  if (isArticulation(next.id)) throw invalid([{ path: ["name"], message: `“${next.name}” is a built-in stroke; give your own stroke another name.` }]);
  if (list.some((s) => s.id === next.id && s.id !== replacing)) throw new AppError("conflict", `The studio already has a stroke called “${next.name}”.`);
  const merged = replacing ? list.map((s) => (s.id === replacing ? next : s)) : [...list, next];
  // edges of other strokes that pointed at the old id follow the rename in the check (and in the update)
  const renamed = replacing && replacing !== next.id ? merged.map((s) => ({ ...s, neighbours: s.neighbours.map((e) => (e.to === replacing ? { ...e, to: next.id } : e)) })) : merged;
  const i = renamed.findIndex((s) => s.id === next.id);
  const problems = strokeListProblems(renamed).filter((p) => p.path[0] === i).map((p) => ({ path: p.path.slice(1), message: p.message }));
  if (problems.length) throw invalid(problems);
  return renamed;
}

export async function createStroke({ studioId, actorId, input }: { studioId: string; actorId: string; input: StrokeInput }): Promise<StudioStroke> {
  const stroke = toStroke(input);
  const libs = await db().transaction(async (trx) => {
    await trx("studios").where({ id: studioId }).forUpdate().first("id");
    const list = await loadStudioStrokes(studioId, trx);
    if (list.length >= MAX_STUDIO_STROKES) throw invalid([{ path: ["name"], message: `A studio keeps at most ${MAX_STUDIO_STROKES} strokes of its own.` }]);
    checkList(list, stroke, null);
    const [{ n }] = (await trx("studio_strokes").where({ studio_id: studioId }).max({ n: "position" })) as [{ n: number | null }];
    await trx("studio_strokes").insert({
      studio_id: studioId, stroke_id: stroke.id, name: stroke.name, families: JSON.stringify(stroke.families), words: JSON.stringify(stroke.words),
      neighbours: JSON.stringify(stroke.neighbours), position: (n ?? 0) + 1, created_by: actorId,
    });
    await logActivity(trx, { studioId, actorId, action: "stroke.created", subjectType: "stroke", subjectId: stroke.id, details: { name: stroke.name, families: stroke.families } });
    return libraryIds(trx, studioId);
  });
  await recatalogue(studioId, libs);
  return stroke;
}

async function libraryIds(k: Knex, studioId: string): Promise<string[]> {
  return (await k("libraries").where({ studio_id: studioId }).select("id")).map((r) => r.id as string);
}

/** Catalogue the libraries again (their names may now read as the studio's strokes). A queue outage is not fatal. */
async function recatalogue(studioId: string, libs: string[]): Promise<void> {
  for (const libraryId of libs) {
    try {
      await enqueueCataloguing({ studioId, libraryId });
    } catch (e) {
      console.error(`could not queue the cataloguing of ${libraryId}:`, (e as Error).message);
    }
  }
}

/** What uses a stroke in a studio: samples (per library), kits' stroke maps, layouts' pads and pedal zones, other strokes' edges. */
export async function strokeUses({ studioId, strokeId }: { studioId: string; strokeId: string }, k: Knex = db()): Promise<StrokeUses> {
  const sampleRows = (await k("samples as s")
    .join("libraries as l", "l.id", "s.library_id")
    .where("s.studio_id", studioId)
    .andWhere((q) => q.where("s.articulation", strokeId).orWhere("s.confirmed_articulation", strokeId))
    .groupBy("s.library_id", "l.name")
    .select("s.library_id as libraryId", "l.name as libraryName")
    .count({ n: "*" })) as Array<{ libraryId: string; libraryName: string; n: number | string }>;
  const kits = (await k("kits").where({ studio_id: studioId }).orderBy("name").select("id", "name", "body"))
    .map((r) => ({ id: r.id as string, name: r.name as string, slots: (jsonColumn(r.body) as Kit).slots.filter((s) => Object.entries(s.standIns ?? {}).some(([a, b]) => a === strokeId || b === strokeId)).map((s) => s.name) }))
    .filter((x) => x.slots.length > 0);
  const layouts = (await k("layouts").where({ studio_id: studioId }).orderBy("name").select("id", "name", "body"))
    .map((r) => {
      const l = jsonColumn(r.body) as Layout;
      const pads = l.pads.filter((p) => p.target?.articulation === strokeId).map((p) => p.label || p.id);
      const zones = (l.hiHatPedal?.zones ?? []).filter((z) => z.articulation === strokeId).length;
      return { id: r.id as string, name: r.name as string, pads, pedalZones: zones };
    })
    .filter((x) => x.pads.length > 0 || x.pedalZones > 0);
  const strokes = (await loadStudioStrokes(studioId, k)).filter((s) => s.neighbours.some((e) => e.to === strokeId)).map((s) => s.id);
  const samples = sampleRows.map((r) => ({ libraryId: r.libraryId, libraryName: r.libraryName, count: Number(r.n) }));
  const total = samples.reduce((a, b) => a + b.count, 0) + kits.length + layouts.length + strokes.length;
  return { strokeId, samples, kits, layouts, strokes, total };
}

/** Move every use of `from` to `to` (see the top comment). Returns the libraries whose samples moved. */
async function moveUses(trx: Knex.Transaction, studioId: string, from: string, to: string, how: "rename" | "remove"): Promise<string[]> {
  const libs = (await trx("samples").where({ studio_id: studioId }).andWhere((q) => q.where("articulation", from).orWhere("confirmed_articulation", from)).distinct("library_id")).map((r) => r.library_id as string);
  // a cataloguing holds its library's row while it reads and writes the samples: wait for any running one, so
  // it cannot write back what it read before the move
  if (libs.length) await trx("libraries").where({ studio_id: studioId }).whereIn("id", libs).forUpdate().select("id");
  await trx("samples").where({ studio_id: studioId, confirmed_articulation: from }).update({ confirmed_articulation: to, articulation: to, articulation_source: "person", updated_at: trx.fn.now(3) });
  if (how === "remove") {
    // a member decided where these go: keep it through the next cataloguing
    await trx("samples").where({ studio_id: studioId, articulation: from }).update({ confirmed_articulation: to, articulation: to, articulation_source: "person", updated_at: trx.fn.now(3) });
  } else {
    await trx("samples").where({ studio_id: studioId, articulation: from }).update({ articulation: to, updated_at: trx.fn.now(3) });
  }
  await trx("layer_groups").where({ studio_id: studioId, articulation: from }).update({ articulation: to });
  for (const r of await trx("kits").where({ studio_id: studioId }).select("id", "body")) {
    const kit = jsonColumn(r.body) as Kit;
    let changed = false;
    const slots = kit.slots.map((s) => {
      if (!s.standIns) return s;
      const next: Record<string, string> = {};
      for (const [a, b] of Object.entries(s.standIns)) {
        const a2 = a === from ? to : a;
        const b2 = b === from ? to : b;
        if (a2 !== a || b2 !== b) changed = true;
        if (b2 && a2 !== b2 && next[a2] === undefined) next[a2] = b2;
      }
      return { ...s, standIns: Object.keys(next).length ? next : undefined };
    });
    if (changed) await trx("kits").where({ id: r.id }).update({ body: JSON.stringify({ ...kit, slots }), updated_at: trx.fn.now(3) });
  }
  for (const r of await trx("layouts").where({ studio_id: studioId }).select("id", "body")) {
    const l = jsonColumn(r.body) as Layout;
    let changed = false;
    const pads = l.pads.map((p) => (p.target?.articulation === from ? ((changed = true), { ...p, target: { ...p.target, articulation: to } }) : p));
    const hh = l.hiHatPedal ? { ...l.hiHatPedal, zones: l.hiHatPedal.zones.map((z) => (z.articulation === from ? ((changed = true), { ...z, articulation: to }) : z)) } : null;
    if (changed) await trx("layouts").where({ id: r.id }).update({ body: JSON.stringify({ ...l, pads, hiHatPedal: hh }), updated_at: trx.fn.now(3) });
  }
  for (const r of await trx("studio_strokes").where({ studio_id: studioId }).select("stroke_id", "neighbours")) {
    const ns = jsonColumn<StudioStroke["neighbours"]>(r.neighbours);
    if (!ns.some((e) => e.to === from)) continue;
    const moved = ns.map((e) => (e.to === from ? { ...e, to } : e)).filter((e, i, all) => e.to !== r.stroke_id && all.findIndex((x) => x.to === e.to) === i);
    await trx("studio_strokes").where({ studio_id: studioId, stroke_id: r.stroke_id }).update({ neighbours: JSON.stringify(moved), updated_at: trx.fn.now(3) });
  }
  return libs;
}

function usedError(uses: StrokeUses, what: string, moveTo: string | null): AppError {
  return new AppError("conflict", `${what} is used: ${usesInWords(uses)}. Say where these move to.`, { uses, ...(moveTo ? { moveTo } : {}) });
}

/** What uses a stroke, in one sentence. */
export function usesInWords(u: StrokeUses): string {
  const parts: string[] = [];
  const n = u.samples.reduce((a, b) => a + b.count, 0);
  if (n) parts.push(`${n} sample${n === 1 ? "" : "s"}`);
  if (u.kits.length) parts.push(`${u.kits.length} kit${u.kits.length === 1 ? "" : "s"}`);
  if (u.layouts.length) parts.push(`${u.layouts.length} layout${u.layouts.length === 1 ? "" : "s"}`);
  if (u.strokes.length) parts.push(`${u.strokes.length} other stroke${u.strokes.length === 1 ? "" : "s"}`);
  return parts.join(", ");
}

/**
 * Change a stroke. A new name is a new id: when anything uses the stroke, the change is refused (409, with the
 * uses and `moveTo`: the new id) unless `moveUses` is true; then every use moves to the new id.
 */
export async function updateStroke(
  { studioId, actorId, strokeId, input, moveUses: confirmMove }: { studioId: string; actorId: string; strokeId: string; input: StrokeInput; moveUses?: boolean },
): Promise<StudioStroke> {
  const next = toStroke(input);
  const libs = await db().transaction(async (trx) => {
    await trx("studios").where({ id: studioId }).forUpdate().first("id");
    const list = await loadStudioStrokes(studioId, trx);
    if (!findStroke(list, strokeId)) throw notFound("The stroke");
    checkList(list, next, strokeId);
    let moved: string[] = [];
    if (next.id !== strokeId) {
      const uses = await strokeUses({ studioId, strokeId }, trx);
      if (uses.total > 0 && !confirmMove) throw usedError(uses, `“${strokeId}”`, next.id);
      moved = await moveUses(trx, studioId, strokeId, next.id, "rename");
    }
    await trx("studio_strokes").where({ studio_id: studioId, stroke_id: strokeId }).update({
      stroke_id: next.id, name: next.name, families: JSON.stringify(next.families), words: JSON.stringify(next.words), neighbours: JSON.stringify(next.neighbours), updated_at: trx.fn.now(3),
    });
    await logActivity(trx, { studioId, actorId, action: "stroke.updated", subjectType: "stroke", subjectId: next.id, details: { name: next.name, ...(next.id !== strokeId ? { renamedFrom: strokeId } : {}) } });
    return next.id !== strokeId ? moved : libraryIds(trx, studioId);
  });
  await recatalogue(studioId, libs);
  return next;
}

/** Remove a stroke. When anything uses it: 409 with the uses, unless `moveTo` names where they go (a known stroke). */
export async function deleteStroke({ studioId, actorId, strokeId, moveTo }: { studioId: string; actorId: string; strokeId: string; moveTo?: string }): Promise<{ moved: number }> {
  const out = await db().transaction(async (trx) => {
    await trx("studios").where({ id: studioId }).forUpdate().first("id");
    const list = await loadStudioStrokes(studioId, trx);
    if (!findStroke(list, strokeId)) throw notFound("The stroke");
    const uses = await strokeUses({ studioId, strokeId }, trx);
    let libs: string[] = [];
    if (uses.total > 0) {
      if (!moveTo) throw usedError(uses, `“${strokeId}”`, null);
      const rest = list.filter((s) => s.id !== strokeId);
      if (moveTo === strokeId || !isKnownStroke(moveTo, rest)) throw invalid([{ path: ["moveTo"], message: `“${moveTo}” is not another stroke of this studio or a built-in one.` }]);
      libs = await moveUses(trx, studioId, strokeId, moveTo, "remove");
    }
    await trx("studio_strokes").where({ studio_id: studioId, stroke_id: strokeId }).delete();
    await logActivity(trx, { studioId, actorId, action: "stroke.deleted", subjectType: "stroke", subjectId: strokeId, details: { ...(moveTo && uses.total ? { movedTo: moveTo, uses: usesInWords(uses) } : {}) } });
    return { moved: uses.total, libs };
  });
  await recatalogue(studioId, out.libs);
  return { moved: out.moved };
}

/**
 * Check the strokes a kit or layout names against the studio's (422 naming each unknown one); used by the kit and
 * layout handlers so nothing aims at a stroke the studio does not know.
 */
export async function checkStrokesKnown(studioId: string, uses: { stroke: string; path: (string | number)[] }[], k: Knex = db()): Promise<void> {
  const custom = uses.filter((u) => !isArticulation(u.stroke));
  if (!custom.length) return;
  const list = await loadStudioStrokes(studioId, k);
  const bad = custom.filter((u) => !findStroke(list, u.stroke));
  if (bad.length) {
    throw new AppError("invalid-input", `No stroke ${[...new Set(bad.map((b) => `“${b.stroke}”`))].join(", ")} in this studio: add it under Strokes first.`, {
      issues: bad.map((b) => ({ path: `body.${b.path.join(".")}`, message: `no stroke "${b.stroke}"` })),
    });
  }
}

/**
 * A file's own strokes (layout or kit import) that the studio lacks are added to the studio; a file stroke whose id
 * the studio already uses keeps the studio's definition. Returns the ids added.
 */
export async function adoptStrokes(trx: Knex.Transaction, studioId: string, actorId: string, carried: readonly StudioStroke[] | undefined): Promise<string[]> {
  if (!carried?.length) return [];
  const list = await loadStudioStrokes(studioId, trx);
  const added: string[] = [];
  let pos = list.length;
  for (const s of carried) {
    if (findStroke(list, s.id) || isArticulation(s.id)) continue;
    const t = tidyStroke(s);
    await trx("studio_strokes").insert({ studio_id: studioId, stroke_id: t.id, name: t.name, families: JSON.stringify(t.families), words: JSON.stringify(t.words), neighbours: JSON.stringify(t.neighbours), position: ++pos, created_by: actorId });
    list.push(t);
    added.push(t.id);
  }
  if (added.length) await logActivity(trx, { studioId, actorId, action: "stroke.imported", subjectType: "stroke", subjectId: added[0]!, details: { strokes: added } });
  return added;
}
