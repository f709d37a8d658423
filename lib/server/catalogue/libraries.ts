import "server-only";
// Libraries of a studio: create, rename, describe, delete (with their stored files), and counts per state.
import { db } from "../db";
import { logActivity } from "../activity";
import { AppError, notFound } from "../errors";
import { newId } from "../ids";
import { storage } from "../storage";
import { enqueueCataloguing } from "./queue";
import { MEASURED_STATES, type VelocityCurveName } from "@/lib/validation/library";
import type { LibraryProgress, LibrarySummary, StateCounts } from "@/lib/api-types/libraries";
import { deleteWordsOfLibrary } from "./words";

/** Storage folder of a library's files. */
export const libraryPrefix = (studioId: string, libraryId: string) => `studios/${studioId}/libraries/${libraryId}/`;
export const sampleKey = (studioId: string, libraryId: string, sampleId: string) => `${libraryPrefix(studioId, libraryId)}${sampleId}.wav`;

const emptyCounts = (): StateCounts => ({ queued: 0, measuring: 0, measured: 0, catalogued: 0, rejected: 0, total: 0 });

export async function countsFor(studioId: string, libraryIds: string[]): Promise<Map<string, StateCounts>> {
  const out = new Map<string, StateCounts>(libraryIds.map((id) => [id, emptyCounts()]));
  if (!libraryIds.length) return out;
  // exact counters kept by triggers (migration 0008); the join keeps the studio scope
  const rows = await db()("library_sample_counts as c")
    .join("libraries as l", "l.id", "c.library_id")
    .where("l.studio_id", studioId)
    .whereIn("c.library_id", libraryIds)
    .andWhere("c.n", ">", 0)
    .select("c.library_id", "c.state", "c.n");
  // ids compare without regard to case in the database: match them the same way here (a counter row may
  // carry another spelling of the id than the caller's), and add up rather than overwrite
  const byLower = new Map([...out].map(([id, c]) => [id.toLowerCase(), c]));
  for (const r of rows as { library_id: string; state: string; n: number | string }[]) {
    const c = byLower.get(r.library_id.toLowerCase());
    if (!c || !(r.state in c) || r.state === "total") continue;
    c[r.state as Exclude<keyof StateCounts, "total">] += Number(r.n);
    c.total += Number(r.n);
  }
  return out;
}

function toSummary(r: Record<string, any>, counts: StateCounts, instruments: number): LibrarySummary {
  return {
    id: r.id,
    name: r.name,
    description: r.description ?? null,
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
    counts,
    instruments,
    healthComputedAt: r.computed_at ? new Date(r.computed_at).toISOString() : null,
    velocityCurve: r.velocity_curve === "dannenberg" ? "dannenberg" : "dls",
  };
}

export async function listLibraries({ studioId }: { studioId: string }): Promise<LibrarySummary[]> {
  const rows = await db()("libraries as l").leftJoin("library_health as h", "h.library_id", "l.id").where("l.studio_id", studioId).orderBy("l.name").select("l.*", "h.computed_at");
  const ids = rows.map((r) => r.id as string);
  const counts = await countsFor(studioId, ids);
  const inst = ids.length ? await db()("instruments").where({ studio_id: studioId }).whereIn("library_id", ids).groupBy("library_id").select("library_id").count({ n: "*" }) : [];
  const instBy = new Map((inst as { library_id: string; n: number | string }[]).map((r) => [r.library_id, Number(r.n)]));
  return rows.map((r) => toSummary(r, counts.get(r.id)!, instBy.get(r.id) ?? 0));
}

export async function getLibrary({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<LibrarySummary> {
  const r = await db()("libraries as l").leftJoin("library_health as h", "h.library_id", "l.id").where({ "l.studio_id": studioId, "l.id": libraryId }).first("l.*", "h.computed_at");
  if (!r) throw notFound("The library");
  const counts = (await countsFor(studioId, [libraryId])).get(libraryId)!;
  const inst = await db()("instruments").where({ studio_id: studioId, library_id: libraryId }).count({ n: "*" }).first();
  return toSummary(r, counts, Number(inst?.n ?? 0));
}

/** Throws 404 unless the library belongs to the studio. */
export async function assertLibrary({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<{ id: string; name: string }> {
  const r = await db()("libraries").where({ studio_id: studioId, id: libraryId }).first("id", "name");
  if (!r) throw notFound("The library");
  return r;
}

/**
 * Counts per state, plus `cataloguing`: samples wait for the cataloguing (state measured), or changed
 * (measured again, relabelled) after the last cataloguing read them, so instruments, layers and health are
 * about to change.
 */
export async function libraryProgress({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<LibraryProgress> {
  await assertLibrary({ studioId, libraryId });
  const c = (await countsFor(studioId, [libraryId])).get(libraryId)!;
  const [h, last] = await Promise.all([
    db()("library_health").where({ library_id: libraryId, studio_id: studioId }).first("computed_at"),
    db()("samples").where({ library_id: libraryId, studio_id: studioId }).whereIn("state", MEASURED_STATES).max({ t: "updated_at" }).first(),
  ]);
  const lastChange = last?.t ? new Date(last.t).getTime() : null;
  const cataloguing = c.measured > 0 || (lastChange !== null && (!h || lastChange > new Date(h.computed_at).getTime()));
  return { ...c, pending: c.queued + c.measuring, cataloguing, healthComputedAt: h ? new Date(h.computed_at).toISOString() : null };
}

export async function createLibrary({ studioId, actorId, name, description }: { studioId: string; actorId: string; name: string; description?: string | null }): Promise<{ id: string; name: string }> {
  const id = newId();
  await db().transaction(async (trx) => {
    const clash = await trx("libraries").where({ studio_id: studioId, name }).first("id");
    if (clash) throw new AppError("conflict", `This studio already has a library named "${name}".`);
    await trx("libraries").insert({ id, studio_id: studioId, name, description: description || null, created_by: actorId });
    await logActivity(trx, { studioId, actorId, action: "library.created", subjectType: "library", subjectId: id, details: { name } });
  });
  return { id, name };
}

export async function updateLibrary({ studioId, actorId, libraryId, name, description, velocityCurve }: { studioId: string; actorId: string; libraryId: string; name?: string; description?: string | null; velocityCurve?: VelocityCurveName }): Promise<void> {
  let curveChanged = false;
  await db().transaction(async (trx) => {
    const lib = await trx("libraries").where({ studio_id: studioId, id: libraryId }).forUpdate().first();
    if (!lib) throw notFound("The library");
    const patch: Record<string, unknown> = { updated_at: db().fn.now(3) };
    const details: Record<string, unknown> = {};
    if (name !== undefined && name !== lib.name) {
      const clash = await trx("libraries").where({ studio_id: studioId, name }).whereNot({ id: libraryId }).first("id");
      if (clash) throw new AppError("conflict", `This studio already has a library named "${name}".`);
      patch.name = name;
      details.from = lib.name;
      details.to = name;
    }
    if (description !== undefined) {
      patch.description = description || null;
      details.description = true;
    }
    if (velocityCurve !== undefined && velocityCurve !== lib.velocity_curve) {
      patch.velocity_curve = velocityCurve;
      curveChanged = true;
      await logActivity(trx, { studioId, actorId, action: "library.curve-changed", subjectType: "library", subjectId: libraryId, details: { name: lib.name, from: lib.velocity_curve, to: velocityCurve } });
    }
    await trx("libraries").where({ id: libraryId }).update(patch);
    if (name !== undefined || description !== undefined) {
      await logActivity(trx, { studioId, actorId, action: name !== undefined && name !== lib.name ? "library.renamed" : "library.described", subjectType: "library", subjectId: libraryId, details: { name: name ?? lib.name, ...details } });
    }
  });
  // the layers' velocity ranges follow the curve: catalogue the library again
  if (curveChanged) await enqueueCataloguing({ studioId, libraryId });
}

/** Deletes a library, its rows and its stored files. The caller confirmed by typing the name. */
export async function deleteLibrary({ studioId, actorId, libraryId, confirmName }: { studioId: string; actorId: string; libraryId: string; confirmName: string }): Promise<{ files: number }> {
  const lib = await db()("libraries").where({ studio_id: studioId, id: libraryId }).first();
  if (!lib) throw notFound("The library");
  if (confirmName.trim() !== lib.name) throw new AppError("invalid-input", "Type the library's name exactly to confirm deleting it.");
  const count = await db()("samples").where({ studio_id: studioId, library_id: libraryId }).count({ n: "*" }).first();
  await db().transaction(async (trx) => {
    await deleteWordsOfLibrary(trx, libraryId);
    await trx("libraries").where({ studio_id: studioId, id: libraryId }).delete();
    await logActivity(trx, { studioId, actorId, action: "library.deleted", subjectType: "library", subjectId: libraryId, details: { name: lib.name, samples: Number(count?.n ?? 0) } });
  });
  const files = await storage().deletePrefix(libraryPrefix(studioId, libraryId));
  return { files };
}
