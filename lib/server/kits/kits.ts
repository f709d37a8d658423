import "server-only";
// Kits: named, ordered slots holding catalogue instruments. The body is kept as kitwright.kit/v2 (the kit
// object, its id = the row id) so import/export is a straight copy.
import type { Knex } from "knex";
import { db } from "../db";
import { AppError, notFound } from "../errors";
import { newId } from "../ids";
import { logActivity } from "../activity";
import { jsonColumn } from "../json-column";
import { buildDefaultKit } from "@/lib/audit/kits";
import { getTemplate } from "@/lib/audit/templates";
import type { Kit, KitSlot } from "@/lib/audit/types";
import type { KitRecord, KitSummary } from "@/lib/api-types/kits";
import { loadStudioCatalogue } from "./catalogue-for-audit";
import { adoptStrokes, checkStrokesKnown } from "../strokes";
import { kitStrokeUses } from "@/lib/audit/schema";

const iso = (d: unknown) => new Date(d as string).toISOString();

function toRecord(r: Record<string, unknown>): KitRecord {
  const body = jsonColumn(r.body) as Kit;
  return { id: r.id as string, name: r.name as string, kit: { ...body, id: r.id as string, name: r.name as string }, createdAt: iso(r.created_at), updatedAt: iso(r.updated_at) };
}

export async function listKits({ studioId }: { studioId: string }): Promise<KitSummary[]> {
  const rows = await db()("kits").where({ studio_id: studioId }).orderBy("name").select("id", "name", "body", "updated_at");
  return rows.map((r) => {
    const k = jsonColumn(r.body) as Kit;
    return { id: r.id, name: r.name, slots: k.slots.length, filled: k.slots.filter((s) => s.instrumentId).length, updatedAt: iso(r.updated_at) };
  });
}

export async function getKit({ studioId, kitId }: { studioId: string; kitId: string }, k: Knex = db()): Promise<KitRecord> {
  const r = await k("kits").where({ studio_id: studioId, id: kitId }).first();
  if (!r) throw notFound("The kit");
  return toRecord(r);
}

/** Every instrument id a kit names must be an instrument of this studio. */
async function checkInstruments(k: Knex, studioId: string, slots: KitSlot[]): Promise<void> {
  const ids = [...new Set(slots.map((s) => s.instrumentId).filter((x): x is string => !!x))];
  if (!ids.length) return;
  const found = new Set((await k("instruments").where({ studio_id: studioId }).whereIn("id", ids).select("id")).map((r) => r.id as string));
  const missing = ids.filter((i) => !found.has(i));
  if (missing.length) throw new AppError("invalid-input", `Not an instrument of this studio: ${missing.join(", ")}.`, { issues: missing.map((m) => ({ path: "body.slots", message: `unknown instrument ${m}` })) });
}

export async function createKit(
  { studioId, actorId, name, slots, template, libraryId }: { studioId: string; actorId: string; name: string; slots?: KitSlot[]; template?: string; libraryId?: string },
): Promise<KitRecord> {
  const id = newId();
  return db().transaction(async (trx) => {
    let body: Kit;
    if (template) {
      const layout = getTemplate(template);
      if (!layout) throw new AppError("invalid-input", `Unknown template "${template}".`);
      let catalogue = await loadStudioCatalogue({ studioId }, trx);
      if (libraryId) {
        // the library must be this studio's (another studio's is not admitted to exist)
        if (!(await trx("libraries").where({ studio_id: studioId, id: libraryId }).first("id"))) throw notFound("The library");
        catalogue = catalogue.filter((i) => i.libraryId === libraryId);
      }
      body = { ...buildDefaultKit(layout, catalogue, name), id, name };
    } else {
      body = { id, name, slots: slots ?? [] };
    }
    await checkInstruments(trx, studioId, body.slots);
    await checkStrokesKnown(studioId, kitStrokeUses(body), trx);
    await trx("kits").insert({ id, studio_id: studioId, name, body: JSON.stringify(body), created_by: actorId });
    await logActivity(trx, { studioId, actorId, action: "kit.created", subjectType: "kit", subjectId: id, details: { name, slots: body.slots.length, ...(template ? { template } : {}), ...(libraryId ? { libraryId } : {}) } });
    return getKit({ studioId, kitId: id }, trx);
  });
}

export async function updateKit(
  { studioId, actorId, kitId, name, slots }: { studioId: string; actorId: string; kitId: string; name?: string; slots?: KitSlot[] },
): Promise<KitRecord> {
  return db().transaction(async (trx) => {
    const before = await getKit({ studioId, kitId }, trx);
    const body: Kit = { id: kitId, name: name ?? before.name, slots: slots ?? before.kit.slots };
    if (slots) await checkInstruments(trx, studioId, slots);
    if (slots) await checkStrokesKnown(studioId, kitStrokeUses(body), trx);
    await trx("kits").where({ studio_id: studioId, id: kitId }).update({ name: body.name, body: JSON.stringify(body), updated_at: trx.fn.now(3) });
    const details: Record<string, unknown> = { name: body.name };
    if (name && name !== before.name) { details.from = before.name; details.to = name; }
    if (slots) details.slots = slots.length;
    await logActivity(trx, { studioId, actorId, action: name && name !== before.name && !slots ? "kit.renamed" : "kit.updated", subjectType: "kit", subjectId: kitId, details });
    return getKit({ studioId, kitId }, trx);
  });
}

export async function copyKit({ studioId, actorId, kitId, name }: { studioId: string; actorId: string; kitId: string; name?: string }): Promise<KitRecord> {
  const src = await getKit({ studioId, kitId });
  const rec = await createKit({ studioId, actorId, name: name ?? `${src.name} (copy)`, slots: src.kit.slots });
  return rec;
}

export async function deleteKit({ studioId, actorId, kitId }: { studioId: string; actorId: string; kitId: string }): Promise<void> {
  await db().transaction(async (trx) => {
    const before = await getKit({ studioId, kitId }, trx);
    await trx("kits").where({ studio_id: studioId, id: kitId }).delete();
    await logActivity(trx, { studioId, actorId, action: "kit.deleted", subjectType: "kit", subjectId: kitId, details: { name: before.name } });
  });
}

/** Import a kitwright.kit/v2 (or v1) kit as a new kit of the studio (its id is replaced; instruments must be the studio's). */
export async function importKit({ studioId, actorId, kit, name }: { studioId: string; actorId: string; kit: Kit; name?: string }): Promise<KitRecord> {
  // the file's own strokes the studio lacks join the studio first (kitwright.kit/v2)
  if (kit.strokes?.length) await db().transaction((trx) => adoptStrokes(trx, studioId, actorId, kit.strokes));
  return createKit({ studioId, actorId, name: name ?? kit.name, slots: kit.slots });
}
