import "server-only";
// The instruments of a library: the list (a read), rename and merge (writes, each with its activity row in the
// same transaction; a merge then queues a cataloguing of the library).
import { db } from "../db";
import { logActivity } from "../activity";
import { AppError, notFound } from "../errors";
import { assertLibrary } from "./libraries";
import { enqueueCataloguing } from "./queue";
import type { InstrumentRow } from "@/lib/api-types/instruments";

export async function listInstruments({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<InstrumentRow[]> {
  await assertLibrary({ studioId, libraryId });
  const rows = await db()("instruments").where({ studio_id: studioId, library_id: libraryId }).orderBy(["family", "name"]);
  return rows.map((r) => ({ id: r.id, key: r.key, name: r.name, nameSource: r.name_source, family: r.family, pitchHz: r.pitch_hz === null ? null : Number(r.pitch_hz), sampleCount: Number(r.sample_count) }));
}

export async function renameInstrument({ studioId, libraryId, instrumentId, actorId, name }: { studioId: string; libraryId: string; instrumentId: string; actorId: string; name: string }): Promise<void> {
  await db().transaction(async (trx) => {
    const inst = await trx("instruments").where({ studio_id: studioId, library_id: libraryId, id: instrumentId }).first();
    if (!inst) throw notFound("The instrument");
    await trx("instruments").where({ id: instrumentId }).update({ name, name_source: "person", updated_at: trx.fn.now(3) });
    await logActivity(trx, { studioId, actorId, action: "instrument.renamed", subjectType: "instrument", subjectId: instrumentId, details: { from: inst.name, to: name, libraryId } });
  });
}

/** Moves every sample of the source instruments into the target (confirmed), then catalogues the library again. */
export async function mergeInstruments({ studioId, libraryId, actorId, sourceIds, targetId }: { studioId: string; libraryId: string; actorId: string; sourceIds: string[]; targetId: string }): Promise<{ moved: number }> {
  if (sourceIds.includes(targetId)) throw new AppError("invalid-input", "An instrument cannot be merged into itself.");
  const moved = await db().transaction(async (trx) => {
    const all = await trx("instruments").where({ studio_id: studioId, library_id: libraryId }).whereIn("id", [...sourceIds, targetId]).select("id", "key", "name", "family");
    const target = all.find((x) => x.id === targetId);
    const sources = all.filter((x) => x.id !== targetId);
    if (!target || sources.length !== new Set(sourceIds).size) throw notFound("The instrument");
    const n = await trx("samples")
      .where({ studio_id: studioId, library_id: libraryId })
      .whereIn("instrument_key", sources.map((s) => s.key))
      .update({ confirmed_instrument_key: target.key, instrument_key: target.key, confirmed_by: actorId, confirmed_at: trx.fn.now(3), updated_at: trx.fn.now(3) });
    await logActivity(trx, { studioId, actorId, action: "instruments.merged", subjectType: "instrument", subjectId: targetId, details: { into: target.name, from: sources.map((s) => s.name), samples: n, libraryId } });
    return Number(n);
  });
  await enqueueCataloguing({ studioId, libraryId });
  return { moved };
}
