// kitwright audit --layout <layout.json | template name> --catalogue <folder | catalogue.json> [--kit <kit.json>]
//                 [--strokes <strokes.json>] [--csv | --json] [--smf <out.mid>]   (formats: lib/audit/export-formats.ts)
// Runs the coverage audit offline. Exit status: 0 when every pad plays something, 1 when any pad (or pedal
// zone, or the pedal chick note) is silent, 2 on bad input (the message says what and where).
// The studio's own strokes are those the layout and kit files carry, then those of --strokes (a file's own
// definition wins); they sort a catalogued folder's names, and their edges give stand-ins.

import { readFile, stat, writeFile } from "node:fs/promises";
import { hasSilentPads, runAudit } from "../lib/audit/audit";
import { readCatalogue } from "../lib/audit/catalogue-input";
import { EXPORT_FORMATS, type ExportFormat, type ExportFormatId } from "../lib/audit/export-formats";
import { buildDefaultKit } from "../lib/audit/kits";
import { parseKitFile, parseLayoutFile, SchemaError } from "../lib/audit/schema";
import { TEMPLATE_NAMES, getTemplate } from "../lib/audit/templates";
import { catalogueFolder as sortFolder } from "./catalogue";
import { mergeStrokes, type StrokeList } from "../lib/catalogue/strokes";
import type { AuditResult, CatalogueInstrument, Kit, Layout, PlayFinding } from "../lib/audit/types";
import { edgesInWords, readStrokeFile, StrokeFileError, STROKES_HELP, STROKES_USAGE } from "./strokes";

/** Formats printed to standard output (one at a time; text when none) and formats written to a named file. */
const STDOUT_FORMATS = EXPORT_FORMATS.filter((f) => f.cli.to === "stdout");
const FILE_FORMATS = EXPORT_FORMATS.filter((f) => f.cli.to === "file");

/** The output options, as the usage lines show them: "[--csv | --json] [--smf <out.mid>]". */
export const OUTPUT_USAGE = [
  `[${STDOUT_FORMATS.map((f) => f.cli.flag).join(" | ")}]`,
  ...FILE_FORMATS.map((f) => `[${f.cli.flag}${f.cli.to === "file" ? ` ${f.cli.placeholder}` : ""}]`),
].join(" ");

const USAGE = `usage: kitwright audit --layout <layout.json | template> --catalogue <folder | catalogue.json>
                       [--kit <kit.json>] [${STROKES_USAGE}] ${OUTPUT_USAGE}

${STROKES_HELP}
                (a layout or kit file may carry its own strokes; its definition wins)

templates: ${TEMPLATE_NAMES.join(", ")}
exit status: 0 every pad plays, 1 some pad is silent, 2 bad input
`;

export class UsageError extends Error {}

interface Options {
  layout: string;
  catalogue: string;
  kit: string | null;
  strokes: string | null;
  format: "text" | ExportFormatId;
  /** Formats written to files: the format and the file. */
  files: { format: ExportFormat; path: string }[];
}

function parseArgs(args: string[]): Options | "help" {
  const o: Partial<Options> & Pick<Options, "files"> = { kit: null, strokes: null, format: "text", files: [] };
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    const toFile = FILE_FORMATS.find((f) => f.cli.flag === a);
    const toStdout = STDOUT_FORMATS.find((f) => f.cli.flag === a);
    const value = () => {
      const v = args[++i];
      if (v === undefined || v.startsWith("--")) throw new UsageError(`${a} needs a value`);
      return v;
    };
    if (a === "--help" || a === "-h") return "help";
    else if (a === "--layout") o.layout = value();
    else if (a === "--catalogue") o.catalogue = value();
    else if (a === "--kit") o.kit = value();
    else if (a === "--strokes") o.strokes = value();
    else if (toFile) o.files.push({ format: toFile, path: value() });
    else if (toStdout) {
      if (o.format !== "text" && o.format !== toStdout.id) throw new UsageError(`choose one of ${STDOUT_FORMATS.map((x) => x.cli.flag).join(" and ")}`);
      o.format = toStdout.id;
    } else throw new UsageError(`unknown option ${a}`);
  }
  if (!o.layout) throw new UsageError("--layout is required");
  if (!o.catalogue) throw new UsageError("--catalogue is required");
  return o as Options;
}

export async function readJson(file: string, what: string): Promise<unknown> {
  let text: string;
  try {
    text = await readFile(file, "utf8");
  } catch (e) {
    throw new UsageError(`cannot read the ${what} ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new UsageError(`the ${what} ${file} is not JSON: ${(e as Error).message}`);
  }
}

async function loadLayout(arg: string, strokes: StrokeList): Promise<Layout> {
  const t = getTemplate(arg);
  if (t) return t;
  const exists = await stat(arg).catch(() => null);
  if (!exists) throw new UsageError(`--layout ${arg}: neither a file nor a template (${TEMPLATE_NAMES.join(", ")})`);
  return parseLayoutFile(await readJson(arg, "layout"), { strokes });
}

/**
 * Catalogue a folder exactly as `kitwright catalogue` does (the same function: measure every WAV with lib/audio,
 * sort with lib/catalogue, instrument pitch included), then read it as the auditor's input with the converter the
 * server uses too (lib/audit/catalogue-input.ts).
 */
async function catalogueFolder(dir: string, warn: (s: string) => void, strokes: StrokeList): Promise<CatalogueInstrument[]> {
  const { catalogue, refused } = await sortFolder(dir, undefined, strokes);
  if (catalogue.samples.length === 0 && refused.length === 0) throw new UsageError(`no .wav files under ${dir}`);
  for (const r of refused) warn(`refused ${r.path}: ${r.reason}`);
  const reading = readCatalogue(catalogue, strokes);
  for (const p of reading.problems) warn(`catalogue: ${p}`);
  return reading.instruments;
}

/** A catalogued folder or a catalogue file; `strokes`: the studio's own strokes names sort into and articulations may name. */
export async function loadCatalogue(arg: string, warn: (s: string) => void, strokes: StrokeList = []): Promise<CatalogueInstrument[]> {
  const s = await stat(arg).catch(() => null);
  if (!s) throw new UsageError(`--catalogue ${arg}: no such file or folder`);
  if (s.isDirectory()) return catalogueFolder(arg, warn, strokes);
  const reading = readCatalogue(await readJson(arg, "catalogue"), strokes);
  if (reading.instruments.length === 0 && reading.problems.length) {
    throw new UsageError(`--catalogue ${arg}: ${reading.problems.join("; ")}`);
  }
  for (const p of reading.problems) warn(`catalogue: ${p}`);
  return reading.instruments;
}

function describe(f: PlayFinding): string {
  if (f.outcome === "silent") return `SILENT    ${f.reason ?? ""}`;
  const where = `${f.instrumentName ?? "?"} ${f.plays}`;
  const layers = `${f.layers.length} layer${f.layers.length === 1 ? "" : "s"}, rr >= ${f.minRoundRobins}`;
  const gaps = f.velocityGaps.length ? `, velocity gaps ${f.velocityGaps.map((g) => (g.low === g.high ? g.low : `${g.low}-${g.high}`)).join(" ")}` : "";
  if (f.outcome === "direct") return `direct    ${where} (${layers}${gaps})`;
  const si = f.standIn!;
  // a stroke the family's graph lacks enters it at the main stroke (no edge); the edges the path then used follow
  const entered = si.source === "graph" && si.edges[0]?.from !== si.path[0];
  const over = si.edges.length ? `over ${edgesInWords(si.edges)}` : "";
  const how = si.source === "override" ? "by the kit's stroke map" : [entered ? "entering at the main stroke" : "", over].filter(Boolean).join(", then ");
  return `stand-in  ${where} via ${si.path.join(" > ")} cost ${si.cost}, ${how} (${layers}${gaps})`;
}

export function formatText(r: AuditResult): string {
  const lines: string[] = [];
  lines.push(`Audit of "${r.layoutName}" against "${r.kitName}"`);
  lines.push(`score ${r.score.value}/100   pads ${r.summary.pads}: ${r.summary.direct} direct, ${r.summary.standIn} stand-in, ${r.summary.silent} silent   conflicts ${r.summary.conflicts}`);
  lines.push(r.score.sentence);
  if (r.strokes.length) {
    lines.push("", "The studio's own strokes");
    for (const s of r.strokes) {
      const near = s.neighbours.map((e) => `${e.to} ${e.cost}`).join(", ");
      lines.push(`  ${s.id} ("${s.name}", ${s.families.join(", ")})${near ? `: near ${near}` : ""}`);
    }
  }
  if (r.conflicts.length) {
    lines.push("", "Conflicts");
    for (const c of r.conflicts) lines.push(`  ${c.kind}: ${c.message}`);
  }
  if (r.emptySlots.length) {
    lines.push("", `Empty slots (${r.emptySlots.reduce((s, g) => s + g.padIds.length, 0)} silent pads aim at them)`);
    for (const g of r.emptySlots) lines.push(`  ${g.slotName}: ${g.labels.join(", ")}`);
  }
  lines.push("", "Pads");
  for (const p of r.pads) {
    const at = p.row !== null ? `r${p.row}c${p.col}` : (p.zone ?? p.padId);
    lines.push(`  ${String(p.note).padStart(3)} ch${String(p.channel).padEnd(2)} ${at.padEnd(14)} ${p.label.padEnd(20)} ${p.requested ?? "-"} -> ${describe(p)}`);
  }
  if (r.pedal) {
    lines.push("", `Hi-hat pedal (CC${r.pedal.controller}, closed at ${r.pedal.closedAt})`);
    for (const z of r.pedal.zones) lines.push(`  ${String(z.low).padStart(3)}-${String(z.high).padEnd(3)} ${z.requested} -> ${describe(z)}`);
    if (r.pedal.uncovered.length) lines.push(`  uncovered controller values: ${r.pedal.uncovered.map((u) => `${u.low}-${u.high}`).join(" ")}`);
    if (r.pedal.chick) lines.push(`  chick note ${r.pedal.chick.note} -> ${describe(r.pedal.chick)}`);
  }
  lines.push("", r.score.formula);
  return lines.join("\n") + "\n";
}

export async function run(args: string[]): Promise<number> {
  const warn = (s: string) => void process.stderr.write(`kitwright audit: ${s}\n`);
  try {
    const opts = parseArgs(args);
    if (opts === "help") {
      process.stdout.write(USAGE);
      return 0;
    }
    // the --strokes file first: a bad one stops the audit before anything is read or written
    const given = opts.strokes ? await readStrokeFile(opts.strokes) : [];
    const layout = await loadLayout(opts.layout, given);
    const kitFile = opts.kit ? parseKitFile(await readJson(opts.kit, "kit"), { strokes: given }) : null;
    const strokes = mergeStrokes(layout.strokes, kitFile?.strokes, given);
    const catalogue = await loadCatalogue(opts.catalogue, warn, strokes);
    const kit: Kit = kitFile ?? buildDefaultKit(layout, catalogue);
    const result = runAudit(layout, kit, catalogue, { strokes });
    if (opts.format === "text") process.stdout.write(formatText(result));
    else {
      const out = EXPORT_FORMATS.find((f) => f.id === opts.format)!.serialize(result);
      // text ends with a line break (CSV has its CRLF; JSON gets one)
      process.stdout.write(typeof out === "string" && !out.endsWith("\n") ? out + "\n" : out);
    }
    for (const f of opts.files) await writeFile(f.path, f.format.serialize(result));
    return hasSilentPads(result) ? 1 : 0;
  } catch (e) {
    if (e instanceof UsageError || e instanceof SchemaError || e instanceof StrokeFileError) {
      process.stderr.write(`kitwright audit: ${e.message}\n\n${e instanceof UsageError ? USAGE : ""}`);
      return 2;
    }
    throw e;
  }
}
