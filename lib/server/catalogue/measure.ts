import "server-only";
// The measure job's data side: read the stored WAV, measure it (lib/audio measureWav, on the worker's pool), store
// the measurement, peaks and the copied-out columns, and mark the sample catalogued (or rejected with the
// refusal's code and reason). Idempotent: a sample already measured at this MEASURE_VERSION is left alone; one
// measured by an older version is measured again (queued at worker start: maintenance.ts requeueOutdated).
import { MEASURE_VERSION } from "@/lib/audio/version";
import { decaySec } from "@/lib/catalogue/features";
import type { MeasureOutcome } from "@/lib/audio";
import { db } from "../db";
import { storage } from "../storage";
import { enqueueRegroup } from "./queue";

/** lib/audio's measureWav, run where the caller chooses (the worker: its thread pool; tests: inline). */
export type MeasureFn = (bytes: Uint8Array) => Promise<MeasureOutcome>;

const fin = (x: number | null | undefined) => (x === null || x === undefined || !Number.isFinite(x) ? null : x);

export class RetryableMeasureError extends Error {}

/** Measures one sample. Returns what happened; throws RetryableMeasureError for failures worth retrying. */
export async function measureSample({ sampleId, studioId }: { sampleId: string; studioId: string }, measureFn: MeasureFn): Promise<"catalogued" | "rejected" | "skipped"> {
  const s = await db()("samples").where({ id: sampleId, studio_id: studioId }).first("id", "library_id", "state", "measure_version", "storage_key");
  if (!s) return "skipped"; // deleted meanwhile
  if ((s.state === "catalogued" || s.state === "rejected") && s.measure_version === MEASURE_VERSION) return "skipped";
  // a sample measured by an older MEASURE_VERSION stays catalogued while it is measured again, so the library's
  // regroups, searches and kits keep seeing it; it takes the new measurement when it is ready
  if (s.state !== "catalogued") await db()("samples").where({ id: sampleId }).update({ state: "measuring", updated_at: db().fn.now(3) });
  let bytes: Uint8Array;
  try {
    bytes = await storage().getBytes(s.storage_key);
  } catch (e) {
    throw new RetryableMeasureError(`the stored file could not be read: ${(e as Error).message}`);
  }
  const r = await measureFn(bytes);
  if (!r.ok && !r.final) throw new RetryableMeasureError(r.reason);
  if (r.ok) {
    const m = r.measurement;
    await db()("samples").where({ id: sampleId, studio_id: studioId }).update({
      state: "catalogued",
      reject_code: null,
      reject_reason: null,
      measure_version: MEASURE_VERSION,
      measurement: JSON.stringify(m),
      peaks: JSON.stringify(r.peaks),
      sample_rate: m.format.sampleRate,
      bits: m.format.bitsPerSample,
      channels: m.format.channels,
      duration_sec: fin(m.format.durationSec),
      strike_lufs: fin(m.strikeLufs),
      true_peak_dbtp: fin(m.truePeakDbtp),
      centroid_hz: fin(m.strike.centroidHz),
      decay_sec: fin(decaySec(m)),
      updated_at: db().fn.now(3),
    });
  } else {
    await rejectSample({ sampleId, studioId, code: r.code, reason: r.reason });
  }
  await enqueueRegroup({ studioId, libraryId: s.library_id });
  return r.ok ? "catalogued" : "rejected";
}

/** Marks a sample rejected with a reason (a refusal, or a job that failed for good). */
export async function rejectSample({ sampleId, studioId, code, reason }: { sampleId: string; studioId: string; code: string; reason: string }): Promise<void> {
  await db()("samples").where({ id: sampleId, studio_id: studioId }).update({
    state: "rejected",
    reject_code: code.slice(0, 40),
    reject_reason: reason,
    measure_version: MEASURE_VERSION,
    updated_at: db().fn.now(3),
  });
}
