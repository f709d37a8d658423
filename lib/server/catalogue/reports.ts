import "server-only";
// Read-only reports of a library's catalogue: the health findings with their samples, and the data of the plots
// (loudness ladder per layer group, feature map). Nothing here writes.
import { db } from "../db";
import { jsonColumn } from "../json-column";
import { assertLibrary } from "./libraries";
import type { HealthFinding, Layer } from "@/lib/catalogue";
import { micConsistency, takeName, type MicSample, type MicSeries } from "@/lib/catalogue/mic-consistency";
import { parseName } from "@/lib/catalogue/names";
import type { Measurement } from "@/lib/audio/types";
import type { FeaturePoint, HealthView, LadderGroup, LibraryPlots } from "@/lib/api-types/libraries";
import { MEASURED_STATES } from "@/lib/validation/library";

export async function libraryHealth({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<HealthView> {
  await assertLibrary({ studioId, libraryId });
  const h = await db()("library_health").where({ studio_id: studioId, library_id: libraryId }).first();
  if (!h) return { computedAt: null, sampleCount: 0, findings: [], micSeries: [] };
  const findings = jsonColumn<HealthFinding[]>(h.findings);
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
    micSeries: await micSeriesOf({ studioId, libraryId }),
  };
}

/** Offsets of every multi-mic take against its close mic (lib/catalogue/mic-consistency.ts), from the stored measurements. */
async function micSeriesOf({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<MicSeries[]> {
  const rows = await db()("samples")
    .where({ studio_id: studioId, library_id: libraryId, state: "catalogued" })
    .whereNotNull("mic")
    .limit(20_000)
    // only the two fields the comparison reads, not the whole measurement (a few KB a sample)
    .select("id", "rel_path", "mic", "instrument_key", "articulation", "layer_index", "round_robin", db().raw("JSON_VALUE(measurement, '$.onsetMs') AS onset_ms"), db().raw("JSON_EXTRACT(measurement, '$.onsetWave') AS onset_wave"));
  if (rows.length === 0) return [];
  const names = new Map((await db()("instruments").where({ studio_id: studioId, library_id: libraryId }).select("key", "name")).map((i) => [i.key as string, i.name as string]));
  const samples: MicSample[] = rows.map((r) => {
    const n = parseName(r.rel_path);
    return {
      id: r.id, path: r.rel_path, mic: r.mic,
      measurement: { onsetMs: Number(r.onset_ms), onsetWave: r.onset_wave ? jsonColumn<NonNullable<Measurement["onsetWave"]>>(r.onset_wave) : undefined },
      group: `${names.get(r.instrument_key) ?? r.instrument_key} / ${r.articulation}`,
      take: takeName(n.velocity?.raw ?? null, n.roundRobin, r.layer_index ?? null, r.round_robin ?? null),
    };
  });
  return micConsistency(samples).series;
}

export async function libraryPlots({ studioId, libraryId }: { studioId: string; libraryId: string }): Promise<LibraryPlots> {
  await assertLibrary({ studioId, libraryId });
  const [groups, samples] = await Promise.all([
    db()("layer_groups").where({ studio_id: studioId, library_id: libraryId }).orderBy("group_key"),
    db()("samples").where({ studio_id: studioId, library_id: libraryId }).whereIn("state", MEASURED_STATES).limit(20_000).select("id", "rel_path", "family", "articulation", "centroid_hz", "decay_sec", "strike_lufs", "conflict", "instrument_key"),
  ]);
  const loud = new Map(samples.map((s) => [s.id as string, s.strike_lufs === null ? null : Number(s.strike_lufs)]));
  return {
    groups: groups.map((g) => ({
      key: g.group_key, label: g.label, instrumentKey: g.instrument_key, articulation: g.articulation, mic: g.mic, countFrom: g.count_from, criterion: g.criterion,
      layers: jsonColumn<Layer[]>(g.layers).map((l) => ({
        index: l.index, velocityLow: l.velocityLow, velocityHigh: l.velocityHigh, meanStrikeLufs: l.meanStrikeLufs, spreadDb: l.spreadDb,
        members: l.sampleIds.map((id, i) => ({ id, strikeLufs: loud.get(id) ?? null, roundRobin: i + 1 })),
      })),
    })),
    points: samples
      .filter((s) => s.centroid_hz !== null && s.decay_sec !== null)
      .map((s) => ({ id: s.id, path: s.rel_path, family: s.family, articulation: s.articulation, centroidHz: Number(s.centroid_hz), decaySec: Number(s.decay_sec), strikeLufs: s.strike_lufs === null ? null : Number(s.strike_lufs), conflict: s.conflict, instrumentKey: s.instrument_key })),
  };
}
