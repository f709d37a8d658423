// Writes the demo library (Harbour Lane Session Kit, an invented scenario) to a folder as WAV files.
// Usage: npx tsx scripts/generate-demo-library.ts <outdir> [--seed N]
// The same seed always gives the same bytes.

import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { renderScenarioFile } from "../lib/synth/render";
import { DEMO_FAULTS, DEMO_LIBRARY, demoScenario, type DemoFault, type ScenarioFile } from "../lib/synth/scenario";

export interface GenerateDemoOptions {
  seed?: number;
  /** only generate files for which this returns true (faults included only if their files pass) */
  filter?: (f: ScenarioFile) => boolean;
  /** called after each file is written */
  onFile?: (f: ScenarioFile, index: number, total: number) => void;
}

export interface GenerateDemoSummary {
  outdir: string;
  studio: string;
  library: string;
  files: number;
  bytes: number;
  seconds: number;
  byInstrument: Record<string, number>;
  faults: readonly DemoFault[];
  written: { path: string; bytes: number }[];
}

export function generateDemoLibrary(outdir: string, opts: GenerateDemoOptions = {}): GenerateDemoSummary {
  const t0 = Date.now();
  mkdirSync(outdir, { recursive: true }); // fail before any rendering if the folder cannot be made
  const all = demoScenario({ seed: opts.seed ?? 1 });
  const files = opts.filter ? all.filter(opts.filter) : all;
  const byPath = new Map(all.map((f) => [f.path, f]));
  const cache = new Map<string, Uint8Array>(); // originals of duplicates
  const dupSources = new Set(files.filter((f) => f.duplicateOf).map((f) => f.duplicateOf as string));
  const byInstrument: Record<string, number> = {};
  const written: { path: string; bytes: number }[] = [];
  let bytes = 0;
  files.forEach((f, i) => {
    let data: Uint8Array;
    if (f.duplicateOf) {
      const src = cache.get(f.duplicateOf) ?? renderScenarioFile(byPath.get(f.duplicateOf) as ScenarioFile);
      data = src;
    } else {
      data = renderScenarioFile(f);
      if (dupSources.has(f.path)) cache.set(f.path, data);
    }
    const target = path.join(outdir, ...f.path.split("/"));
    mkdirSync(path.dirname(target), { recursive: true });
    writeFileSync(target, data);
    bytes += data.length;
    written.push({ path: f.path, bytes: data.length });
    const folder = f.path.split("/").slice(0, -1).join("/");
    byInstrument[folder] = (byInstrument[folder] ?? 0) + 1;
    opts.onFile?.(f, i, files.length);
  });
  const present = new Set(files.map((f) => f.path));
  const faults = DEMO_FAULTS.filter((x) => x.kind === "missing-layer" || present.has(x.path));
  return {
    outdir, studio: DEMO_LIBRARY.studio, library: DEMO_LIBRARY.library, files: files.length, bytes,
    seconds: (Date.now() - t0) / 1000, byInstrument, faults, written,
  };
}

function main(argv: string[]): void {
  const args = argv.slice(2);
  let seed = 1;
  const rest: string[] = [];
  for (let i = 0; i < args.length; i++) {
    if (args[i] === "--seed") {
      seed = Number(args[++i]);
      if (!Number.isInteger(seed)) {
        console.error("--seed needs an integer");
        process.exit(2);
      }
    } else rest.push(args[i]);
  }
  if (rest.length !== 1) {
    console.error("usage: npx tsx scripts/generate-demo-library.ts <outdir> [--seed N]");
    process.exit(2);
  }
  const outdir = path.resolve(rest[0]);
  let s: GenerateDemoSummary;
  try {
    s = generateDemoLibrary(outdir, {
      seed,
      onFile: (_f, i, n) => {
        if ((i + 1) % 25 === 0 || i + 1 === n) process.stderr.write(`  ${i + 1}/${n}\r`);
      },
    });
  } catch (e) {
    console.error(`could not write the demo library to ${outdir}: ${(e as Error).message}`);
    process.exit(1);
  }
  process.stderr.write("\n");
  console.log(`${s.studio} / ${s.library} (seed ${seed}) -> ${s.outdir}`);
  console.log(`${s.files} files, ${(s.bytes / 1048576).toFixed(1)} MiB, ${s.seconds.toFixed(1)} s`);
  for (const [folder, n] of Object.entries(s.byInstrument)) console.log(`  ${folder.padEnd(22)} ${n}`);
  console.log("deliberate faults:");
  for (const f of s.faults) console.log(`  ${f.kind.padEnd(14)} ${f.path}  (${f.detail})`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) main(process.argv);
