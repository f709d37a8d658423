// Over 300 lines: the rules of thumb, their words and the model answer they explain, one concept together.
// Sound classification: a family and articulation suggestion from the measured features, with a confidence
// (0..1) and the reasons in plain words.
//
// Without confirmed labels it uses RULES OF THUMB from drum acoustics and trade knowledge (common practice,
// no published source; approximate ranges from memory of the acoustics of drums and cymbals):
//   kick      fundamental about 40-100 Hz, body energy low (centroid under ~400 Hz), tonal body, decay 0.15-1.2 s
//   snare     body fundamental about 150-330 Hz with a strong noise part from the wires (high flatness), decay 0.15-1 s
//   tom       tonal (low flatness), fundamental about 60-330 Hz, moderate decay 0.3-2 s, body under ~600 Hz
//   hi-hat    small thick cymbals: the brightest (centroid over ~6 kHz), noisy; closed under ~0.3 s, open up to a
//             few seconds, pedal "chick" shortest
//   crash     bright (centroid ~2.5-8 kHz) and noisy with a long wash, decay over ~1.5 s
//   ride      long decay (over ~2 s) with a clearer "ping": less noisy at the strike than a crash
//   china     trashy: the noisiest cymbal, darker centroid than a crash, decay 1-4 s
//   splash    small cymbal: bright, decay about 0.4-1.5 s
//   cowbell   tonal mid-range peaks about 450-1000 Hz, short decay
//   hand drum tonal, 100-450 Hz, short decay; shaker: very short, very bright, noisy, soft attack
// With confirmed labels (within the studio) it uses k nearest neighbours over standardised features, and falls
// back to the rules for families with too few confirmed labels.

import { formatConfidence } from "./confidence";
import type { Measurement } from "../audio/types";
import { decaySec, distance, featureVector, fitStandardiser, standardise, type Standardiser } from "./features";
import { soundFeatures } from "./sound-features";
import { predictSound, type SoundModel } from "./sound-model";
import { trainedSoundModel } from "./sound-model-file";
import { FAMILY_ARTICULATIONS, familyWords, type Articulation, type Family, type Stroke } from "./taxonomy";

export interface SoundSuggestion {
  family: Family;
  articulation: Articulation;
  /** 0..1 */
  confidence: number;
  /** Plain words: the measured values and what decided. */
  reasons: string[];
  /** model: the trained sound model; rules: the rules of thumb; labels: the studio's confirmed labels. */
  source: "model" | "rules" | "labels";
  /** The other families considered, best first, with their score (rules) or vote share (labels). */
  alternatives: { family: Family; score: number }[];
  /** How well each family fits, 0..1: rule score (rules) or neighbour vote share (labels). */
  familyScores: Partial<Record<Family, number>>;
}

// ---------------------------------------------------------------------------------------------------------------
// Rules of thumb

interface Feat {
  decay: number;
  sc: number;
  bc: number;
  sf: number;
  bf: number;
  pitch: number | null;
  attack: number;
  rolloff: number;
}

function feat(m: Measurement): Feat {
  const body = m.body ?? m.strike;
  return {
    decay: decaySec(m),
    sc: m.strike.centroidHz,
    bc: body.centroidHz,
    sf: m.strike.flatness,
    bf: body.flatness,
    pitch: m.pitchHz !== null && Number.isFinite(m.pitchHz) && m.pitchHz > 0 ? m.pitchHz : null,
    attack: m.attackMs,
    rolloff: body.rolloffHz,
  };
}

type Key = keyof Feat;
/** [feature, low, high, width outside the band (octaves for Hz/s/ms, units for flatness), weight, score when missing] */
type Rule = [Key, number, number, number, number, number?];

const LOG_KEYS = new Set<Key>(["decay", "sc", "bc", "pitch", "attack", "rolloff", "sf", "bf"]);

/** Cymbals have little energy below ~200 Hz: a strong low peak speaks against them; no peak at all is normal. */
const CYMBAL_PITCH: Rule = ["pitch", 200, 20000, 0.7, 1, 1];

// Flatness is judged on a log scale (octaves of the ratio): white noise reads about 0.85 on the amplitude spectrum
// (computed: one frame of white noise), but drum and cymbal noise is coloured (it rolls off), which lowers the geometric mean a lot:
// tonal drums sit near 0.01-0.05, a snare's wires lift it to roughly 0.08-0.5, cymbal wash roughly 0.2-0.9
// (from memory; common practice, no published source).
const RULES: Record<Exclude<Family, "other">, Rule[]> = {
  kick: [["pitch", 35, 90, 0.4, 3], ["bc", 40, 450, 0.7, 2], ["bf", 0.0005, 0.06, 1.2, 1], ["decay", 0.15, 1.0, 0.6, 1]],
  snare: [["pitch", 140, 330, 0.5, 1.5], ["sf", 0.08, 0.5, 0.8, 3], ["bc", 300, 4000, 0.8, 1], ["decay", 0.12, 1.0, 0.8, 1]],
  tom: [["pitch", 70, 330, 0.5, 2.5], ["bf", 0.0005, 0.05, 1, 2], ["bc", 60, 700, 0.7, 1.5], ["decay", 0.3, 2.5, 0.8, 1]],
  "hi-hat": [["sc", 6000, 16000, 0.6, 2.5], ["sf", 0.2, 0.9, 0.8, 1.5], ["bc", 3000, 14000, 0.7, 1], ["decay", 0.03, 2.5, 0.7, 1.5], CYMBAL_PITCH],
  crash: [["sc", 2500, 8000, 0.6, 1.5], ["sf", 0.2, 0.9, 0.8, 1.5], ["bf", 0.2, 0.6, 0.8, 1.5], ["bc", 3000, 9000, 0.7, 1], ["decay", 1.5, 7, 0.7, 3], CYMBAL_PITCH],
  ride: [["decay", 2.0, 10, 0.7, 2.5], ["sf", 0.04, 0.25, 0.8, 2], ["bc", 2000, 8000, 0.7, 1], ["bf", 0.06, 0.4, 0.8, 1], CYMBAL_PITCH],
  china: [["decay", 1.0, 4, 0.7, 2], ["bf", 0.35, 0.95, 0.8, 2.5], ["sc", 1800, 7000, 0.6, 1], ["bc", 1500, 4500, 0.7, 1], CYMBAL_PITCH],
  splash: [["decay", 0.5, 1.8, 0.6, 2.5], ["sc", 4000, 12000, 0.6, 1.5], ["bf", 0.2, 0.9, 0.8, 1], ["bc", 4000, 12000, 0.7, 1], CYMBAL_PITCH],
  stack: [["decay", 0.1, 0.8, 0.6, 2], ["sc", 2500, 9000, 0.6, 1], ["bf", 0.3, 0.95, 0.8, 2], ["bc", 2000, 8000, 0.7, 0.5], CYMBAL_PITCH],
  cowbell: [["pitch", 450, 1000, 0.4, 3], ["bf", 0.0005, 0.06, 1, 2], ["bc", 500, 2500, 0.6, 1], ["decay", 0.1, 0.8, 0.7, 1]],
  "hand-drum": [["pitch", 100, 450, 0.5, 2], ["bf", 0.0005, 0.08, 1, 1.5], ["bc", 150, 1000, 0.7, 1], ["decay", 0.08, 0.6, 0.6, 1.5]],
  shaker: [["decay", 0.02, 0.3, 0.6, 2], ["sc", 4000, 14000, 0.6, 1.5], ["sf", 0.3, 0.95, 0.8, 2], ["attack", 5, 60, 0.8, 1.5]],
};

/** Families that are less common in drum kits start slightly behind (common practice). */
const PRIOR: Partial<Record<Family, number>> = { stack: 0.9, "hand-drum": 0.9, shaker: 0.9, splash: 0.95 };
const OTHER_SCORE = 0.35;
const RULE_CAP = 0.85;

function membership(f: Feat, [key, lo, hi, width, , missing]: Rule): number {
  const raw = f[key];
  if (raw === null || !Number.isFinite(raw)) return missing ?? (key === "pitch" ? 0.4 : 0.5);
  let d: number;
  if (LOG_KEYS.has(key)) {
    const x = Math.log2(Math.max(raw, 1e-6));
    d = x < Math.log2(lo) ? Math.log2(lo) - x : x > Math.log2(hi) ? x - Math.log2(hi) : 0;
  } else {
    d = raw < lo ? lo - raw : raw > hi ? raw - hi : 0;
  }
  return Math.exp(-((d / width) ** 2));
}

/** Score of each family under the rules of thumb, 0..1, best first. */
export function ruleScores(m: Measurement): { family: Family; score: number }[] {
  const f = feat(m);
  const out: { family: Family; score: number }[] = [];
  for (const [fam, rules] of Object.entries(RULES) as [Exclude<Family, "other">, Rule[]][]) {
    let s = 0;
    let w = 0;
    for (const r of rules) {
      s += r[4] * membership(f, r);
      w += r[4];
    }
    out.push({ family: fam, score: (s / w) * (PRIOR[fam] ?? 1) });
  }
  out.push({ family: "other", score: OTHER_SCORE });
  return out.sort((a, b) => b.score - a.score);
}

const fmtHz = (hz: number) => (hz >= 1000 ? `${(hz / 1000).toFixed(1)} kHz` : `${Math.round(hz)} Hz`);
const fmtS = (s: number) => (s >= 1 ? `${s.toFixed(1)} s` : `${Math.round(s * 1000)} ms`);

/** The measured values in plain words ("decay 1.9 s, centroid 7.4 kHz, flatness 0.61, pitch 62 Hz"). */
export function describeSound(m: Measurement): string {
  const f = feat(m);
  const parts = [`decay ${fmtS(f.decay)}`, `centroid ${fmtHz(f.sc)}`, `flatness ${f.bf >= 0.1 || f.bf === 0 ? f.bf.toFixed(2) : f.bf.toFixed(3)}`];
  if (f.pitch !== null) parts.push(`pitch ${fmtHz(f.pitch)}`);
  return parts.join(", ");
}

/**
 * Articulation from the sound within a family (rules of thumb, common practice, no published source):
 * hi-hat openness by decay (pedal chick shortest, closed < 0.3 s, then quarter/half-open, open > 1.5 s); cymbals
 * with a short decay are choked; a ride with a tonal strike is its bell, a noisy one is crashed; a snare
 * stroke that is short and tonal is a cross-stick, a very bright one a rim shot.
 */
export function articulationFromSound(m: Measurement, family: Family): { articulation: Articulation; reason: string } {
  const f = feat(m);
  const d = fmtS(f.decay);
  switch (family) {
    case "hi-hat":
      // the pedal "chick" has no stick transient: short and darker than stick hits
      if (f.decay < 0.25 && f.sc < 7000) return { articulation: "pedal", reason: `short (${d}) and darker (${fmtHz(f.sc)}): pedal chick` };
      if (f.decay < 0.3) return { articulation: "closed", reason: `short decay ${d}: closed` };
      if (f.decay < 0.7) return { articulation: "quarter-open", reason: `decay ${d}: slightly open` };
      if (f.decay < 1.5) return { articulation: "half-open", reason: `decay ${d}: half open` };
      return { articulation: "open", reason: `long decay ${d}: open` };
    case "crash":
    case "china":
    case "splash":
      if (f.decay < (family === "splash" ? 0.25 : 0.5)) return { articulation: "choke", reason: `cymbal stopped after ${d}: choke` };
      if (f.sf < 0.06 && f.bc > 1200) return { articulation: "bell", reason: `tonal strike (flatness ${f.sf.toFixed(2)}): bell` };
      return { articulation: "crash-hit", reason: `full wash, decay ${d}` };
    case "ride":
      if (f.decay < 0.5) return { articulation: "choke", reason: `cymbal stopped after ${d}: choke` };
      if (f.sf < 0.06 && f.bc > 1000) return { articulation: "bell", reason: `tonal strike (flatness ${f.sf.toFixed(2)}): bell` };
      if (f.bf > 0.35) return { articulation: "crash-hit", reason: `noisy wash (flatness ${f.bf.toFixed(2)}): crashed` };
      return { articulation: "bow", reason: "defined ping with moderate wash: bow" };
    case "snare":
      if (f.decay < 0.3 && f.sf < 0.1 && f.sc >= 700 && f.sc <= 4000) return { articulation: "cross-stick", reason: `short woody click (${d}, flatness ${f.sf.toFixed(2)}): cross-stick` };
      if (f.sc > 5000 && f.sf > 0.15) return { articulation: "rim-shot", reason: `very bright strike (${fmtHz(f.sc)}): rim shot` };
      return { articulation: "centre", reason: "head and wires: centre" };
    case "tom":
      if (f.sc > 5000) return { articulation: "rim-shot", reason: `very bright strike (${fmtHz(f.sc)}): rim shot` };
      return { articulation: "centre", reason: "tonal head: centre" };
    case "kick":
      return { articulation: "centre", reason: "kick: centre" };
    case "cowbell":
      if (f.decay < 0.12) return { articulation: "mute", reason: `very short (${d}): muted` };
      return { articulation: "hit", reason: "ringing note" };
    case "hand-drum":
      if (f.decay < 0.1) return { articulation: "mute", reason: `very short (${d}): muted` };
      if (f.sf > 0.15) return { articulation: "slap", reason: `noisy crack (flatness ${f.sf.toFixed(2)}): slap` };
      return { articulation: "open-tone", reason: "ringing head: open tone" };
    case "stack":
      return { articulation: "hit", reason: "stack: hit" };
    default:
      return { articulation: FAMILY_ARTICULATIONS[family][0] ?? "hit", reason: "default articulation" };
  }
}

/** Rules-of-thumb suggestion (common practice, no published source). */
export function suggestByRules(m: Measurement): SoundSuggestion {
  const scores = ruleScores(m);
  const best = scores[0]!;
  const T = 0.08;
  const z = scores.reduce((a, s) => a + Math.exp((s.score - best.score) / T), 0);
  const share = 1 / z;
  const confidence = Math.min(RULE_CAP, Math.round(share * best.score * 100) / 100);
  const art = articulationFromSound(m, best.family);
  return {
    family: best.family,
    articulation: art.articulation,
    confidence,
    reasons: [describeSound(m), `rules of thumb: ${best.family} fits best (${best.score.toFixed(2)}), next ${scores[1]!.family} (${scores[1]!.score.toFixed(2)})`, art.reason],
    source: "rules",
    alternatives: scores.slice(1, 4),
    familyScores: Object.fromEntries(scores.map((x) => [x.family, Math.round(x.score * 1000) / 1000])),
  };
}

// ---------------------------------------------------------------------------------------------------------------
// The trained model (sound-model.ts), explained in the rules' words

/** The sound in a drummer's words: "decay 1.9 s, bright, noisy" (bands: common practice, no published source). */
export function soundInWords(m: Measurement): string {
  const f = feat(m);
  const bright = f.sc < 800 ? "dark" : f.sc < 2500 ? "warm" : f.sc < 6000 ? "bright" : "very bright";
  const noise = f.bf < 0.06 ? "tonal" : f.bf < 0.25 ? "some noise" : "noisy";
  const parts = [`decay ${fmtS(f.decay)}`, bright, noise];
  if (f.pitch !== null && f.bf < 0.25) parts.push(`pitch ${fmtHz(f.pitch)}`);
  return parts.join(", ");
}

/** What of the sound fits a family's rules of thumb, in words ("decay fits a hi-hat; spectrum fits a hi-hat"). */
function fitWords(m: Measurement, family: Family): string | null {
  if (family === "other") return null;
  const f = feat(m);
  const words: Record<Key, string> = { decay: "decay", sc: "brightness", bc: "body colour", sf: "strike noise", bf: "body noise", pitch: "pitch", attack: "attack", rolloff: "top end" };
  const good = RULES[family].filter((r) => membership(f, r) > 0.6).map((r) => words[r[0]]);
  const bad = RULES[family].filter((r) => membership(f, r) < 0.1).map((r) => words[r[0]]);
  const out: string[] = [];
  if (good.length) out.push(`${[...new Set(good)].join(", ")} as expected of ${aFamily(family)}`);
  if (bad.length) out.push(`unusual ${[...new Set(bad)].join(", ")} for ${aFamily(family)}`);
  return out.length ? out.join("; ") : null;
}


/** A family in running text: "a hi-hat", "a hand drum", "an other sound". */
function aFamily(f: Family): string {
  if (f === "other") return "another kind of percussion";
  const w = familyWords(f);
  return `${/^[aeiou]/.test(w) ? "an" : "a"} ${w}`;
}

/**
 * Family and articulation from the trained sound model. The confidence is calibrated on held-out recordings;
 * the articulation comes from the model's stroke forest where it has one for the family, else from the rules
 * of thumb. The reasons stay in plain words: the sound, the model's choice with its runner-up, and what of the
 * sound fits (or not) the family's rules of thumb.
 */
export function suggestByModel(m: Measurement, model: SoundModel): SoundSuggestion {
  const x = soundFeatures(m);
  const p = predictSound(model, x, (family, a) => FAMILY_ARTICULATIONS[family].includes(a));
  const ranked = (Object.entries(p.familyVotes) as [Family, number][]).sort((a, b) => b[1] - a[1]);
  const next = ranked[1];
  const rulesArt = articulationFromSound(m, p.family);
  const articulation = p.articulation ?? rulesArt.articulation;
  const reasons = [
    soundInWords(m),
    `sounds most like ${aFamily(p.family)}${next ? `; next: ${aFamily(next[0])}` : ""} (trained on real recordings; right ${formatConfidence(p.confidence)} of the time at this certainty)`,
  ];
  const fit = fitWords(m, p.family);
  if (fit) reasons.push(fit);
  reasons.push(p.articulation && p.articulation !== rulesArt.articulation ? `${articulation}: the stroke its sound is most like` : rulesArt.reason);
  return {
    family: p.family,
    articulation,
    confidence: p.confidence,
    reasons,
    source: "model",
    alternatives: ranked.slice(1, 4).map(([family, score]) => ({ family, score: Math.round(score * 100) / 100 })),
    familyScores: Object.fromEntries(ranked.map(([f, v]) => [f, Math.round(v * 1000) / 1000])),
  };
}

// ---------------------------------------------------------------------------------------------------------------
// Learning from confirmed labels: k nearest neighbours over standardised features, within one studio

export interface LabelledExample {
  features: number[];
  family: Family;
  articulation: Articulation;
}

export interface LabelModel {
  standardiser: Standardiser;
  rows: { z: number[]; family: Family; articulation: Articulation }[];
  familyCounts: Partial<Record<Family, number>>;
  /** Families with at least minPerFamily confirmed labels: only these are learned. */
  learned: Family[];
  k: number;
  minPerFamily: number;
  /** Median distance of a learned example to its nearest learned neighbour (the model's scale). */
  typicalDistance: number;
}

export function buildLabelModel(labelled: LabelledExample[], opts: { k?: number; minPerFamily?: number } = {}): LabelModel {
  const minPerFamily = opts.minPerFamily ?? 3;
  const good = labelled.filter((l) => l.features.some((x) => Number.isFinite(x)));
  const standardiser = fitStandardiser(good.map((l) => l.features));
  const rows = good.map((l) => ({ z: standardise(l.features, standardiser), family: l.family, articulation: l.articulation }));
  const familyCounts: Partial<Record<Family, number>> = {};
  for (const r of rows) familyCounts[r.family] = (familyCounts[r.family] ?? 0) + 1;
  const learned = (Object.keys(familyCounts) as Family[]).filter((f) => familyCounts[f]! >= minPerFamily).sort();
  const lr = rows.filter((r) => learned.includes(r.family));
  const nn = lr.map((r, i) => Math.min(...lr.filter((_, j) => j !== i).map((o) => distance(r.z, o.z)))).filter((d) => Number.isFinite(d)).sort((a, b) => a - b);
  const typicalDistance = nn.length ? Math.max(0.25, nn[Math.floor(nn.length / 2)]!) : 1;
  const k = opts.k ?? Math.max(1, Math.min(7, Math.round(Math.sqrt(lr.length))));
  return { standardiser, rows, familyCounts, learned, k, minPerFamily, typicalDistance };
}

export interface SuggestOptions {
  /** The trained sound model; null uses the rules of thumb instead. Default: the committed model. */
  soundModel?: SoundModel | null;
  /**
   * A key that names this measurement for good (sample id + content hash + measure version): the model's answer
   * is then kept, so a library catalogued again and again asks the forests once per sample.
   */
  cacheKey?: string;
}

/** Model answers by cacheKey and model version; bounded (oldest dropped first). */
const modelAnswers = new Map<string, SoundSuggestion>();
const MODEL_ANSWERS_MAX = 200_000;

function cachedByModel(m: Measurement, model: SoundModel, key: string | undefined): SoundSuggestion {
  if (!key) return suggestByModel(m, model);
  const k = `${model.version}|${key}`;
  let s = modelAnswers.get(k);
  if (!s) {
    s = suggestByModel(m, model);
    if (modelAnswers.size >= MODEL_ANSWERS_MAX) modelAnswers.delete(modelAnswers.keys().next().value!);
    modelAnswers.set(k, s);
  }
  return { ...s, reasons: [...s.reasons], alternatives: [...s.alternatives], familyScores: { ...s.familyScores } };
}

/**
 * Family + articulation suggestion for a measured sample. Without confirmed labels (or with no family learned
 * yet) it uses the trained sound model (or, with soundModel: null, the rules of thumb); with confirmed labels it
 * votes among the nearest confirmed samples, unless the base suggestion points to a family with too few
 * confirmed labels and the sample is far from everything confirmed.
 */
export function suggestFromSound(m: Measurement, model?: LabelModel, opts: SuggestOptions = {}): SoundSuggestion {
  const soundModel = opts.soundModel === undefined ? trainedSoundModel() : opts.soundModel;
  const rules = soundModel ? cachedByModel(m, soundModel, opts.cacheKey) : suggestByRules(m);
  if (!model || model.learned.length === 0) {
    if (model) rules.reasons.push(`not enough confirmed labels yet (${model.minPerFamily} per family needed)`);
    return rules;
  }
  const z = standardise(featureVector(m), model.standardiser);
  const neighbours = model.rows
    .filter((r) => model.learned.includes(r.family))
    .map((r) => ({ r, d: distance(z, r.z) }))
    .sort((a, b) => a.d - b.d)
    .slice(0, model.k);
  const votes = new Map<Family, number>();
  let total = 0;
  for (const { r, d } of neighbours) {
    const w = 1 / (d + 0.1 * model.typicalDistance);
    votes.set(r.family, (votes.get(r.family) ?? 0) + w);
    total += w;
  }
  const ranked = [...votes.entries()].sort((a, b) => b[1] - a[1]);
  const [family, vote] = ranked[0]!;
  const share = vote / total;
  const nearest = neighbours[0]!.d;
  const far = nearest > 2.5 * model.typicalDistance;

  if (!model.learned.includes(rules.family) && rules.confidence >= 0.3 && (far || share < 0.5)) {
    rules.reasons.push(`${rules.family} has too few confirmed labels (${model.familyCounts[rules.family] ?? 0}); ${rules.source === "model" ? "the trained model" : "rules of thumb"} used`);
    return rules;
  }
  const closeness = Math.exp(-Math.max(0, nearest / model.typicalDistance - 1) / 2);
  const confidence = Math.min(0.97, Math.round(share * closeness * 100) / 100);
  const artVotes = new Map<Articulation, number>();
  for (const { r, d } of neighbours) {
    if (r.family !== family) continue;
    artVotes.set(r.articulation, (artVotes.get(r.articulation) ?? 0) + 1 / (d + 0.1 * model.typicalDistance));
  }
  const articulation = [...artVotes.entries()].sort((a, b) => b[1] - a[1])[0]![0];
  const same = neighbours.filter((n) => n.r.family === family).length;
  return {
    family,
    articulation,
    confidence,
    reasons: [
      describeSound(m),
      `${same} of the ${neighbours.length} nearest confirmed samples are ${family}${far ? " (but none is close)" : ""}`,
    ],
    source: "labels",
    alternatives: ranked.slice(1).map(([f, v]) => ({ family: f, score: Math.round((v / total) * 100) / 100 })),
    familyScores: Object.fromEntries(ranked.map(([f, v]) => [f, Math.round((v / total) * 1000) / 1000])),
  };
}

// ---------------------------------------------------------------------------------------------------------------
// Name versus sound

/** Families that sound alike, so a disagreement among them is mild (common practice). */
const SOUND_GROUPS: Family[][] = [
  ["crash", "ride", "china", "splash", "stack"],
  ["hi-hat", "stack", "splash", "shaker"],
  ["tom", "hand-drum", "kick"],
  ["snare", "hand-drum", "other"],
  ["cowbell", "other"],
];

export interface NameSoundConflict {
  level: "none" | "mild" | "strong";
  message: string;
}

/**
 * Flags a sample whose name and sound disagree. Strong when the families are unlike and either the named family
 * fits the sound badly (its score at most 0.6 and at least 0.3 below the best, when scores are given) or,
 * without scores, the sound is confident (>= 0.6 by default). Otherwise mild.
 */
/**
 * Features of a measurement that lie grossly outside a family's band (membership below 0.01: about two band
 * widths out, e.g. a 4 s ring on a "snare" whose rule allows up to 1 s, or a 780 Hz fundamental on a drum whose
 * rule stops at 330 Hz). Two or more such features mean the sound cannot be that family, however well the
 * remaining features fit (the averaged score hides this). Rules of thumb, common practice, no published source.
 */
export function grossMisfits(m: Measurement, family: Family): string[] {
  if (family === "other") return [];
  const f = feat(m);
  return RULES[family].filter((r) => membership(f, r) < 0.01).map((r) => r[0]);
}

export function nameSoundConflict(
  name: { family: Family | null; articulation?: Stroke | null },
  sound: Pick<SoundSuggestion, "family" | "articulation" | "confidence" | "reasons"> & { familyScores?: Partial<Record<Family, number>> },
  opts: { minConfidence?: number; measurement?: Measurement } = {},
): NameSoundConflict {
  const minConf = opts.minConfidence ?? 0.6;
  if (!name.family) return { level: "none", message: "" };
  if (name.family !== sound.family) {
    // a cross-stick or rim click is a short woody click with a mid-range peak: it resembles a cowbell or block
    const click = (name.articulation === "cross-stick" || name.articulation === "rim-click") && (sound.family === "cowbell" || sound.family === "other");
    const alike = click || SOUND_GROUPS.some((g) => g.includes(name.family!) && g.includes(sound.family));
    let sure = sound.confidence >= minConf;
    if (sound.familyScores) {
      const best = sound.familyScores[sound.family] ?? 0;
      const fit = sound.familyScores[name.family] ?? 0;
      sure = fit <= 0.6 && best - fit >= 0.3;
    }
    // the named family is physically ruled out by two or more features: strong whatever the averages say
    if (opts.measurement && grossMisfits(opts.measurement, name.family).length >= 2) sure = true;
    const level = !alike && sure ? "strong" : "mild";
    return {
      level,
      message: `Named ${name.family} but sounds like ${sound.family} (${formatConfidence(sound.confidence)} sure; ${sound.reasons[0] ?? ""}).`,
    };
  }
  if (name.articulation && sound.articulation !== name.articulation && sound.confidence >= minConf) {
    return { level: "mild", message: `Named ${name.articulation} but sounds like ${sound.articulation} (${sound.reasons[0] ?? ""}).` };
  }
  return { level: "none", message: "" };
}
