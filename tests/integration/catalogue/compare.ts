// Comparing a single-process run (the command line: `kitwright catalogue | audit`) with the app's answer for the
// same files, field by field: used by agreement.test.ts (one app, in-process routes) and by the scale test
// (tests/scale: two app processes and two workers). Each difference is one line naming the file (or pad,
// instrument) and the field, with both values.
import { auditToJson } from "@/lib/audit/export";
import type { AuditResult } from "@/lib/audit/types";

/** Every leaf where a and b differ, as "path: CLI x, app y". */
export function differences(a: unknown, b: unknown, at: string, out: string[]): void {
  if (Object.is(a, b)) return;
  if (a && b && typeof a === "object" && typeof b === "object") {
    if (Array.isArray(a) !== Array.isArray(b)) return void out.push(`${at}: CLI ${JSON.stringify(a)}, app ${JSON.stringify(b)}`);
    const keys = new Set([...Object.keys(a), ...Object.keys(b)]);
    for (const k of keys) differences((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], Array.isArray(a) ? `${at}[${k}]` : `${at}.${k}`, out);
    return;
  }
  out.push(`${at}: CLI ${JSON.stringify(a)}, app ${JSON.stringify(b)}`);
}

/** The fields both paths must agree on, per file. */
export const SAMPLE_FIELDS = ["family", "articulation", "instrumentKey", "instrumentName", "mic", "layerIndex", "layerCount", "roundRobin", "velocityLow", "velocityHigh"] as const;

/** `kitwright catalogue --json`'s document (the parts compared). */
export interface CliCatalogue {
  samples: Record<string, unknown>[];
  instruments: { key: string; family: string; displayName: string; sampleIds: string[]; pitchHz?: number | null }[];
  refused: { path: string; code: string; reason: string }[];
}
/** The library page's view: the samples route's rows and the instruments route's instruments. */
export interface AppCatalogue {
  samples: Record<string, unknown>[];
  instruments: { id: string; key: string; name: string; family: string; pitchHz: number | null; sampleCount: number }[];
}

/** Every file and instrument where the command line's catalogue and the app's differ. */
export function catalogueDifferences(cli: CliCatalogue, app: AppCatalogue): string[] {
  const appByPath = new Map(app.samples.map((s) => [s.path as string, s]));
  const diffs: string[] = [];
  for (const c of cli.samples) {
    const a = appByPath.get(c.path as string);
    if (!a) {
      diffs.push(`${c.path}: missing from the library page`);
      continue;
    }
    for (const f of SAMPLE_FIELDS) if (!Object.is(c[f], a[f])) diffs.push(`${c.path}: ${f}: CLI ${JSON.stringify(c[f])}, app ${JSON.stringify(a[f])}`);
  }
  const appInst = new Map(app.instruments.map((i) => [i.key, i]));
  const cliKeys = cli.instruments.map((i) => i.key).sort();
  const appKeys = [...appInst.keys()].sort();
  if (JSON.stringify(cliKeys) !== JSON.stringify(appKeys)) diffs.push(`instruments: CLI ${cliKeys.join(", ")}, app ${appKeys.join(", ")}`);
  for (const c of cli.instruments) {
    const a = appInst.get(c.key);
    if (!a) continue;
    if (c.family !== a.family) diffs.push(`instrument ${c.key}: family: CLI ${c.family}, app ${a.family}`);
    if (c.displayName !== a.name) diffs.push(`instrument ${c.key}: name: CLI ${c.displayName}, app ${a.name}`);
    if (c.sampleIds.length !== a.sampleCount) diffs.push(`instrument ${c.key}: samples: CLI ${c.sampleIds.length}, app ${a.sampleCount}`);
    if (!Object.is(c.pitchHz, a.pitchHz)) diffs.push(`instrument ${c.key}: pitchHz: CLI ${JSON.stringify(c.pitchHz)}, app ${JSON.stringify(a.pitchHz)}`);
  }
  return diffs;
}

/** An audit without its layout and kit names and ids, instrument ids replaced by the catalogue's keys (the command line's ids). */
export function comparableAudit(r: AuditResult, keyOf: Map<string, string>): Record<string, unknown> {
  const { layoutId: _l, layoutName: _ln, kitId: _k, kitName: _kn, ...rest } = auditToJson(r) as unknown as AuditResult & { schema: string };
  let text = JSON.stringify(rest);
  for (const [id, key] of keyOf) text = text.split(id).join(key);
  return JSON.parse(text);
}

/** Every pad, pedal zone, conflict, summary or score field where `kitwright audit --json`'s output and the app's audit differ. */
export function auditDifferences(cliOut: string, appAudit: AuditResult, keyOf: Map<string, string>): string[] {
  const cli = comparableAudit(JSON.parse(cliOut), keyOf);
  const app = comparableAudit(appAudit, keyOf);
  const diffs: string[] = [];
  const byPad = (x: Record<string, unknown>) => new Map((x.pads as { padId: string }[]).map((p) => [p.padId, p]));
  const cp = byPad(cli);
  const ap = byPad(app);
  for (const [id, p] of ap) differences(cp.get(id), p, `pad ${id}`, diffs);
  for (const id of cp.keys()) if (!ap.has(id)) diffs.push(`pad ${id}: only in the CLI's audit`);
  for (const f of ["pedal", "conflicts", "summary", "score"]) differences(cli[f], app[f], f, diffs);
  return diffs;
}
