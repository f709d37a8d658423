// kitwright measure <files or folders> [--json | --csv] [--verify] [--fast] [--max-seconds N]
// Measures WAV one-shots with lib/audio; refused files are listed with their reason and make the exit code 1,
// the others are still reported. By default each file's format and tags are also read with music-metadata and
// compared with our own header reading (mismatches become warnings): music-metadata is asynchronous and heavy,
// so it lives here, in the checking tool, and not in lib/audio's measuring path used by the workers.
// --verify also compares every sample with wavefile's reader. --fast skips both cross-checks.
// Files are measured by lib/audio's measureWav on every core (cli/files.ts), and printed in order.
import { readFile } from "node:fs/promises";
import type { MeasuredFile } from "../lib/audio/index";
import type { MeasurePool } from "../lib/audio-pool/pool";
import { findWavs, inOrder, poolFor } from "./files";

const USAGE = `usage: kitwright measure <files or folders> [--json | --csv] [--verify] [--fast] [--max-seconds N]
  Folders are searched recursively for .wav files. Exit code 1 if any file was refused.
  --json          one JSON record per file (an array)
  --csv           one CSV row per file
  --verify        also compare every sample with wavefile's reader
  --fast          skip the music-metadata format/tag cross-check
  --max-seconds N one-shot length limit (default 60)
`;

export type FileRecord =
  | { file: string; status: "measured"; measurement: MeasuredFile }
  | { file: string; status: "refused"; code: string; reason: string };

/** Format and tags as music-metadata reads them, compared with our reading; returns the differences. */
export async function probeWithMusicMetadata(bytes: Uint8Array, ours: MeasuredFile): Promise<string[]> {
  const { parseBuffer } = await import("music-metadata");
  let mm;
  try {
    mm = await parseBuffer(bytes, { mimeType: "audio/wav" }, { duration: false, skipCovers: true });
  } catch (e) {
    return [`music-metadata could not read the file: ${(e as Error).message}`];
  }
  const out: string[] = [];
  const f = mm.format;
  const cmp = (what: string, theirs: unknown, mine: unknown) => {
    if (theirs !== undefined && theirs !== mine) out.push(`music-metadata reads ${what} ${String(theirs)}, we read ${String(mine)}`);
  };
  cmp("sample rate", f.sampleRate, ours.format.sampleRate);
  cmp("channels", f.numberOfChannels, ours.format.channels);
  cmp("bits per sample", f.bitsPerSample, ours.format.bitsPerSample);
  if (f.numberOfSamples !== undefined && !ours.truncated) cmp("frames", f.numberOfSamples, ours.format.frames);
  const title = mm.common.title;
  if (title !== undefined && ours.metadata.info.INAM !== undefined && title !== ours.metadata.info.INAM) out.push(`music-metadata reads title "${title}", we read "${ours.metadata.info.INAM}"`);
  return out;
}

/** Reads and measures one file (its bytes go to a measuring thread); never throws. */
export async function measureFile(file: string, pool: MeasurePool, opts: { maxSeconds?: number; verify?: boolean; fast?: boolean }): Promise<FileRecord> {
  let bytes: Uint8Array;
  try {
    bytes = new Uint8Array(await readFile(file));
  } catch (e) {
    return { file, status: "refused", code: "unreadable", reason: `cannot read the file: ${(e as Error).message}` };
  }
  // the thread takes the bytes it is given: keep a copy for music-metadata's reading
  const r = await pool.measureWav(opts.fast ? bytes : bytes.slice(), { maxSeconds: opts.maxSeconds, crossCheck: opts.verify }).catch((e: Error) => ({ ok: false as const, code: "error", reason: `could not measure: ${e.message}` }));
  if (!r.ok) return { file, status: "refused", code: r.code, reason: r.reason };
  const measurement = r.measurement;
  if (!opts.fast) measurement.warnings.push(...(await probeWithMusicMetadata(bytes, measurement)));
  return { file, status: "measured", measurement };
}

const num = (v: number | null | undefined, digits = 2) => (v === null || v === undefined ? "" : Number.isInteger(v) ? String(v) : v.toFixed(digits));
const csvCell = (s: string) => (/[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);

export const CSV_COLUMNS = [
  "file", "status", "reason", "duration_s", "channels", "sample_rate", "bits", "encoding", "sample_peak_dbfs", "true_peak_dbtp",
  "rms_dbfs", "strike_lufs", "integrated_lufs", "crest_db", "dc_offset", "clipped_runs", "onset_ms", "attack_ms", "edt_s", "t20_s",
  "tail", "noise_floor_dbfs", "stereo_correlation", "pitch_hz", "strike_centroid_hz", "strike_flatness", "body_centroid_hz",
  "body_flatness", "truncated", "title", "warnings",
] as const;

export function csvRow(r: FileRecord): string {
  if (r.status === "refused") return [csvCell(r.file), "refused", csvCell(`${r.code}: ${r.reason}`), ...new Array(CSV_COLUMNS.length - 3).fill("")].join(",");
  const m = r.measurement;
  const cells = [
    r.file, "measured", "", num(m.format.durationSec, 4), num(m.format.channels), num(m.format.sampleRate), num(m.format.bitsPerSample), m.format.encoding,
    num(m.samplePeakDbfs), num(m.truePeakDbtp), num(m.rmsDbfs), num(m.strikeLufs), num(m.integratedLufs), num(m.crestDb), num(m.dcOffset, 6),
    num(m.clippedRuns), num(m.onsetMs), num(m.attackMs), num(m.edtSec, 3), num(m.t20Sec, 3), m.tail, num(m.noiseFloorDbfs), num(m.stereoCorrelation, 3),
    num(m.pitchHz, 1), num(m.strike.centroidHz, 0), num(m.strike.flatness, 3), num(m.body?.centroidHz, 0), num(m.body?.flatness, 3),
    m.truncated ? "yes" : "no", m.metadata.info.INAM ?? "", m.warnings.join("; "),
  ];
  return cells.map((c) => csvCell(String(c))).join(",");
}

function textLine(r: FileRecord): string {
  if (r.status === "refused") return `REFUSED  ${r.file}\n         ${r.code}: ${r.reason}`;
  const m = r.measurement;
  const parts = [
    `${m.format.durationSec.toFixed(2)} s ${m.format.channels}ch ${m.format.sampleRate / 1000} kHz ${m.format.bitsPerSample}-bit${m.format.encoding === "float" ? " float" : ""}`,
    `peak ${num(m.samplePeakDbfs, 1)} dBFS`, `TP ${num(m.truePeakDbtp, 1)} dBTP`, `strike ${num(m.strikeLufs, 1)} LUFS`,
    `onset ${num(m.onsetMs, 1)} ms`, `T20 ${m.t20Sec === null ? "-" : num(m.t20Sec, 2) + " s"}`, `tail ${m.tail}`,
    m.pitchHz === null ? "no pitch" : `pitch ${num(m.pitchHz, 0)} Hz`,
  ];
  const warn = m.warnings.length ? `\n         ! ${m.warnings.join("\n         ! ")}` : "";
  return `ok       ${r.file}\n         ${parts.join(" | ")}${warn}`;
}

export async function run(args: string[]): Promise<number> {
  let mode: "text" | "json" | "csv" = "text";
  let verify = false, fast = false;
  let maxSeconds: number | undefined;
  const targets: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === "--json") mode = "json";
    else if (a === "--csv") mode = "csv";
    else if (a === "--verify") verify = true;
    else if (a === "--fast") fast = true;
    else if (a === "--max-seconds") {
      maxSeconds = Number(args[++i]);
      if (!(maxSeconds > 0)) { process.stderr.write(`kitwright measure: --max-seconds needs a positive number\n${USAGE}`); return 2; }
    } else if (a === "--help" || a === "-h") { process.stdout.write(USAGE); return 0; }
    else if (a.startsWith("--")) { process.stderr.write(`kitwright measure: unknown option ${a}\n${USAGE}`); return 2; }
    else targets.push(a);
  }
  if (!targets.length) { process.stderr.write(USAGE); return 2; }
  const files: string[] = [];
  const missing: FileRecord[] = [];
  for (const t of targets) {
    try { await findWavs(t, files); } catch (e) { missing.push({ file: t, status: "refused", code: "unreadable", reason: (e as NodeJS.ErrnoException).code === "ENOENT" ? "no such file or folder" : (e as Error).message }); }
  }
  const records: FileRecord[] = [...missing];
  const print = (r: FileRecord) => {
    if (mode === "csv") process.stdout.write(csvRow(r) + "\n");
    else if (mode === "text") process.stdout.write(textLine(r) + "\n");
  };
  if (mode === "csv") process.stdout.write(CSV_COLUMNS.join(",") + "\n");
  for (const r of missing) print(r);
  if (files.length) {
    const pool = poolFor(files.length);
    try {
      records.push(...(await inOrder(files, 2 * pool.size, (f) => measureFile(f, pool, { maxSeconds, verify, fast }), print)));
    } finally {
      await pool.close();
    }
  }
  if (mode === "json") process.stdout.write(JSON.stringify(records, null, 2) + "\n");
  const refused = records.filter((r) => r.status === "refused").length;
  if (mode === "text") process.stdout.write(`\n${records.length - refused} measured, ${refused} refused\n`);
  else process.stderr.write(`${records.length - refused} measured, ${refused} refused\n`);
  if (records.length === 0) process.stderr.write("kitwright measure: no .wav files found\n");
  return refused > 0 ? 1 : 0;
}
