// npx tsx tests/hostile/run-corpus.ts [--count 10000] [--seed 1] [--index N]
// Runs the full hostile corpus through the decoder and prints counts per outcome, per refusal code and per
// kind of damage, the worst time per file, and any problem (a throw, an "error" instead of a refusal, a
// measurement that is not plain JSON, an undamaged file refused). Exit code 1 when a problem was found.
// --index N replays one file and prints its outcome (for debugging a reported index).
import os from "node:os";
import { measureWav } from "../../lib/audio/index";
import { mutant } from "./mutate";
import { runCorpus } from "./corpus";

const arg = (name: string, d: number) => {
  const i = process.argv.indexOf(name);
  return i >= 0 ? Number(process.argv[i + 1]) : d;
};
const count = arg("--count", 10_000);
const seed = arg("--seed", 1);
const one = arg("--index", -1);

if (one >= 0) {
  const m = mutant(one, seed);
  const r = measureWav(m.bytes);
  console.log(m.name, m.bytes.length, "bytes", r.ok ? "measured" : `refused ${r.code}: ${r.reason}`);
  process.exit(0);
}

const load = os.loadavg().map((x) => x.toFixed(2)).join(" ");
const t0 = performance.now();
const s = runCorpus(count, seed, (n) => process.stderr.write(`  ${n} files\n`));
const wall = (performance.now() - t0) / 1000;
console.log(`hostile corpus: ${s.count} files, seed ${s.seed}, ${wall.toFixed(1)} s wall, load average at start ${load}`);
console.log(`measured ${s.measured}, refused ${s.refused} (with a code and a reason)`);
console.log(`refusals by code: ${Object.entries(s.byCode).sort((a, b) => b[1] - a[1]).map(([k, v]) => `${k} ${v}`).join(", ")}`);
console.log("by kind of damage (measured / refused):");
for (const [k, v] of Object.entries(s.byKind)) console.log(`  ${k.padEnd(18)} ${String(v.measured).padStart(5)} / ${String(v.refused).padStart(5)}`);
console.log(`time per file: mean ${(s.totalMs / s.count).toFixed(2)} ms, worst ${s.maxMs.toFixed(1)} ms (index ${s.maxMsIndex})`);
console.log(`problems: ${s.problems.length}`);
for (const p of s.problems.slice(0, 30)) console.log(`  #${p.index} ${p.kind}: ${p.problem}`);
process.exit(s.problems.length ? 1 : 0);
