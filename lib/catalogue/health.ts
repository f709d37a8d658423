// Library health: defects of files and of the way a library is layered, each with the samples it concerns and a
// plain-words explanation. Thresholds are common practice of sample library editing (no published source) unless
// a standard is named.

import { SILENCE_DB } from "../audio/levels";
import type { Measurement } from "../audio/types";
import type { NameSoundConflict } from "./classify";
import type { LayerIssue } from "./layers";

export type HealthCode =
  | "mixed-sample-rate"
  | "mixed-bit-depth"
  | "mixed-channels"
  | "duplicate"
  | "clipping"
  | "true-peak-over"
  | "dc-offset"
  | "late-onset"
  | "cut-tail"
  | "truncated"
  | "layer-order"
  | "uneven-layers"
  | "thin-round-robins"
  | "missing-layer"
  | "name-sound-conflict"
  | "mic-offset"
  | "mic-polarity"
  | "mic-missing";

export type Severity = "error" | "warning" | "info";

export interface HealthFinding {
  code: HealthCode;
  severity: Severity;
  sampleIds: string[];
  message: string;
}

export interface HealthSample {
  id: string;
  path?: string;
  sha256?: string;
  measurement: Measurement;
  /** Microphone position from the name: distant mics (room, overhead, ambient, far) hear the hit later. */
  mic?: string | null;
}

/** Microphones set back from the kit. Sound travels about 0.34 m per ms, so a room mic 10 m away hears the hit
 * about 29 ms after the close mics; trimming every mic with the same offset keeps that delay (common practice). */
const DISTANT_MICS = new Set(["room", "overhead", "ambient", "far"]);
const DISTANT_EXTRA_MS = 30;

export interface HealthOptions {
  /** Leading silence above which an onset is late (ms). Default 10. */
  lateOnsetMs?: number;
  /** |DC offset| (full scale) above which it is reported. Default 0.003 (about -50 dBFS). */
  dcOffset?: number;
  /** True peak above which a file is reported (dBTP, BS.1770-4 Annex 2). Default 0. */
  truePeakDbtp?: number;
}

const SEVERITY: Record<HealthCode, Severity> = {
  "mixed-sample-rate": "warning",
  "mixed-bit-depth": "warning",
  "mixed-channels": "warning",
  duplicate: "warning",
  clipping: "error",
  "true-peak-over": "warning",
  "dc-offset": "warning",
  "late-onset": "warning",
  "cut-tail": "warning",
  truncated: "error",
  "layer-order": "warning",
  "uneven-layers": "info",
  "thin-round-robins": "info",
  "missing-layer": "warning",
  "name-sound-conflict": "warning",
  "mic-offset": "warning",
  "mic-polarity": "warning",
  "mic-missing": "warning",
};

export function severityOf(code: HealthCode): Severity {
  return SEVERITY[code];
}

const name = (s: HealthSample) => s.path ?? s.id;
const r1 = (x: number) => Math.round(x * 10) / 10;

function mixed(
  samples: HealthSample[],
  code: HealthCode,
  value: (m: Measurement) => number,
  label: (v: number) => string,
  why: string,
): HealthFinding | null {
  const by = new Map<number, HealthSample[]>();
  for (const s of samples) {
    const v = value(s.measurement);
    const list = by.get(v) ?? [];
    list.push(s);
    by.set(v, list);
  }
  if (by.size < 2) return null;
  const groups = [...by.entries()].sort((a, b) => b[1].length - a[1].length || a[0] - b[0]);
  const minority = groups.slice(1).flatMap(([, l]) => l.map((s) => s.id)).sort();
  const parts = groups.map(([v, l]) => `${l.length} at ${label(v)}`).join(", ");
  return { code, severity: SEVERITY[code], sampleIds: minority, message: `Mixed ${why}: ${parts}; the files listed differ from the majority (${label(groups[0]![0])}).` };
}

/** File-level findings: format mixes across the library, duplicates, and per-file defects. */
export function fileHealth(samples: HealthSample[], opts: HealthOptions = {}): HealthFinding[] {
  const lateMs = opts.lateOnsetMs ?? 10;
  const dcMax = opts.dcOffset ?? 0.003;
  const tpMax = opts.truePeakDbtp ?? 0;
  const out: HealthFinding[] = [];

  const rate = mixed(samples, "mixed-sample-rate", (m) => m.format.sampleRate, (v) => `${v / 1000} kHz`, "sample rates (a kit plays best at one rate; 44.1 kHz is the most common delivery, 48 kHz for video: common practice)");
  const bits = mixed(samples, "mixed-bit-depth", (m) => m.format.validBits * (m.format.encoding === "float" ? -1 : 1), (v) => (v < 0 ? `${-v}-bit float` : `${v}-bit`), "bit depths (24-bit is the usual delivery: common practice)");
  const ch = mixed(samples, "mixed-channels", (m) => m.format.channels, (v) => (v === 1 ? "mono" : v === 2 ? "stereo" : `${v} channels`), "channel counts (mono and stereo files of one kit pan and sum differently)");
  for (const f of [rate, bits, ch]) if (f) out.push(f);

  const byHash = new Map<string, HealthSample[]>();
  for (const s of samples) {
    if (!s.sha256) continue;
    const l = byHash.get(s.sha256) ?? [];
    l.push(s);
    byHash.set(s.sha256, l);
  }
  for (const [, l] of [...byHash.entries()].sort((a, b) => a[0].localeCompare(b[0]))) {
    if (l.length < 2) continue;
    out.push({
      code: "duplicate",
      severity: SEVERITY.duplicate,
      sampleIds: l.map((s) => s.id).sort(),
      message: `Identical files (same SHA-256): ${l.map(name).sort().join(", ")}. A copy used as a round robin repeats exactly.`,
    });
  }

  for (const s of samples) {
    const m = s.measurement;
    const one = (code: HealthCode, message: string) => out.push({ code, severity: SEVERITY[code], sampleIds: [s.id], message: `${name(s)}: ${message}` });
    if (m.truncated) one("truncated", "the data chunk is shorter than its header says; the file was cut short when written or copied.");
    if (m.clippedRuns > 0) {
      one("clipping", `clipped: ${m.clippedRuns} run${m.clippedRuns > 1 ? "s" : ""} of 3 or more full-scale samples (${m.clippedSamples} samples). Re-record or re-export with headroom.`);
    }
    if (m.truePeakDbtp > tpMax) {
      one("true-peak-over", `true peak ${r1(m.truePeakDbtp)} dBTP is above ${tpMax} dBTP (ITU-R BS.1770-4 Annex 2): converters and lossy encoders will clip it.`);
    }
    if (Math.abs(m.dcOffset) > dcMax) {
      one("dc-offset", `DC offset ${m.dcOffset.toFixed(4)} of full scale (${r1(20 * Math.log10(Math.abs(m.dcOffset)))} dBFS): it clicks at the start and end and eats headroom; remove it with a high-pass filter.`);
    }
    const distant = !!s.mic && DISTANT_MICS.has(s.mic);
    if (m.onsetMs > lateMs + (distant ? DISTANT_EXTRA_MS : 0)) {
      one("late-onset", `the hit starts ${r1(m.onsetMs)} ms into the file; it is common practice to trim leading silence to a few milliseconds, with one offset for all layers, round robins and microphones, so pads feel tight${distant ? ` (a ${s.mic} mic may start up to about ${DISTANT_EXTRA_MS} ms later than the close mics, not more)` : ""}.`);
    }
    if (m.tail === "cut") one("cut-tail", cutTailMessage(m));
  }
  return out;
}

/** Plain words for a cut tail, with the level at the stop when the measurement has it (MEASURE_VERSION 2). */
export function cutTailMessage(m: Measurement): string {
  const fix = "Keep the full decay or fade it out.";
  if (m.tailEndDb === undefined) return `the tail is cut off before it decays to the noise floor: the sound stops abruptly. ${fix}`;
  const below = `${Math.round(-m.tailEndDb)} dB below its peak`;
  const floor =
    m.tailEndAboveFloorDb === null || m.tailEndAboveFloorDb === undefined
      ? "no noise floor could be measured (no quiet lead-in or tail)"
      : m.noiseFloorDbfs <= SILENCE_DB
        ? "into digital silence (the file has no noise floor)"
        : `still ${Math.round(m.tailEndAboveFloorDb)} dB above the noise floor`;
  return `the tail is cut off: the sound stops abruptly ${below}, ${floor}. ${fix}`;
}

/** Findings from the layer sorting of one group (label such as "Snare 14x6.5 Brass / centre / top"). */
export function layerHealth(groupLabel: string, issues: LayerIssue[]): HealthFinding[] {
  return issues.map((i) => ({ code: i.code, severity: SEVERITY[i.code], sampleIds: [...i.sampleIds].sort(), message: `${groupLabel}: ${i.message}` }));
}

/** Name/sound conflicts: only strong disagreements become findings. */
export function conflictHealth(conflicts: { id: string; path?: string; conflict: NameSoundConflict }[]): HealthFinding[] {
  return conflicts
    .filter((c) => c.conflict.level === "strong")
    .map((c) => ({
      code: "name-sound-conflict" as const,
      severity: SEVERITY["name-sound-conflict"],
      sampleIds: [c.id],
      message: `${c.path ?? c.id}: ${c.conflict.message} Check the file or confirm its label.`,
    }));
}

const ORDER: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

/** Sorts findings: errors first, then by code, then by first sample. */
export function sortFindings(f: HealthFinding[]): HealthFinding[] {
  return [...f].sort((a, b) => ORDER[a.severity] - ORDER[b.severity] || a.code.localeCompare(b.code) || (a.sampleIds[0] ?? "").localeCompare(b.sampleIds[0] ?? ""));
}
