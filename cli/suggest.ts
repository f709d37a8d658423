// kitwright suggest --surface <rows>x<cols> | --zones <"kick head,snare head,..."> --catalogue <folder | catalogue.json>
//                   [--kit <kit.json>] [--strokes <strokes.json>] [--stand-ins] [--name <name>] [--channel <1-16>]
// Suggests a layout for a pad surface and a kit (lib/audit/suggest.ts) and prints it as a Kitwright layout
// file (kitwright.layout/v2) on standard output; the reason for every pad, and what did not fit, go to
// standard error. Without --kit, the kit holds every instrument of the catalogue. The studio's own strokes (the
// kit file's, then --strokes) sort a catalogued folder's names; the layout carries those it aims at.

import { buildDefaultKit } from "../lib/audit/kits";
import { MAX_GRID_PADS, MAX_ZONE_PADS, layoutToFile, parseKitFile, SchemaError } from "../lib/audit/schema";
import { suggestLayout, type SuggestSurface } from "../lib/audit/suggest";
import type { Kit } from "../lib/audit/types";
import { loadCatalogue, readJson, UsageError } from "./audit";
import { readStrokeFile, StrokeFileError, STROKES_HELP, STROKES_USAGE } from "./strokes";
import { mergeStrokes } from "../lib/catalogue/strokes";

const USAGE = `usage: kitwright suggest (--surface <rows>x<cols> | --zones <zone,zone,...>) --catalogue <folder | catalogue.json>
                         [--kit <kit.json>] [${STROKES_USAGE}] [--stand-ins] [--name <name>] [--channel <1-16>]

Prints a suggested layout (a kitwright.layout/v2 file) for a grid of pads or a list of named trigger zones,
with the reason for each pad on standard error. Without --kit the kit holds every catalogued instrument.
  --stand-ins   also place a main strike the kit never recorded, marked as a stand-in
${STROKES_HELP}
exit status: 0 everything placed, 1 some strokes did not fit (listed), 2 bad input
`;

interface Options {
  surface: SuggestSurface;
  catalogue: string;
  kit: string | null;
  strokes: string | null;
  standIns: boolean;
  name: string | null;
  channel: number;
}

/** "4x6" (also "4×6", "4 x 6") as rows and columns; throws a usage error otherwise. */
export function parseSurface(text: string): SuggestSurface {
  const m = /^\s*(\d{1,2})\s*[x×]\s*(\d{1,2})\s*$/i.exec(text);
  if (!m) throw new UsageError(`--surface ${text}: write rows x columns, e.g. 4x6`);
  const rows = Number(m[1]);
  const cols = Number(m[2]);
  if (rows < 1 || cols < 1 || rows * cols > MAX_GRID_PADS) throw new UsageError(`--surface ${text}: a grid holds 1 to ${MAX_GRID_PADS} pads`);
  return { kind: "grid", rows, cols };
}

function parseArgs(args: string[]): Options | "help" {
  let surface: SuggestSurface | null = null;
  const o: Omit<Options, "surface" | "catalogue"> & { catalogue?: string } = { kit: null, strokes: null, standIns: false, name: null, channel: 10 };
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    const value = () => {
      const v = args[++i];
      if (v === undefined || v.startsWith("--")) throw new UsageError(`${a} needs a value`);
      return v;
    };
    if (a === "--help" || a === "-h") return "help";
    else if (a === "--surface") surface = parseSurface(value());
    else if (a === "--zones") {
      const zones = value().split(",").map((z) => z.trim()).filter(Boolean);
      if (zones.length === 0 || zones.length > MAX_ZONE_PADS) throw new UsageError(`--zones: give 1 to ${MAX_ZONE_PADS} zone names, separated by commas`);
      surface = { kind: "zones", zones };
    } else if (a === "--catalogue" || a === "--catalog") o.catalogue = value();
    else if (a === "--kit") o.kit = value();
    else if (a === "--strokes") o.strokes = value();
    else if (a === "--stand-ins") o.standIns = true;
    else if (a === "--name") o.name = value();
    else if (a === "--channel") {
      const c = Number(value());
      if (!Number.isInteger(c) || c < 1 || c > 16) throw new UsageError("--channel: a MIDI channel from 1 to 16");
      o.channel = c;
    } else throw new UsageError(`unknown option ${a}`);
  }
  if (!surface) throw new UsageError("give --surface <rows>x<cols> or --zones <names>");
  if (!o.catalogue) throw new UsageError("--catalogue is required");
  return { ...o, surface, catalogue: o.catalogue };
}

export async function run(args: string[]): Promise<number> {
  const warn = (s: string) => void process.stderr.write(`kitwright suggest: ${s}\n`);
  try {
    const opts = parseArgs(args);
    if (opts === "help") {
      process.stdout.write(USAGE);
      return 0;
    }
    // the --strokes file first: a bad one stops before anything is read or written
    const given = opts.strokes ? await readStrokeFile(opts.strokes) : [];
    const kitFile = opts.kit ? parseKitFile(await readJson(opts.kit, "kit"), { strokes: given }) : null;
    const strokes = mergeStrokes(kitFile?.strokes, given);
    const catalogue = await loadCatalogue(opts.catalogue, warn, strokes);
    const kit: Kit =
      kitFile ??
      buildDefaultKit({ id: "all", name: "all", surface: { kind: "zones" }, pads: [], hiHatPedal: null, slots: [] }, catalogue, "Every catalogued instrument");
    const s = suggestLayout(opts.surface, kit, catalogue, { standIns: opts.standIns, channel: opts.channel, strokes, ...(opts.name ? { name: opts.name } : {}) });
    process.stdout.write(JSON.stringify(layoutToFile(s.layout, strokes), null, 2) + "\n");
    for (const p of s.placements) warn(`${p.padId}: ${p.reason}`);
    for (const l of s.leftOut) warn(`not placed: ${l.slotId ? `${l.slotId} ${l.articulation}: ` : ""}${l.reason}`);
    return s.leftOut.length ? 1 : 0;
  } catch (e) {
    if (e instanceof UsageError || e instanceof SchemaError || e instanceof StrokeFileError) {
      process.stderr.write(`kitwright suggest: ${e.message}\n\n${e instanceof UsageError ? USAGE : ""}`);
      return 2;
    }
    throw e;
  }
}
