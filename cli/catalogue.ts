// kitwright catalogue <folder> [--json | --csv] [--curve dls|dannenberg] [--strokes <strokes.json>]
// Measures every WAV under a folder and sorts it (names, sound, instruments, layers, round robins, health),
// with no server or database. One record per file, then the health findings and the refused files.

import { createHash } from "node:crypto";
import { readFile, stat } from "node:fs/promises";
import path from "node:path";
import type { Measurement } from "../lib/audio";
import { catalogueSamples, type Catalogue, type CatalogueEntry, type CatalogueSampleInput } from "../lib/catalogue/catalogue";
import type { VelocityCurve } from "../lib/catalogue/velocity";
import { formatConfidence } from "../lib/catalogue/confidence";
import type { StrokeList } from "../lib/catalogue/strokes";
import { findWavs, inOrder, poolFor } from "./files";
import { readStrokeFile, StrokeFileError, STROKES_HELP, STROKES_USAGE } from "./strokes";

const USAGE = `usage: kitwright catalogue <folder> [--json | --csv] [--curve dls|dannenberg] [${STROKES_USAGE}]

Sorts the WAV one-shots under <folder> into instruments, articulations, velocity layers and round robins,
and lists the library's health findings. Nothing is uploaded.
  --json        one JSON document (samples, instruments, layer groups, health, refused files)
  --csv         one row per file
  --curve       velocity curve for the layer ranges: dls (default, DLS Level 1 square law) or dannenberg
${STROKES_HELP}
`;

export interface Refused {
  path: string;
  code: string;
  reason: string;
}

/**
 * Measures (lib/audio measureWav, on every core) and catalogues a folder. Refused files are returned with their
 * reasons; one bad file never stops the others. With a studio's strokes, file names using their words sort into them.
 */
export async function catalogueFolder(
  folder: string,
  curve?: VelocityCurve,
  strokes?: StrokeList | null,
): Promise<{ catalogue: Catalogue; refused: Refused[] }> {
  const files = await findWavs(folder);
  const inputs: CatalogueSampleInput[] = [];
  const refused: Refused[] = [];
  if (files.length) {
    const pool = poolFor(files.length);
    try {
      await inOrder(
        files,
        2 * pool.size,
        async (file) => {
          const rel = path.relative(folder, file).split(path.sep).join("/");
          let bytes: Uint8Array;
          try {
            bytes = await readFile(file);
          } catch (e) {
            return { rel, refused: { code: "unreadable", reason: `could not read the file: ${(e as Error).message}` } };
          }
          const sha256 = createHash("sha256").update(bytes).digest("hex");
          const outcome = await pool.measureWav(bytes).catch((e: Error) => ({ ok: false as const, code: "error", reason: `could not measure: ${e.message}` }));
          return outcome.ok ? { rel, sha256, measurement: outcome.measurement } : { rel, refused: { code: outcome.code, reason: outcome.reason } };
        },
        (r) => {
          if ("refused" in r && r.refused) refused.push({ path: r.rel, ...r.refused });
          else if (r.measurement) {
            const { metadata: _metadata, ...measurement } = r.measurement;
            inputs.push({ id: r.rel, path: r.rel, sha256: r.sha256, measurement: measurement as Measurement });
          }
        },
      );
    } finally {
      await pool.close();
    }
  }
  return { catalogue: catalogueSamples(inputs, { curve, strokes }), refused };
}

const CSV_COLUMNS = [
  "path", "state", "family", "instrument", "articulation", "layer", "layers", "round_robin", "round_robins", "velocity_low", "velocity_high",
  "mic", "strike_lufs", "family_source", "articulation_source", "confidence", "conflict", "defects", "reasons",
] as const;

function csvCell(v: unknown): string {
  const s = v === null || v === undefined ? "" : String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function defectsBySample(cat: Catalogue): Map<string, string[]> {
  const m = new Map<string, string[]>();
  for (const h of cat.health) for (const id of h.sampleIds) m.set(id, [...(m.get(id) ?? []), h.code]);
  return m;
}

export function toCsv(cat: Catalogue, refused: Refused[]): string {
  const defects = defectsBySample(cat);
  const rows: string[] = [CSV_COLUMNS.join(",")];
  for (const s of cat.samples) {
    rows.push(
      [
        s.path, "catalogued", s.family, s.instrumentName, s.articulation, s.layerIndex === null ? "" : s.layerIndex + 1, s.layerCount, s.roundRobin ?? "",
        s.roundRobinCount, s.velocityLow ?? "", s.velocityHigh ?? "", s.mic ?? "", Number.isFinite(s.strikeLufs) ? s.strikeLufs.toFixed(1) : "",
        s.familySource, s.articulationSource, s.confidence.toFixed(2), s.conflict, [...new Set(defects.get(s.id) ?? [])].join(" "), s.reasons.join("; "),
      ].map(csvCell).join(","),
    );
  }
  for (const r of refused) {
    const cells: unknown[] = CSV_COLUMNS.map(() => "");
    cells[0] = r.path;
    cells[1] = "rejected";
    cells[CSV_COLUMNS.indexOf("reasons")] = `${r.code}: ${r.reason}`;
    rows.push(cells.map(csvCell).join(","));
  }
  return rows.join("\n") + "\n";
}

function line(s: CatalogueEntry): string {
  const layer = s.layerIndex === null ? "-" : `${s.layerIndex + 1}/${s.layerCount}`;
  const rr = s.roundRobin === null ? "-" : `${s.roundRobin}/${s.roundRobinCount}`;
  const vel = s.velocityLow === null ? "" : ` vel ${s.velocityLow}-${s.velocityHigh}`;
  const lufs = Number.isFinite(s.strikeLufs) ? `${s.strikeLufs.toFixed(1)} LUFS` : "no strike";
  return `${s.path}\n    ${s.family} | ${s.instrumentName} | ${s.articulation} | layer ${layer}${vel} | rr ${rr} | mic ${s.mic ?? "-"} | ${lufs} | ${s.familySource}/${s.articulationSource} ${formatConfidence(s.confidence)}\n    ${s.reasons.join("; ")}`;
}

export function toText(cat: Catalogue, refused: Refused[], folder: string): string {
  const out: string[] = [];
  out.push(`${folder}: ${cat.samples.length} catalogued, ${refused.length} refused, ${cat.instruments.length} instruments, ${cat.groups.length} layer groups (curve: ${cat.curve.kind === "dls" ? "DLS Level 1" : "Dannenberg 2006"})`, "");
  for (const s of cat.samples) out.push(line(s));
  out.push("", "Instruments:");
  for (const i of cat.instruments) out.push(`  ${i.displayName} (${i.family}): ${i.sampleIds.length} samples${i.pitchHz === null ? "" : `, pitch ${i.pitchHz.toFixed(1)} Hz`}`);
  out.push("", "Layer groups:");
  for (const g of cat.groups) {
    out.push(`  ${g.label}: ${g.layers.length} layer${g.layers.length === 1 ? "" : "s"} (${g.criterion})`);
    for (const l of g.layers) out.push(`    ${l.index + 1}: vel ${l.velocityLow}-${l.velocityHigh}, ${l.meanStrikeLufs.toFixed(1)} LUFS, ${l.sampleIds.length} round robin${l.sampleIds.length === 1 ? "" : "s"}`);
  }
  out.push("", `Health: ${cat.health.length} finding${cat.health.length === 1 ? "" : "s"}`);
  for (const h of cat.health) out.push(`  [${h.severity}] ${h.code}: ${h.message}`);
  if (refused.length) {
    out.push("", "Refused:");
    for (const r of refused) out.push(`  ${r.path}: ${r.reason}`);
  }
  return out.join("\n") + "\n";
}

export async function run(args: string[]): Promise<number> {
  let format: "text" | "json" | "csv" = "text";
  let curve: VelocityCurve | undefined;
  let strokesFile: string | null = null;
  const positional: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a === "--json") format = "json";
    else if (a === "--csv") format = "csv";
    else if (a === "--help" || a === "-h") {
      process.stdout.write(USAGE);
      return 0;
    } else if (a === "--curve" || a.startsWith("--curve=")) {
      const v = a.includes("=") ? a.slice(8) : args[++i];
      if (v === "dls") curve = { kind: "dls" };
      else if (v === "dannenberg") curve = { kind: "dannenberg" };
      else {
        process.stderr.write(`kitwright catalogue: unknown curve "${v ?? ""}" (dls or dannenberg)\n`);
        return 2;
      }
    } else if (a === "--strokes" || a.startsWith("--strokes=")) {
      const v = a.includes("=") ? a.slice(10) : args[++i];
      if (!v || v.startsWith("--")) {
        process.stderr.write(`kitwright catalogue: --strokes needs a file\n`);
        return 2;
      }
      strokesFile = v;
    } else if (a.startsWith("-")) {
      process.stderr.write(`kitwright catalogue: unknown option "${a}"\n\n${USAGE}`);
      return 2;
    } else positional.push(a);
  }
  if (positional.length !== 1) {
    process.stderr.write(USAGE);
    return 2;
  }
  const folder = path.resolve(positional[0]!);
  let st;
  try {
    st = await stat(folder);
  } catch {
    process.stderr.write(`kitwright catalogue: no such folder: ${positional[0]}\n`);
    return 1;
  }
  if (!st.isDirectory()) {
    process.stderr.write(`kitwright catalogue: not a folder: ${positional[0]}\n`);
    return 1;
  }
  let strokes: StrokeList = [];
  if (strokesFile) {
    try {
      strokes = await readStrokeFile(strokesFile);
    } catch (e) {
      if (!(e instanceof StrokeFileError)) throw e;
      process.stderr.write(`kitwright catalogue: ${e.message}\n`);
      return 2;
    }
  }
  const { catalogue, refused } = await catalogueFolder(folder, curve, strokes);
  if (format === "json") process.stdout.write(JSON.stringify({ folder: positional[0], ...catalogue, refused }, null, 2) + "\n");
  else if (format === "csv") process.stdout.write(toCsv(catalogue, refused));
  else process.stdout.write(toText(catalogue, refused, positional[0]!));
  return 0;
}
