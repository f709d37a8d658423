import "server-only";
// Read models of a library's catalogue: instruments (rename, merge), health findings with their samples,
// and the data of the plots (loudness ladder per group, feature map).
import { db } from "../db";
import { logActivity } from "../activity";
import { AppError, notFound } from "../errors";
import { assertLibrary } from "./libraries";
import { enqueueRegroup } from "./queue";
import type { HealthFinding, Layer } from "@/lib/catalog";
import type { InstrumentRow } from "@/lib/api-types/instruments";
import type { HealthView, LibraryPlots } from "@/lib/api-types/libraries";

const parse = <T,>(v: unknown): T => (typeof v === "string" ? JSON.parse(v) : v) as T;

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

/** Moves every sample of the source instruments into the target (confirmed), then regroups. */
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
  await enqueueRegroup({ studioId, libraryId });
  return { moved };
}

export async function libraryHealth({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<HealthView> {
  await assertLibrary({ studioId, libraryId });
  const h = await db()("library_health").where({ studio_id: studioId, library_id: libraryId }).first();
  if (!h) return { computedAt: null, sampleCount: 0, findings: [] };
  const findings = parse<HealthFinding[]>(h.findings);
  const ids = [...new Set(findings.flatMap((f) => f.sampleIds.slice(0, 50)))];
  const paths = new Map<string, string>();
  for (let i = 0; i < ids.length; i += 1000) {
    const rows = await db()("samples").where({ studio_id: studioId, library_id: libraryId }).whereIn("id", ids.slice(i, i + 1000)).select("id", "rel_path");
    for (const r of rows) paths.set(r.id, r.rel_path);
  }
  return {
    computedAt: new Date(h.computed_at).toISOString(),
    sampleCount: Number(h.sample_count),
    findings: findings.map((f) => ({ ...f, samples: f.sampleIds.slice(0, 50).filter((id) => paths.has(id)).map((id) => ({ id, path: paths.get(id)! })) })),
  };
}

export async function libraryPlots({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<LibraryPlots> {
  await assertLibrary({ studioId, libraryId });
  const [groups, samples] = await Promise.all([
    db()("layer_groups").where({ studio_id: studioId, library_id: libraryId }).orderBy("group_key"),
    db()("samples").where({ studio_id: studioId, library_id: libraryId, state: "catalogued" }).limit(20_000).select("id", "rel_path", "family", "articulation", "centroid_hz", "decay_sec", "strike_lufs", "conflict", "instrument_key"),
  ]);
  const loud = new Map(samples.map((s) => [s.id as string, s.strike_lufs === null ? null : Number(s.strike_lufs)]));
  return {
    groups: groups.map((g) => ({
      key: g.group_key, label: g.label, instrumentKey: g.instrument_key, articulation: g.articulation, mic: g.mic, countFrom: g.count_from, criterion: g.criterion,
      layers: parse<Layer[]>(g.layers).map((l) => ({
        index: l.index, velocityLow: l.velocityLow, velocityHigh: l.velocityHigh, meanStrikeLufs: l.meanStrikeLufs, spreadDb: l.spreadDb,
        members: l.sampleIds.map((id, i) => ({ id, strikeLufs: loud.get(id) ?? null, roundRobin: i + 1 })),
      })),
    })),
    points: samples
      .filter((s) => s.centroid_hz !== null && s.decay_sec !== null)
      .map((s) => ({ id: s.id, path: s.rel_path, family: s.family, articulation: s.articulation, centroidHz: Number(s.centroid_hz), decaySec: Number(s.decay_sec), strikeLufs: s.strike_lufs === null ? null : Number(s.strike_lufs), conflict: s.conflict, instrumentKey: s.instrument_key })),
  };
}
