import "server-only";
// The measure job's data side: read the stored WAV, measure it (lib/audio measureWav, on the worker's pool), store
// the measurement, peaks and the copied-out columns, and mark the sample measured (or rejected with the
// refusal's code and reason); then ask for the cataloguing of its library, which places it (state catalogued).
// Idempotent: a sample already measured at this MEASURE_VERSION is left alone; one measured by an older version
// is measured again (queued at worker start: maintenance.ts requeueOutdated).
import { MEASURE_VERSION } from "@/lib/audio/version";
import { decaySec } from "@/lib/catalogue/features";
import type { MeasureOutcome } from "@/lib/audio";
import { db } from "../db";
import { storage } from "../storage";
import { enqueueCataloguing } from "./queue";
import { MEASURED_STATES, type SampleState } from "@/lib/validation/library";

const hasMeasurement = (state: string) => (MEASURED_STATES as readonly string[]).includes(state);

/** lib/audio's measureWav, run where the caller chooses (the worker: its thread pool; tests: inline). */
export type MeasureFn = (bytes: Uint8Array) => Promise<MeasureOutcome>;

const fin = (x: number | null | undefined) => (x === null || x === undefined || !Number.isFinite(x) ? null : x);

export class RetryableMeasureError extends Error {}

/**
 * Measures one sample. Returns the state it ends in ("skipped" when there was nothing to do); throws
 * RetryableMeasureError for failures worth retrying.
 */
export async function measureSample({ sampleId, studioId }: { sampleId: string; studioId: string }, measureFn: MeasureFn): Promise<Extract<SampleState, "measured" | "catalogued" | "rejected"> | "skipped"> {
  const s = await db()("samples").where({ id: sampleId, studio_id: studioId }).first("id", "library_id", "state", "measure_version", "storage_key");
  if (!s) return "skipped"; // deleted meanwhile
  if ((hasMeasurement(s.state) || s.state === "rejected") && s.measure_version === MEASURE_VERSION) return "skipped";
  // a sample measured by an older MEASURE_VERSION keeps its state (measured, or catalogued: still in its
  // instrument and layer) while it is measured again, so the library's cataloguings, searches and kits keep
  // seeing it; it takes the new measurement when it is ready, and the cataloguing that follows places it again
  const kept: "measured" | "catalogued" | null = hasMeasurement(s.state) ? s.state : null;
  if (!kept) await db()("samples").where({ id: sampleId }).update({ state: "measuring", updated_at: db().fn.now(3) });
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
      state: kept ?? "measured",
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
  await enqueueCataloguing({ studioId, libraryId: s.library_id });
  return r.ok ? (kept ?? "measured") : "rejected";
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
