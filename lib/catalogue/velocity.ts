// Velocity curves: how loud a MIDI velocity should sound, and from that, which velocities each recorded layer answers.
//
// - DLS (MMA Downloadable Sounds Level 1) default curve: attenuation = 40 log10(127 / v) dB, i.e. gain (v/127)^2
//   (the "square law"). Used as stated: the loudest layer answers v = 127 and each softer layer sits at the
//   velocity whose attenuation equals its measured distance (in dB of strike loudness) below the loudest layer.
// - Dannenberg, "The Interpretation of MIDI Velocity", ICMC 2006: RMS amplitude = (m v + b)^2 with
//   b = 127 / (126 sqrt(r)) - 1/126, m = (1 - b) / 127, r = 10^(range_dB / 20). v = 127 gives 0 dB and v = 1 gives
//   -range_dB. Without a stated range it is mapped over the group's measured dynamic range (softest layer at v = 1).

export type VelocityCurve = { kind: "dls" } | { kind: "dannenberg"; rangeDb?: number };

export const DLS: VelocityCurve = { kind: "dls" };

/** DLS Level 1 default curve: attenuation in dB (>= 0) at velocity v (1..127). */
export function dlsAttenuationDb(v: number): number {
  return 40 * Math.log10(127 / v);
}

/** Coefficients of the Dannenberg (ICMC 2006) curve for a dynamic range in dB. */
export function dannenbergCoefficients(rangeDb: number): { m: number; b: number } {
  const r = Math.pow(10, rangeDb / 20);
  const b = 127 / (126 * Math.sqrt(r)) - 1 / 126;
  const m = (1 - b) / 127;
  return { m, b };
}

/** Dannenberg (ICMC 2006) level in dB (<= 0) at velocity v for a range in dB: 20 log10((m v + b)^2). */
export function dannenbergGainDb(v: number, rangeDb: number): number {
  const { m, b } = dannenbergCoefficients(rangeDb);
  return 40 * Math.log10(m * v + b);
}

/** Attenuation in dB below v = 127 for a curve (range given for Dannenberg when the curve does not state one). */
export function curveAttenuationDb(curve: VelocityCurve, v: number, measuredRangeDb = 60): number {
  if (curve.kind === "dls") return dlsAttenuationDb(v);
  return -dannenbergGainDb(v, curve.rangeDb ?? measuredRangeDb);
}

/** Inverse of the curve: the (real) velocity whose attenuation is `db`, clamped to 1..127. */
export function velocityForAttenuation(curve: VelocityCurve, db: number, measuredRangeDb = 60): number {
  const a = Math.max(0, db);
  let v: number;
  if (curve.kind === "dls") {
    v = 127 * Math.pow(10, -a / 40);
  } else {
    const { m, b } = dannenbergCoefficients(curve.rangeDb ?? measuredRangeDb);
    // (m v + b)^2 = 10^(-a/20)  ->  v = (10^(-a/40) - b) / m
    v = (Math.pow(10, -a / 40) - b) / m;
  }
  return Math.min(127, Math.max(1, v));
}

export interface VelocityRange {
  velocityLow: number;
  velocityHigh: number;
  /** The velocity at which the curve's level equals this layer's measured level. */
  nominalVelocity: number;
}

/**
 * Velocity ranges for layers given their strike loudness (any order of input; output in the same order as the
 * input sorted softest first). The loudest layer answers up to 127; boundaries lie where the curve's level
 * is halfway (in dB) between two neighbouring layers. Ranges cover 1..127 with no gaps or overlaps, and each
 * layer gets at least one velocity (at most 127 layers).
 */
export function velocityRanges(layerLoudnessSoftFirst: number[], curve: VelocityCurve = DLS): VelocityRange[] {
  const k = layerLoudnessSoftFirst.length;
  if (k === 0) return [];
  if (k > 127) throw new Error(`cannot spread ${k} layers over 127 velocities`);
  for (let i = 1; i < k; i++) {
    if (!(layerLoudnessSoftFirst[i]! >= layerLoudnessSoftFirst[i - 1]!)) throw new Error("layer loudness must be sorted softest first");
  }
  const loudest = layerLoudnessSoftFirst[k - 1]!;
  const range = loudest - layerLoudnessSoftFirst[0]!;
  const measured = range > 0 ? range : 60;
  const att = layerLoudnessSoftFirst.map((l) => loudest - l);
  const nominal = att.map((a) => velocityForAttenuation(curve, a, measured));
  // upper boundary of layer i (integers), strictly increasing, leaving room for the layers above
  const highs: number[] = [];
  for (let i = 0; i < k - 1; i++) {
    const mid = (att[i]! + att[i + 1]!) / 2;
    let h = Math.floor(velocityForAttenuation(curve, mid, measured));
    const min = i === 0 ? 1 : highs[i - 1]! + 1;
    const max = 127 - (k - 1 - i);
    h = Math.min(max, Math.max(min, h));
    highs.push(h);
  }
  highs.push(127);
  return highs.map((h, i) => ({
    velocityLow: i === 0 ? 1 : highs[i - 1]! + 1,
    velocityHigh: h,
    nominalVelocity: Math.round(nominal[i]! * 10) / 10,
  }));
}
