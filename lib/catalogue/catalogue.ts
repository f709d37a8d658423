// Over 300 lines: catalogueSamples, the one pipeline from measured samples to a catalogue, in order.
// The whole sorted catalogue of a set of measured samples: per sample its family, articulation (with label
// sources), instrument, mic, velocity layer and round robin; the instruments; the layer groups; the health
// findings. Called by the CLI (`kitwright catalogue`, `kitwright audit`) and by the server's cataloguing job, so
// both give the same answers for the same files. Pure.

import type { Measurement } from "../audio/types";
import { articulationFromSound, nameSoundConflict, suggestFromSound, type LabelModel, type NameSoundConflict, type SoundSuggestion } from "./classify";
import { conflictHealth, fileHealth, layerHealth, sortFindings, type HealthFinding, type HealthOptions } from "./health";
import { namesMarkSeries, splitBySound, type IdentityMember, type SoundInstrument } from "./identity";
import { instrumentPitchHz } from "./instrument-pitch";
import { micConsistency, takeName, type MicSample } from "./mic-consistency";
import type { SoundModel } from "./sound-model";
import { groupInstruments, instrumentDisplayName, splitByPitch, type Instrument } from "./instruments";
import { sortLayers, type Layer, type LayerOptions } from "./layers";
import { parseNames, type MicPosition, type NameInfo } from "./names";
import type { StrokeList } from "./strokes";
import type { Stroke, Family } from "./taxonomy";
import { DLS, type VelocityCurve } from "./velocity";

export type LabelSource = "name" | "sound" | "person";

/** The samples of multi-mic takes as mic-consistency.ts reads them (takes named by takeName). */
export function micSamples(work: readonly { s: CatalogueSampleInput; n: NameInfo; mic: MicPosition | null }[], entries: readonly CatalogueEntry[]): MicSample[] {
  const entryOf = new Map(entries.map((e) => [e.id, e]));
  return work.flatMap((w) => {
    const e = entryOf.get(w.s.id);
    if (!w.mic || !e) return [];
    const take = takeName(w.n.velocity?.raw ?? null, w.n.roundRobin, e.layerIndex, e.roundRobin);
    return [{ id: w.s.id, path: w.s.path, group: `${e.instrumentName} / ${e.articulation}`, take, mic: w.mic, measurement: w.s.measurement }];
  });
}

/** Families whose drums are told apart by pitch when only the sound names them. */
const PITCHED = new Set<Family>(["tom", "snare", "kick", "hand-drum", "cowbell"]);

export interface CatalogueSampleInput {
  id: string;
  /** Relative path inside the library (folders carry names too). */
  path: string;
  sha256?: string;
  measurement: Measurement;
  /** Labels a member confirmed; they win over names and sound. */
  confirmed?: { family?: Family; articulation?: Stroke; mic?: MicPosition | null; instrumentKey?: string };
}

export interface CatalogueOptions {
  /** Velocity curve for the layer ranges. Default DLS Level 1. */
  curve?: VelocityCurve;
  /** Nearest-neighbour model from the studio's confirmed labels (buildLabelModel). */
  labelModel?: LabelModel;
  /** The trained sound model (default: the committed one); null sorts by the rules of thumb alone. */
  soundModel?: SoundModel | null;
  layers?: Omit<LayerOptions, "curve">;
  health?: HealthOptions;
  /** The studio's own strokes (strokes.ts): the name reader sorts files into them. */
  strokes?: StrokeList | null;
}

/** One family the sound weighed, with how well it fits (0..1, see CatalogueEntry.sound.fit). */
export interface SoundFit {
  family: Family;
  fit: number;
}
/** How many families the sound's fit lists. */
export const SOUND_FIT_SHOWN = 4;

/** The families a sound suggestion weighed, best first: at most SOUND_FIT_SHOWN, none below 1 %. */
export function soundFit(s: Pick<SoundSuggestion, "family" | "familyScores">): SoundFit[] {
  // best first; on a tie the sound's own family, then by name
  const rank = ([f, v]: [Family, number]) => [-v, f === s.family ? 0 : 1, f] as const;
  return (Object.entries(s.familyScores) as [Family, number][])
    .filter(([, v]) => Number.isFinite(v) && v >= 0.01)
    .sort((a, b) => {
      const [x, y] = [rank(a), rank(b)];
      return x[0] - y[0] || x[1] - y[1] || x[2].localeCompare(y[2]);
    })
    .slice(0, SOUND_FIT_SHOWN)
    .map(([family, v]) => ({ family, fit: Math.round(Math.min(1, v) * 1000) / 1000 }));
}

export interface CatalogueEntry {
  id: string;
  path: string;
  family: Family;
  familySource: LabelSource;
  articulation: Stroke;
  articulationSource: LabelSource;
  /** Confidence of the family label, 0..1 (1 for a person's label). */
  confidence: number;
  /** Plain words: why these labels. */
  reasons: string[];
  name: Pick<NameInfo, "family" | "articulation" | "velocity" | "roundRobin" | "mic" | "stem">;
  sound: Pick<SoundSuggestion, "family" | "articulation" | "confidence" | "source"> & {
    /** What the sound alone says of each family it weighed, best first (at most SOUND_FIT_SHOWN): the trained
     * model's vote share, the rules' fit or the share of the nearest confirmed samples, 0..1. */
    fit: SoundFit[];
  };
  conflict: NameSoundConflict["level"];
  instrumentKey: string;
  instrumentName: string;
  mic: MicPosition | null;
  groupKey: string;
  /** 0 = softest; null when the strike loudness could not be measured. */
  layerIndex: number | null;
  layerCount: number;
  /** 1-based position among the layer's round robins. */
  roundRobin: number | null;
  roundRobinCount: number;
  velocityLow: number | null;
  velocityHigh: number | null;
  strikeLufs: number;
}

export interface LayerGroup {
  key: string;
  instrumentKey: string;
  articulation: Stroke;
  mic: MicPosition | null;
  label: string;
  countFrom: "names" | "gaps" | "single";
  criterion: string;
  layers: Layer[];
}

/** An instrument of the catalogue with its pitch (instrument-pitch.ts: the one rule the app and the CLI use). */
export interface SortedInstrument extends SoundInstrument {
  /** Median measured pitch of its main-stroke hits (else of all its samples), 0.01 Hz; null when none has a pitch. */
  pitchHz: number | null;
}

export interface Catalogue {
  samples: CatalogueEntry[];
  instruments: SortedInstrument[];
  groups: LayerGroup[];
  health: HealthFinding[];
  curve: VelocityCurve;
}

export function groupKeyOf(instrumentKey: string, articulation: Stroke, mic: MicPosition | null): string {
  return `${instrumentKey}|${articulation}|${mic ?? "-"}`;
}

const round2 = (x: number) => Math.round(x * 100) / 100;

/** Sorts measured samples into the catalogue. Input order does not matter; output is sorted by path. */
export function catalogueSamples(samples: CatalogueSampleInput[], opts: CatalogueOptions = {}): Catalogue {
  const curve = opts.curve ?? DLS;
  const ids = new Set<string>();
  for (const s of samples) {
    if (ids.has(s.id)) throw new Error(`sample id "${s.id}" appears twice`);
    ids.add(s.id);
  }
  const sorted = [...samples].sort((a, b) => a.path.localeCompare(b.path) || a.id.localeCompare(b.id));

  // 1. labels per sample
  interface Work extends Pick<CatalogueEntry, "family" | "familySource" | "articulation" | "articulationSource" | "confidence" | "reasons"> {
    s: CatalogueSampleInput;
    n: NameInfo;
    snd: SoundSuggestion;
    conflict: NameSoundConflict;
    mic: MicPosition | null;
  }
  // names are read together: a counter in a name is a round robin only when its folder shows a series
  const names = parseNames(sorted.map((s) => s.path), opts.strokes);
  const work: Work[] = sorted.map((s, i) => {
    const n = names[i]!;
    const snd = suggestFromSound(s.measurement, opts.labelModel, {
      soundModel: opts.soundModel,
      cacheKey: s.sha256 ? `${s.id}|${s.sha256}|${s.measurement.measureVersion}` : undefined,
    });
    const conflict = nameSoundConflict({ family: n.family, articulation: n.articulation }, snd, { measurement: s.measurement });
    let family: Family;
    let familySource: LabelSource;
    let confidence: number;
    const reasons: string[] = [];
    if (s.confirmed?.family) {
      family = s.confirmed.family;
      familySource = "person";
      confidence = 1;
      reasons.push("confirmed by a member");
    } else if (n.family) {
      family = n.family;
      familySource = "name";
      confidence = snd.family === n.family ? Math.max(0.9, snd.confidence) : conflict.level === "strong" ? 0.5 : 0.7;
      reasons.push(`${n.familyFrom === "folder" ? "folder" : "file"} name says ${n.family}`);
      if (conflict.level !== "none") reasons.push(conflict.message);
      else reasons.push(`sound agrees: ${snd.reasons[0]}`);
    } else {
      family = snd.family;
      familySource = "sound";
      confidence = snd.confidence;
      reasons.push(...snd.reasons);
    }
    let articulation: Stroke;
    let articulationSource: LabelSource;
    if (s.confirmed?.articulation) {
      articulation = s.confirmed.articulation;
      articulationSource = "person";
    } else if (n.articulation) {
      articulation = n.articulation;
      articulationSource = "name";
    } else if (snd.family === family) {
      articulation = snd.articulation;
      articulationSource = "sound";
    } else {
      const a = articulationFromSound(s.measurement, family);
      articulation = a.articulation;
      articulationSource = "sound";
      reasons.push(a.reason);
    }
    const mic = s.confirmed?.mic !== undefined ? s.confirmed.mic : n.mic;
    return { s, n, snd, family, familySource, articulation, articulationSource, confidence: round2(confidence), reasons, conflict, mic };
  });

  // 2. instruments
  const { instruments: autoInstruments, bySample } = groupInstruments(work.map((w) => ({ id: w.s.id, family: w.family, stem: w.n.stem })));
  let instruments: SoundInstrument[] = autoInstruments;
  // drums named by sound only: tell several drums of one kind apart by their pitch
  const soundOnly = new Set(work.filter((w) => w.familySource === "sound").map((w) => w.s.id));
  const pitchById: Record<string, number | null> = Object.fromEntries(work.map((w) => [w.s.id, w.s.measurement.pitchHz]));
  instruments = instruments.flatMap((inst) => {
    if (!PITCHED.has(inst.family) || !inst.sampleIds.every((id) => soundOnly.has(id))) return [inst];
    const parts = splitByPitch(inst, pitchById);
    if (parts.length > 1) for (const p of parts) for (const id of p.sampleIds) bySample[id] = p.key;
    return parts;
  });
  // same name, different drums: the sound splits what the names put together (identity.ts)
  instruments = splitInstrumentsBySound(instruments, bySample, work);
  instruments.sort((a, b) => a.key.localeCompare(b.key));
  const confirmedMoves = work.filter((w) => w.s.confirmed?.instrumentKey && w.s.confirmed.instrumentKey !== bySample[w.s.id]);
  if (confirmedMoves.length) {
    const map = new Map(instruments.map((i) => [i.key, { ...i, sampleIds: [...i.sampleIds] }]));
    for (const w of confirmedMoves) {
      const to = w.s.confirmed!.instrumentKey!;
      const from = map.get(bySample[w.s.id]!)!;
      from.sampleIds = from.sampleIds.filter((x) => x !== w.s.id);
      let target = map.get(to);
      if (!target) {
        const words = to.split(":")[1]?.split("-").filter((x) => x && x !== "main") ?? [];
        target = { key: to, family: w.family, displayName: instrumentDisplayName(w.family, words), descriptors: words, sampleIds: [], mergedFrom: [] };
        map.set(to, target);
      }
      target.sampleIds.push(w.s.id);
      target.sampleIds.sort();
      bySample[w.s.id] = to;
    }
    instruments = [...map.values()].filter((i) => i.sampleIds.length > 0).sort((a, b) => a.key.localeCompare(b.key));
  }
  const instName = new Map(instruments.map((i) => [i.key, i.displayName]));

  // 3. layer groups
  const byGroup = new Map<string, Work[]>();
  for (const w of work) {
    const k = groupKeyOf(bySample[w.s.id]!, w.articulation, w.mic);
    const l = byGroup.get(k) ?? [];
    l.push(w);
    byGroup.set(k, l);
  }
  const groups: LayerGroup[] = [];
  const layerOf = new Map<string, { layer: Layer; count: number; rr: number; rrCount: number }>();
  const findings: HealthFinding[] = [];
  for (const [key, members] of [...byGroup.entries()].sort((a, b) => a[0].localeCompare(b[0]))) {
    const first = members[0]!;
    const instrumentKey = bySample[first.s.id]!;
    const label = [instName.get(instrumentKey) ?? instrumentKey, first.articulation, first.mic].filter(Boolean).join(" / ");
    const res = sortLayers(
      members.map((w) => ({ id: w.s.id, strikeLufs: w.s.measurement.strikeLufs, velocityHint: w.n.velocity, roundRobin: w.n.roundRobin, path: w.s.path })),
      { ...opts.layers, curve },
    );
    groups.push({ key, instrumentKey, articulation: first.articulation, mic: first.mic, label, countFrom: res.countFrom, criterion: res.criterion, layers: res.layers });
    for (const layer of res.layers) layer.sampleIds.forEach((id, i) => layerOf.set(id, { layer, count: res.layers.length, rr: i + 1, rrCount: layer.sampleIds.length }));
    findings.push(...layerHealth(label, res.issues));
  }

  // 4. health
  const micOf = new Map(work.map((w) => [w.s.id, w.mic]));
  findings.push(...fileHealth(sorted.map((s) => ({ id: s.id, path: s.path, sha256: s.sha256, measurement: s.measurement, mic: micOf.get(s.id) ?? null })), opts.health));
  findings.push(...conflictHealth(work.filter((w) => w.familySource === "name").map((w) => ({ id: w.s.id, path: w.s.path, conflict: w.conflict }))));

  const entries: CatalogueEntry[] = work.map((w) => {
    const lo = layerOf.get(w.s.id);
    const instrumentKey = bySample[w.s.id]!;
    return {
      id: w.s.id,
      path: w.s.path,
      family: w.family,
      familySource: w.familySource,
      articulation: w.articulation,
      articulationSource: w.articulationSource,
      confidence: w.confidence,
      reasons: w.reasons,
      name: { family: w.n.family, articulation: w.n.articulation, velocity: w.n.velocity, roundRobin: w.n.roundRobin, mic: w.n.mic, stem: w.n.stem },
      sound: { family: w.snd.family, articulation: w.snd.articulation, confidence: w.snd.confidence, source: w.snd.source, fit: soundFit(w.snd) },
      conflict: w.conflict.level,
      instrumentKey,
      instrumentName: instName.get(instrumentKey) ?? instrumentKey,
      mic: w.mic,
      groupKey: groupKeyOf(instrumentKey, w.articulation, w.mic),
      layerIndex: lo ? lo.layer.index : null,
      layerCount: lo ? lo.count : 0,
      roundRobin: lo ? lo.rr : null,
      roundRobinCount: lo ? lo.rrCount : 0,
      velocityLow: lo ? lo.layer.velocityLow : null,
      velocityHigh: lo ? lo.layer.velocityHigh : null,
      strikeLufs: w.s.measurement.strikeLufs,
    };
  });

  // 4b. multi-mic takes: offsets and polarity against the close mic, missing mics (mic-consistency.ts)
  findings.push(...micConsistency(micSamples(work, entries)).findings);

  // 5. instrument pitch, from the hits as labelled above
  const entryById = new Map(entries.map((e) => [e.id, e]));
  const pitchOf = new Map(work.map((w) => [w.s.id, w.s.measurement.pitchHz]));
  const withPitch: SortedInstrument[] = instruments.map((inst) => ({
    ...inst,
    pitchHz: instrumentPitchHz(inst.family, inst.sampleIds.map((id) => ({ articulation: entryById.get(id)!.articulation, pitchHz: pitchOf.get(id) }))),
  }));

  return { samples: entries, instruments: withPitch, groups, health: sortFindings(findings), curve };
}

/**
 * Instrument identity (identity.ts): each instrument the names made is split into the drums its hits sound
 * like; `bySample` is updated. Samples a person placed in an instrument are not moved by the sound.
 */
function splitInstrumentsBySound(
  instruments: SoundInstrument[],
  bySample: Record<string, string>,
  work: { s: CatalogueSampleInput; n: NameInfo; articulation: Stroke; articulationSource: LabelSource; mic: MicPosition | null }[],
): SoundInstrument[] {
  const movable = new Map<string, IdentityMember[]>();
  for (const w of work) {
    if (w.s.confirmed?.instrumentKey) continue;
    const key = bySample[w.s.id]!;
    const list = movable.get(key) ?? [];
    list.push({
      id: w.s.id, path: w.s.path, measurement: w.s.measurement, series: namesMarkSeries(w.n),
      cell: `${w.mic ?? "-"}|${w.articulationSource === "sound" ? "*" : w.articulation}`,
    });
    movable.set(key, list);
  }
  return instruments.flatMap((inst) => {
    const parts = splitBySound(inst, movable.get(inst.key) ?? []);
    if (parts.length > 1) for (const p of parts) for (const id of p.sampleIds) bySample[id] = p.key;
    return parts;
  });
}
