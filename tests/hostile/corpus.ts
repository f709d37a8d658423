// Runs the hostile corpus (tests/hostile/mutate.ts) through the decoder and measurement (`measureWav`
// from lib/audio) and sums up what happened: every file must end measured, or refused with a code and a
// message; nothing may throw, and each file's time is recorded (the worst one is reported).
import { measureWav } from "../../lib/audio/index";
import { bases, mutant, type Mutant, type MutationKind } from "./mutate";

export interface CorpusProblem {
  index: number;
  kind: MutationKind;
  problem: string;
}

export interface CorpusSummary {
  count: number;
  seed: number;
  measured: number;
  refused: number;
  byCode: Record<string, number>;
  byKind: Record<string, { measured: number; refused: number }>;
  maxMs: number;
  maxMsIndex: number;
  totalMs: number;
  problems: CorpusProblem[];
}

/** Plain-JSON check: the measurement must hold only finite numbers (JSON has no NaN or Infinity). */
function jsonSafe(x: unknown): boolean {
  let ok = true;
  JSON.stringify(x, (_k, v) => {
    if (typeof v === "number" && !Number.isFinite(v)) ok = false;
    return v;
  });
  return ok;
}

export function checkOne(m: Mutant): { outcome: "measured" | "refused"; code?: string; ms: number; problem?: string } {
  const t0 = performance.now();
  let out: ReturnType<typeof measureWav>;
  try {
    out = measureWav(m.bytes);
  } catch (e) {
    return { outcome: "refused", code: "threw", ms: performance.now() - t0, problem: `measureWav threw: ${(e as Error)?.message}` };
  }
  const ms = performance.now() - t0;
  if (out.ok) {
    if (!jsonSafe(out.measurement) || !jsonSafe(out.peaks)) return { outcome: "measured", ms, problem: "measurement or peaks not plain JSON (NaN or Infinity inside)" };
    return { outcome: "measured", ms };
  }
  if (out.code === "error") return { outcome: "refused", code: out.code, ms, problem: `unexpected error instead of a refusal: ${out.reason}` };
  if (typeof out.reason !== "string" || out.reason.trim().length < 10) return { outcome: "refused", code: out.code, ms, problem: `refusal without a clear reason: ${JSON.stringify(out.reason)}` };
  if (m.kind === "valid") return { outcome: "refused", code: out.code, ms, problem: `an undamaged file was refused: ${out.code} ${out.reason}` };
  return { outcome: "refused", code: out.code, ms };
}

export function runCorpus(count: number, seed = 1, onProgress?: (done: number) => void): CorpusSummary {
  const b = bases();
  const s: CorpusSummary = { count, seed, measured: 0, refused: 0, byCode: {}, byKind: {}, maxMs: 0, maxMsIndex: -1, totalMs: 0, problems: [] };
  for (let i = 0; i < count; i++) {
    const m = mutant(i, seed, b);
    const r = checkOne(m);
    s.totalMs += r.ms;
    if (r.ms > s.maxMs) (s.maxMs = r.ms), (s.maxMsIndex = i);
    const k = (s.byKind[m.kind] ??= { measured: 0, refused: 0 });
    if (r.outcome === "measured") (s.measured++, k.measured++);
    else {
      s.refused++;
      k.refused++;
      s.byCode[r.code!] = (s.byCode[r.code!] ?? 0) + 1;
    }
    if (r.problem) s.problems.push({ index: i, kind: m.kind, problem: r.problem });
    if (onProgress && (i + 1) % 1000 === 0) onProgress(i + 1);
  }
  return s;
}
