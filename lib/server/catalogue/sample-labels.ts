import "server-only";
// Members' labels on samples (writes): bulk relabel and confirm. Labels set here become the member's (source
// "person"), win over the names and the sound at the next cataloguing, are logged, and queue that cataloguing.
import type { Knex } from "knex";
import { db } from "../db";
import { logActivity } from "../activity";
import { AppError, notFound } from "../errors";
import { assertLibrary } from "./libraries";
import { enqueueCataloguing } from "./queue";
import { checkStrokesKnown } from "../strokes";
import type { ConfirmAnswer, RelabelAnswer, RelabelBody } from "@/lib/api-types/samples";

async function ownedIds(trx: Knex.Transaction, studioId: string, libraryId: string, ids: string[]): Promise<string[]> {
  const rows = await trx("samples").where({ studio_id: studioId, library_id: libraryId }).whereIn("id", ids).select("id");
  if (rows.length !== new Set(ids).size) throw notFound("Some of the selected samples");
  return rows.map((r) => r.id);
}

/** Sets labels on many samples at once; they become confirmed (source "person"), are logged, and trigger a cataloguing. */
export async function relabelSamples({ studioId, libraryId, actorId, input }: { studioId: string; libraryId: string; actorId: string; input: RelabelBody }): Promise<RelabelAnswer> {
  await assertLibrary({ studioId, libraryId });
  if (input.instrumentKey) {
    const inst = await db()("instruments").where({ studio_id: studioId, library_id: libraryId, key: input.instrumentKey }).first("id");
    if (!inst) throw new AppError("invalid-input", "That instrument is not in this library.");
  }
  if (input.articulation !== undefined) await checkStrokesKnown(studioId, [{ stroke: input.articulation, path: ["articulation"] }]);
  const updated = await db().transaction(async (trx) => {
    const ids = await ownedIds(trx, studioId, libraryId, input.sampleIds);
    const patch: Record<string, unknown> = { confirmed_by: actorId, confirmed_at: trx.fn.now(3), updated_at: trx.fn.now(3) };
    if (input.family !== undefined) Object.assign(patch, { confirmed_family: input.family, family: input.family, family_source: "person" });
    if (input.articulation !== undefined) Object.assign(patch, { confirmed_articulation: input.articulation, articulation: input.articulation, articulation_source: "person" });
    if (input.mic !== undefined) Object.assign(patch, { confirmed_mic: input.mic ?? "-", mic: input.mic });
    if (input.instrumentKey !== undefined) Object.assign(patch, { confirmed_instrument_key: input.instrumentKey, instrument_key: input.instrumentKey });
    for (let i = 0; i < ids.length; i += 1000) await trx("samples").whereIn("id", ids.slice(i, i + 1000)).update(patch);
    const set = Object.fromEntries(Object.entries({ family: input.family, articulation: input.articulation, mic: input.mic, instrumentKey: input.instrumentKey }).filter(([, v]) => v !== undefined));
    await logActivity(trx, { studioId, actorId, action: "samples.relabelled", subjectType: "library", subjectId: libraryId, details: { count: ids.length, set, sampleIds: ids.slice(0, 50) } });
    return ids.length;
  });
  await enqueueCataloguing({ studioId, libraryId });
  return { updated };
}

/** Confirms the current family and articulation (and mic, instrument) of catalogued samples as they are. */
export async function confirmSamples({ studioId, libraryId, actorId, sampleIds }: { studioId: string; libraryId: string; actorId: string; sampleIds: string[] }): Promise<ConfirmAnswer> {
  await assertLibrary({ studioId, libraryId });
  const confirmed = await db().transaction(async (trx) => {
    await ownedIds(trx, studioId, libraryId, sampleIds);
    const rows = await trx("samples").where({ studio_id: studioId, library_id: libraryId, state: "catalogued" }).whereIn("id", sampleIds).whereNotNull("family").select("id");
    const ids = rows.map((r) => r.id as string);
    for (let i = 0; i < ids.length; i += 1000) {
      await trx("samples")
        .whereIn("id", ids.slice(i, i + 1000))
        .update({
          confirmed_family: trx.ref("family"),
          confirmed_articulation: trx.ref("articulation"),
          confirmed_mic: trx.raw("COALESCE(mic, '-')"),
          confirmed_instrument_key: trx.ref("instrument_key"),
          family_source: "person",
          articulation_source: "person",
          confidence: 1,
          confirmed_by: actorId,
          confirmed_at: trx.fn.now(3),
          updated_at: trx.fn.now(3),
        });
    }
    await logActivity(trx, { studioId, actorId, action: "samples.confirmed", subjectType: "library", subjectId: libraryId, details: { count: ids.length, sampleIds: ids.slice(0, 50) } });
    return ids.length;
  });
  await enqueueCataloguing({ studioId, libraryId });
  return { confirmed, skipped: sampleIds.length - confirmed };
}
