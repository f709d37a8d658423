// Layering, checked by a tool (dependency-cruiser, rules in .dependency-cruiser.cjs): the pure core imports
// only itself and its listed packages, lib/server never imports up into workers/, components never import
// lib/server (they read lib/api-types), the CLI runs without the server, nothing but workers/ imports
// workers/. First the repository itself must have no violation; then a small tree built here, with one breach
// of each rule, must be caught rule by rule (so the check cannot pass by seeing nothing).
import { execFile } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { afterAll, describe, expect, it } from "vitest";

const run = promisify(execFile);
const ROOT = path.resolve(import.meta.dirname, "..");
const BIN = path.join(ROOT, "node_modules/dependency-cruiser/bin/dependency-cruise.mjs");
const CONFIG = path.join(ROOT, ".dependency-cruiser.cjs");

interface Violation { rule: { name: string }; from: string; to: string }

async function cruise(cwd: string, dirs: string[]): Promise<{ violations: Violation[]; modules: number }> {
  let stdout: string;
  try {
    ({ stdout } = await run(process.execPath, [BIN, "--config", CONFIG, "--output-type", "json", ...dirs], { cwd, maxBuffer: 256 * 1024 * 1024 }));
  } catch (e) {
    // exit code = number of errors; the report is still on stdout
    stdout = (e as { stdout: string }).stdout;
  }
  const r = JSON.parse(stdout) as { summary: { violations: Violation[]; totalCruised: number } };
  return { violations: r.summary.violations, modules: r.summary.totalCruised };
}

let tmp: string | null = null;
afterAll(() => tmp && fs.rmSync(tmp, { recursive: true, force: true }));

describe("layering (dependency-cruiser)", () => {
  it("the repository has no import that breaks a layer", async () => {
    const dirs = ["app", "components", "lib", "workers", "cli", "db", "scripts", "bench", "tests"].filter((d) => fs.existsSync(path.join(ROOT, d)));
    const { violations, modules } = await cruise(ROOT, dirs);
    expect(modules).toBeGreaterThan(200);
    expect(violations.map((v) => `${v.rule.name}: ${v.from} -> ${v.to}`)).toEqual([]);
  }, 180_000);

  it("each rule catches its breach in a tree made for it", async () => {
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), "kw-layers-"));
    const files: Record<string, string> = {
      "tsconfig.json": JSON.stringify({ compilerOptions: { strict: true, module: "esnext", moduleResolution: "bundler" } }),
      "lib/catalogue/ok.ts": 'import { a } from "../audit/ok";\nexport const c = a;\n', // allowed: core to core
      "lib/audit/ok.ts": "export const a = 1;\n",
      "lib/audio/uses-fs.ts": 'import fs from "node:fs";\nexport const f = fs;\n',
      "lib/audio/uses-server.ts": 'import { s } from "../server/s";\nexport const x = s;\n',
      "lib/audit/uses-knex.ts": 'import knex from "knex";\nexport const k = knex;\n',
      "lib/catalogue/ok.test.ts": 'import { s } from "../server/s";\nexport const t = s;\n',
      "lib/server/s.ts": 'import { w } from "../../workers/w";\nexport const s = w;\n',
      "workers/w.ts": "export const w = 1;\n",
      "components/c.tsx": 'import type { S } from "../lib/server/types";\nexport const c: S | null = null;\n',
      "lib/server/types.ts": "export type S = string;\n",
      "cli/x.ts": 'import { s } from "../lib/server/s";\nexport const x = s;\n',
      "lib/audio-pool/p.ts": 'import { c } from "../catalogue/ok";\nexport const p = c;\n',
      "lib/synth/s.ts": 'import { s } from "../server/s";\nexport const y = s;\n',
      "lib/api-types/t.ts": 'import type { S } from "../server/types";\nexport type T = S;\n',
      "lib/api-types/ok.ts": "export type A = { id: string };\n",
      "components/uses-api-types.tsx": 'import type { A } from "../lib/api-types/ok";\nexport const u: A | null = null;\n', // allowed
      "components/c.test.ts": 'import { s } from "../lib/server/s";\nexport const t = s;\n',
      "components/reads-errors.test.ts": 'import { e } from "../lib/server/errors";\nexport const t = e;\n', // allowed
      "lib/server/errors.ts": "export const e = 1;\n",
    };
    for (const [f, text] of Object.entries(files)) {
      fs.mkdirSync(path.join(tmp, path.dirname(f)), { recursive: true });
      fs.writeFileSync(path.join(tmp, f), text);
    }
    const { violations } = await cruise(tmp, ["lib", "workers", "components", "cli"]);
    const got = new Set(violations.map((v) => `${v.rule.name}: ${v.from} -> ${v.to}`));
    for (const want of [
      "pure-core-imports-only-core: lib/audio/uses-fs.ts -> fs",
      "pure-core-imports-only-core: lib/audio/uses-server.ts -> lib/server/s.ts",
      "pure-core-imports-only-core: lib/audit/uses-knex.ts -> knex",
      "pure-core-tests-stay-out-of-the-server: lib/catalogue/ok.test.ts -> lib/server/s.ts",
      "server-never-imports-up: lib/server/s.ts -> workers/w.ts",
      "components-not-server: components/c.tsx -> lib/server/types.ts",
      "component-tests-only-the-error-door: components/c.test.ts -> lib/server/s.ts",
      "cli-without-server: cli/x.ts -> lib/server/s.ts",
      "only-workers-import-workers: lib/server/s.ts -> workers/w.ts",
      "audio-pool-imports-audio-and-node-only: lib/audio-pool/p.ts -> lib/catalogue/ok.ts",
      "synth-is-pure: lib/synth/s.ts -> lib/server/s.ts",
      "types-are-neutral: lib/api-types/t.ts -> lib/server/types.ts",
    ]) expect(got, want).toContain(want);
    // core to core is allowed, and so are components reading the shared request and answer types
    expect([...got].some((g) => g.includes("lib/catalogue/ok.ts -> lib/audit/ok.ts"))).toBe(false);
    expect([...got].some((g) => g.includes("components/uses-api-types.tsx"))).toBe(false);
    // a component's test may read the server's error answers, and only those
    expect([...got].some((g) => g.includes("components/reads-errors.test.ts"))).toBe(false);
  }, 120_000);
});
