// An even velocity response: how far each velocity layer of one instrument + articulation sits from the
// library's velocity curve, and the gain trim (dB) that puts it on the curve.
//
// A layer's sample plays at its own level at the top of its velocity range (a sampler turns it down below
// that), so the layer's place on the curve is its upper velocity. The loudest-velocity layer is the
// reference: the curve's level at velocity v, relative to that layer's velocity, is the target of every other
// layer (curves: lib/catalogue/velocity.ts, the DLS Level 1 square law or Dannenberg's ICMC 2006 curve with a
// chosen dynamic range). trim = target - measured; after the trims every layer sits on the curve.
//
// Flags (common practice of library makers, no published source): a layer quieter than the layer below it is
// out of order; two neighbouring layers closer than `closeDb` (1 dB: about the smallest level step a listener
// tells apart) are too close to tell apart; a boost above 6 dB also raises the layer's noise floor by as much.

import { csvField } from "../audit/export";
import { curveAttenuationDb, type VelocityCurve } from "./velocity";

export interface ResponseLayer {
  index: number;
  velocityLow: number;
  velocityHigh: number;
  /** Measured strike loudness of the layer (mean over its round robins), LUFS. */
  strikeLufs: number;
}

export interface ResponseOptions {
  curve: VelocityCurve;
  /** Neighbouring layers closer than this (dB) are flagged. Default 1. */
  closeDb?: number;
}

export interface LayerResponse {
  index: number;
  velocityLow: number;
  velocityHigh: number;
  /** Measured level relative to the reference (top) layer, dB. */
  measuredDb: number;
  /** The curve's level at this layer's upper velocity, relative to the reference layer's velocity, dB. */
  targetDb: number;
  /** Gain that puts the layer on the curve: targetDb - measuredDb, dB (rounded to 0.01). */
  trimDb: number;
}

export interface GroupResponse {
  curve: VelocityCurve;
  /** The dynamic range the curve was drawn with (Dannenberg: stated, or the group's measured range). */
  rangeDb: number;
  /** Layers from the lowest velocity up. */
  layers: LayerResponse[];
  /** Pairs of neighbouring layers (indexes, lower velocity first) where the upper one is quieter. */
  outOfOrder: { lower: number; upper: number; db: number }[];
  /** Pairs of neighbouring layers whose levels differ by less than closeDb. */
  tooClose: { lower: number; upper: number; db: number }[];
  /** Layers the trim would raise by more than 6 dB. */
  bigBoosts: number[];
  /** Root-mean-square distance from the curve before the trims, dB (0 after them). */
  rmsBeforeDb: number;
}

const r2 = (x: number) => Math.round(x * 100) / 100 + 0; // + 0 turns -0 into 0

/** The response of one group of two or more layers (any order in; out sorted by velocity). */
export function velocityResponse(input: readonly ResponseLayer[], opts: ResponseOptions): GroupResponse {
  if (input.length < 2) throw new Error("a velocity response needs two or more layers");
  const layers = [...input].sort((a, b) => a.velocityHigh - b.velocityHigh || a.index - b.index);
  const top = layers[layers.length - 1]!;
  const levels = layers.map((l) => l.strikeLufs);
  const measuredRange = Math.max(...levels) - Math.min(...levels);
  const rangeDb = opts.curve.kind === "dannenberg" ? (opts.curve.rangeDb ?? (measuredRange > 0 ? measuredRange : 60)) : curveAttenuationDb(opts.curve, 1);
  const att = (v: number) => curveAttenuationDb(opts.curve, v, rangeDb);
  const refAtt = att(top.velocityHigh);
  const out: LayerResponse[] = layers.map((l) => {
    const measuredDb = l.strikeLufs - top.strikeLufs;
    const targetDb = -(att(l.velocityHigh) - refAtt);
    return { index: l.index, velocityLow: l.velocityLow, velocityHigh: l.velocityHigh, measuredDb: r2(measuredDb), targetDb: r2(targetDb), trimDb: r2(targetDb - measuredDb) };
  });
  const closeDb = opts.closeDb ?? 1;
  const outOfOrder: GroupResponse["outOfOrder"] = [];
  const tooClose: GroupResponse["tooClose"] = [];
  for (let i = 1; i < layers.length; i++) {
    const step = layers[i]!.strikeLufs - layers[i - 1]!.strikeLufs;
    const pair = { lower: layers[i - 1]!.index, upper: layers[i]!.index, db: r2(step) };
    if (step < 0) outOfOrder.push(pair);
    else if (step < closeDb) tooClose.push(pair);
  }
  const rms = Math.sqrt(out.reduce((s, l) => s + (l.targetDb - l.measuredDb) ** 2, 0) / out.length);
  return { curve: opts.curve, rangeDb: r2(rangeDb), layers: out, outOfOrder, tooClose, bigBoosts: out.filter((l) => l.trimDb > 6).map((l) => l.index), rmsBeforeDb: r2(rms) };
}

/** The curve's level (dB, relative to velocity `refVelocity`) at every velocity 1..127, for plots. */
export function curveLine(curve: VelocityCurve, rangeDb: number, refVelocity = 127): { velocity: number; db: number }[] {
  const ref = curveAttenuationDb(curve, refVelocity, rangeDb);
  return Array.from({ length: 127 }, (_, i) => ({ velocity: i + 1, db: r2(-(curveAttenuationDb(curve, i + 1, rangeDb) - ref)) }));
}

// ---------------------------------------------------------------- export (CSV, JSON)

export const TRIMS_SCHEMA = "kitwright.velocity-trims/v1";

/** One group of a library's response: which instrument, stroke and microphone, and its response. */
export interface ResponseGroup {
  key: string;
  instrument: string;
  articulation: string;
  mic: string | null;
  response: GroupResponse;
}

function layerFlags(r: GroupResponse, index: number): string {
  const f: string[] = [];
  if (r.outOfOrder.some((p) => p.upper === index)) f.push("quieter than the layer below");
  if (r.tooClose.some((p) => p.upper === index)) f.push("within 1 dB of the layer below");
  if (r.bigBoosts.includes(index)) f.push("boost over 6 dB");
  return f.join("; ");
}

/** The trims as CSV: one row per layer (CRLF line ends, RFC 4180). */
export function trimsToCsv(groups: readonly ResponseGroup[]): string {
  const rows = [["instrument", "articulation", "mic", "layer", "velocity_low", "velocity_high", "measured_db", "target_db", "trim_db", "flags"].join(",")];
  for (const g of groups) {
    g.response.layers.forEach((l, i) => {
      rows.push([g.instrument, g.articulation, g.mic, i + 1, l.velocityLow, l.velocityHigh, l.measuredDb, l.targetDb, l.trimDb, layerFlags(g.response, l.index)].map(csvField).join(","));
    });
  }
  return rows.join("\r\n") + "\r\n";
}

/** The trims as a kitwright.velocity-trims/v1 JSON document. */
export function trimsToJson(library: string, curve: VelocityCurve, groups: readonly ResponseGroup[]): string {
  return JSON.stringify({ schema: TRIMS_SCHEMA, library, curve, groups: groups.map((g) => ({ instrument: g.instrument, articulation: g.articulation, mic: g.mic, ...g.response, curve: undefined })) }, null, 2) + "\n";
}
