// Grouped cross-validation of the sound model: the recordings (groups) are dealt into folds; each fold is
// judged by a model trained on the other folds only, so a recording and its copies (stereo halves, velocity
// layers, transpositions, augmentations) never sit on both sides (Livshin & Rodet, ISMIR 2003: cross-validation
// inside one collection overstates accuracy when copies leak). Pure computation over measured rows.

import { createHash } from "node:crypto";
import { linearRegression, mean } from "simple-statistics";
import { calibrate, calibrationTable, predictSound, trainSoundModel, type CalibrationTable, type ForestOptions } from "../../lib/catalogue/sound-model";
import type { Row } from "./dataset";

export interface Prediction {
  row: Row;
  fold: number;
  family: string;
  familyShare: number;
  articulation: string | null;
  articulationShare: number;
}

export function foldOf(group: string, folds: number): number {
  return createHash("sha256").update(group).digest().readUInt32LE(0) % folds;
}

/** Held-out predictions for every un-augmented row of `judged`, training on `train` rows of the other folds. */
export function crossValidate(judged: Row[], train: Row[], opts: { folds?: number; forest?: ForestOptions; progress?: (msg: string) => void } = {}): Prediction[] {
  const folds = opts.folds ?? 5;
  const out: Prediction[] = [];
  for (let k = 0; k < folds; k++) {
    const trainRows = train.filter((r) => foldOf(r.group, folds) !== k);
    const test = judged.filter((r) => r.augmentation === "" && foldOf(r.group, folds) === k);
    if (!test.length) continue;
    opts.progress?.(`fold ${k + 1}/${folds}: training on ${trainRows.length} rows, judging ${test.length}`);
    const model = trainSoundModel(trainRows, opts.forest);
    for (const r of test) {
      const p = predictSound(model, r.features);
      out.push({ row: r, fold: k, family: p.family, familyShare: p.familyShare, articulation: p.articulation, articulationShare: p.familyShare * p.articulationShare });
    }
  }
  return out;
}

/**
 * The corpus rows of a share of its recordings, the learning curve's training data: a recording is kept whole (its
 * files, copies and augmentations) when a hash of its name and the seed falls under the share, so each seed draws
 * another subset and a larger share keeps every recording a smaller one kept.
 */
export function recordingShare<T extends { group: string }>(rows: T[], share: number, seed: number): T[] {
  const u = (g: string) => createHash("sha256").update(`${seed}|${g}`).digest().readUInt32LE(0) / 2 ** 32;
  return rows.filter((r) => u(r.group) < share);
}

/**
 * A learning curve's power law, error = a * n^-b (n: real recordings trained on), fitted by least squares on
 * log(error) against log(n), the usual form of a learning curve (Cortes et al., "Learning curves: asymptotic values
 * and rate of convergence", NIPS 1993; Hestness et al., "Deep learning scaling is predictable, empirically", 2017).
 * recordingsFor(e) inverts it: the recordings at which the fitted error reaches e.
 */
export function powerLawFit(points: { n: number; error: number }[]): { a: number; b: number; recordingsFor: (error: number) => number } {
  const usable = points.filter((p) => p.n > 0 && p.error > 0);
  if (usable.length < 2) throw new Error("a power law needs two points with recordings and errors above zero");
  const { m, b: c } = linearRegression(usable.map((p) => [Math.log(p.n), Math.log(p.error)]));
  const a = Math.exp(c);
  const b = -m;
  return { a, b, recordingsFor: (error: number) => (a / error) ** (1 / b) };
}

/** One share of a learning curve: the recordings a fold trained on (mean) and the accuracy per forest seed. */
export interface CurvePoint {
  n: number;
  family: number[];
  stroke: number[];
}

/**
 * The learning curve as an SVG plot: accuracy against the real recordings trained on (log scale), each seed a dot,
 * the mean a line, the fitted power law dashed out to `upTo` recordings, the targets as dotted rules; 40 to 100 %.
 */
export function learningCurveSvg(points: CurvePoint[], fits: { family: { a: number; b: number }; stroke: { a: number; b: number } }, targets = { family: 0.95, stroke: 0.85 }, upTo = 1000): string {
  const W = 640, H = 400, L = 56, R = 150, T = 24, B = 48;
  const nMin = 10;
  const x = (n: number) => L + ((Math.log10(Math.max(n, nMin)) - 1) / (Math.log10(upTo) - 1)) * (W - L - R);
  const y = (acc: number) => T + ((1 - acc) / 0.6) * (H - T - B); // 40 % to 100 %
  const used = points.filter((p) => p.n > 0);
  const series = [
    { key: "family" as const, colour: "#2563eb", label: "family" },
    { key: "stroke" as const, colour: "#d97706", label: "stroke" },
  ];
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" font-family="sans-serif" font-size="12">`,
    `<rect width="${W}" height="${H}" fill="#ffffff"/>`,
  ];
  for (const acc of [0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1]) out.push(`<line x1="${L}" x2="${W - R}" y1="${y(acc)}" y2="${y(acc)}" stroke="#e5e7eb"/><text x="${L - 6}" y="${y(acc) + 4}" text-anchor="end" fill="#374151">${Math.round(acc * 100)} %</text>`);
  for (const n of [10, 20, 50, 100, 200, 500, 1000].filter((n) => n <= upTo)) out.push(`<line x1="${x(n)}" x2="${x(n)}" y1="${T}" y2="${H - B}" stroke="#e5e7eb"/><text x="${x(n)}" y="${H - B + 16}" text-anchor="middle" fill="#374151">${n}</text>`);
  out.push(`<text x="${(L + W - R) / 2}" y="${H - 10}" text-anchor="middle" fill="#111827">real recordings trained on (log scale)</text>`);
  out.push(`<text x="14" y="${(T + H - B) / 2}" transform="rotate(-90 14 ${(T + H - B) / 2})" text-anchor="middle" fill="#111827">held-out accuracy</text>`);
  for (const s of series) {
    const t = targets[s.key];
    out.push(`<line x1="${L}" x2="${W - R}" y1="${y(t)}" y2="${y(t)}" stroke="${s.colour}" stroke-width="1" stroke-dasharray="2 3"/><text x="${W - R + 6}" y="${y(t) + 4}" fill="${s.colour}">${s.label} target ${Math.round(t * 100)} %</text>`);
    const fit = fits[s.key];
    const curve = Array.from({ length: 41 }, (_, i) => used[0]!.n * (upTo / used[0]!.n) ** (i / 40)).map((n) => `${x(n).toFixed(1)},${y(1 - fit.a * n ** -fit.b).toFixed(1)}`);
    out.push(`<polyline points="${curve.join(" ")}" fill="none" stroke="${s.colour}" stroke-dasharray="6 4"/>`);
    out.push(`<polyline points="${used.map((p) => `${x(p.n).toFixed(1)},${y(mean(p[s.key])).toFixed(1)}`).join(" ")}" fill="none" stroke="${s.colour}" stroke-width="2"/>`);
    for (const p of used) for (const v of p[s.key]) out.push(`<circle cx="${x(p.n).toFixed(1)}" cy="${y(v).toFixed(1)}" r="2.5" fill="${s.colour}" fill-opacity="0.5"/>`);
    const last = used[used.length - 1]!;
    out.push(`<text x="${x(last.n) + 8}" y="${y(mean(last[s.key])) + (s.key === "family" ? -6 : 14)}" fill="${s.colour}">${s.label} ${(100 * mean(last[s.key])).toFixed(1)} %</text>`);
  }
  const ly = y(0.55);
  out.push(`<text x="${W - R + 6}" y="${ly}" fill="#374151">solid: measured (mean;</text><text x="${W - R + 6}" y="${ly + 14}" fill="#374151">dots: forest seeds)</text><text x="${W - R + 6}" y="${ly + 32}" fill="#374151">dashed: power law</text>`);
  out.push("</svg>");
  return out.join("\n");
}

/** Keys whose stroke the targets judge: snare (centre, cross-stick), hi-hat (closed, pedal, open), cymbals. */
export const ARTICULATION_KEYS = new Set([37, 38, 40, 42, 44, 46, 49, 51, 52, 53, 55, 57, 59]);

export interface Report {
  n: number;
  familyAccuracy: number;
  articulationN: number;
  articulationAccuracy: number;
  confusion: { labels: string[]; matrix: number[][] };
  recall: { label: string; n: number; recall: number }[];
  articulationRecall: { label: string; n: number; recall: number }[];
  familyCalibration: CalibrationTable;
  articulationCalibration: CalibrationTable;
  /** of the predictions with a calibrated confidence of at least 0.9 (or raw share), how many were right */
  wrong: Prediction[];
}

export function report(preds: Prediction[], articulationJudged: (p: Prediction) => boolean): Report {
  const labels = [...new Set(preds.flatMap((p) => [p.row.family, p.family]))].sort();
  const matrix = labels.map(() => labels.map(() => 0));
  for (const p of preds) matrix[labels.indexOf(p.row.family)]![labels.indexOf(p.family)]!++;
  const right = preds.filter((p) => p.family === p.row.family);
  const artPreds = preds.filter((p) => p.row.articulation && articulationJudged(p));
  const artRight = artPreds.filter((p) => p.family === p.row.family && p.articulation === p.row.articulation);
  const recallOf = (ps: Prediction[], key: (p: Prediction) => string, ok: (p: Prediction) => boolean) =>
    [...new Set(ps.map(key))].sort().map((label) => {
      const mine = ps.filter((p) => key(p) === label);
      return { label, n: mine.length, recall: mine.filter(ok).length / mine.length };
    });
  return {
    n: preds.length,
    familyAccuracy: right.length / preds.length,
    articulationN: artPreds.length,
    articulationAccuracy: artPreds.length ? artRight.length / artPreds.length : NaN,
    confusion: { labels, matrix },
    recall: recallOf(preds, (p) => p.row.family, (p) => p.family === p.row.family),
    articulationRecall: recallOf(artPreds, (p) => `${p.row.family} ${p.row.articulation}`, (p) => p.family === p.row.family && p.articulation === p.row.articulation),
    familyCalibration: calibrationTable(familyPairs(preds)),
    articulationCalibration: calibrationTable(artPreds.map((p) => ({ share: p.articulationShare, right: p.family === p.row.family && p.articulation === p.row.articulation }))),
    wrong: preds.filter((p) => p.family !== p.row.family),
  };
}

/** Each prediction's family vote share and whether the family was right: what a family calibration table reads. */
export function familyPairs(preds: Prediction[]): { share: number; right: boolean }[] {
  return preds.map((p) => ({ share: p.familyShare, right: p.family === p.row.family }));
}

/** The out-of-fold calibration check (outOfFoldCalibration): per bin of the confidence shown, and summed up. */
export interface CalibrationCheck {
  bins: { upTo: number; n: number; meanConfidence: number; right: number }[];
  ece: number;
  worstGap: number;
  minBin: number;
}

/**
 * The confidence shown, checked out of fold: each fold's real-recording predictions get the confidence of a
 * calibration table made from the other folds' held-out predictions only (corpus and generator, as the committed
 * model's table is made), then the confidences shown are compared with how often they were right. Binned by the
 * confidence shown (tenths); the expected calibration error (ECE: the file-weighted mean gap, Naeini, Cooper &
 * Hauskrecht, AAAI 2015) and the largest gap in a bin of at least `minBin` files.
 */
export function outOfFoldCalibration(judged: Prediction[], calibrateFrom: Prediction[], minBin = 10): CalibrationCheck {
  const shown: { c: number; right: boolean }[] = [];
  for (const fold of [...new Set(judged.map((p) => p.fold))]) {
    const table = calibrationTable(familyPairs(calibrateFrom.filter((p) => p.fold !== fold)));
    for (const { share, right } of familyPairs(judged.filter((x) => x.fold === fold))) shown.push({ c: calibrate(table, share), right });
  }
  const bins = Array.from({ length: 10 }, (_, i) => ({ upTo: (i + 1) / 10, n: 0, sum: 0, right: 0 }));
  for (const x of shown) {
    const b = bins[Math.min(9, Math.max(0, Math.ceil(x.c * 10 - 1e-9) - 1))]!;
    b.n++;
    b.sum += x.c;
    if (x.right) b.right++;
  }
  const used = bins.filter((b) => b.n > 0).map((b) => ({ upTo: b.upTo, n: b.n, meanConfidence: b.sum / b.n, right: b.right / b.n }));
  const total = shown.length || 1;
  const ece = used.reduce((a, b) => a + (b.n / total) * Math.abs(b.meanConfidence - b.right), 0);
  const worstGap = Math.max(0, ...used.filter((b) => b.n >= minBin).map((b) => Math.abs(b.meanConfidence - b.right)));
  return { bins: used, ece, worstGap, minBin };
}

export function formatCalibrationCheck(c: CalibrationCheck): string {
  const lines = [
    "Confidence shown, checked out of fold (each fold's files get a calibration made without them): of the files shown a confidence in a bin, how many were right",
    "",
    "| confidence up to | files | mean confidence shown | right |",
    "|---:|---:|---:|---:|",
  ];
  for (const b of c.bins) lines.push(`| ${b.upTo.toFixed(1)} | ${b.n} | ${pct(b.meanConfidence)} | ${pct(b.right)} |`);
  lines.push("", `Expected calibration error ${pct(c.ece)}; largest gap in a bin of ${c.minBin} files or more: ${pct(c.worstGap)}.`);
  return lines.join("\n");
}

const pct = (x: number) => `${(100 * x).toFixed(1)} %`;

export function formatReport(title: string, r: Report): string {
  const lines: string[] = [`### ${title}`, "", `Family: **${pct(r.familyAccuracy)}** of ${r.n} files. Articulation (judged keys): **${pct(r.articulationAccuracy)}** of ${r.articulationN}.`, ""];
  lines.push("Confusion (rows: truth, columns: predicted)", "", `| truth \\ predicted | ${r.confusion.labels.join(" | ")} | recall |`, `|---|${r.confusion.labels.map(() => "---:").join("|")}|---:|`);
  r.confusion.labels.forEach((l, i) => {
    const rec = r.recall.find((x) => x.label === l);
    lines.push(`| ${l} | ${r.confusion.matrix[i]!.map((v) => (v ? String(v) : "·")).join(" | ")} | ${rec ? pct(rec.recall) : ""} |`);
  });
  lines.push("", "Articulation recall", "", "| stroke | files | recall |", "|---|---:|---:|");
  for (const a of r.articulationRecall) lines.push(`| ${a.label} | ${a.n} | ${pct(a.recall)} |`);
  lines.push("", "Calibration (family): of the predictions whose vote share falls in a bin, how many were right", "", "| vote share up to | files | right |", "|---:|---:|---:|");
  r.familyCalibration.edges.forEach((e, i) => {
    if (r.familyCalibration.counts[i]) lines.push(`| ${e.toFixed(2)} | ${r.familyCalibration.counts[i]} | ${pct(r.familyCalibration.accuracy[i]!)} |`);
  });
  return lines.join("\n");
}
