import "server-only";
// A library's velocity response: every layer group (instrument + articulation + mic) with two or more layers,
// measured against a velocity curve (lib/catalogue/velocity-response.ts), as a view or a CSV/JSON download.
import { db } from "../db";
import { jsonColumn } from "../json-column";
import { getLibrary } from "./libraries";
import { trimsToCsv, trimsToJson, velocityResponse, type ResponseGroup } from "@/lib/catalogue/velocity-response";
import type { VelocityCurve } from "@/lib/catalogue/velocity";
import type { VelocityResponseView } from "@/lib/api-types/libraries";

type StoredLayer = { index: number; velocityLow: number; velocityHigh: number; meanStrikeLufs: number; sampleIds: string[] };

export async function libraryVelocityResponse({ studioId, libraryId, curve, rangeDb }: { studioId: string; libraryId: string; curve?: "dls" | "dannenberg"; rangeDb?: number }): Promise<VelocityResponseView> {
  const lib = await getLibrary({ studioId, libraryId });
  const kind = curve ?? lib.velocityCurve;
  const c: VelocityCurve = kind === "dannenberg" ? (rangeDb !== undefined ? { kind, rangeDb } : { kind }) : { kind: "dls" };
  const [groups, instruments] = await Promise.all([
    db()("layer_groups").where({ studio_id: studioId, library_id: libraryId }).orderBy("group_key").select("group_key", "instrument_key", "articulation", "mic", "layers"),
    db()("instruments").where({ studio_id: studioId, library_id: libraryId }).select("key", "name"),
  ]);
  const nameOf = new Map(instruments.map((i) => [i.key as string, i.name as string]));
  const out: VelocityResponseView["groups"] = [];
  for (const g of groups) {
    const layers = jsonColumn<StoredLayer[]>(g.layers).filter((l) => l.sampleIds.length > 0 && Number.isFinite(l.meanStrikeLufs));
    if (layers.length < 2) continue;
    out.push({
      key: g.group_key,
      instrument: nameOf.get(g.instrument_key) ?? g.instrument_key,
      articulation: g.articulation,
      mic: g.mic ?? null,
      response: velocityResponse(layers.map((l) => ({ index: l.index, velocityLow: l.velocityLow, velocityHigh: l.velocityHigh, strikeLufs: l.meanStrikeLufs })), { curve: c }),
      takes: layers.map((l) => ({ index: l.index, sampleId: l.sampleIds[0] ?? null })),
    });
  }
  return { library: lib.name, curve: c, groups: out };
}

/** The trims as a download: CSV (one row per layer) or kitwright.velocity-trims/v1 JSON. */
export function velocityTrimsFile(view: VelocityResponseView, format: "csv" | "json"): { body: string; type: string; name: string } {
  const groups: ResponseGroup[] = view.groups.map((g) => ({ key: g.key, instrument: g.instrument, articulation: g.articulation, mic: g.mic, response: g.response }));
  const name = `velocity-trims-${view.library}`;
  return format === "csv"
    ? { body: trimsToCsv(groups), type: "text/csv; charset=utf-8", name: `${name}.csv` }
    : { body: trimsToJson(view.library, view.curve, groups), type: "application/json", name: `${name}.json` };
}
