import { defineConfig } from "vitest/config";
import { BaseSequencer, type TestSpecification } from "vitest/node";
import path from "node:path";
import { availableParallelism } from "node:os";

/**
 * Files known to take minutes start first. Vitest orders files by the timings of earlier runs; a fresh clone has
 * none, so it ran them in glob order and the sound model's floors test (5 minutes, one core) started last and ran
 * alone while the other core idled. Everything else keeps Vitest's own order.
 */
const LONG_FIRST = ["scripts/sound-model/floors.test.ts", "lib/catalogue/demo-faults.test.ts", "lib/audit/demo-audits.test.ts", "cli/cli.test.ts", "cli/strokes.test.ts"];
class LongFirst extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const sorted = await super.sort(files);
    const rank = (f: TestSpecification) => {
      const i = LONG_FIRST.indexOf(path.relative(import.meta.dirname, f.moduleId).split(path.sep).join("/"));
      return i < 0 ? LONG_FIRST.length : i;
    };
    return sorted.map((f, i) => ({ f, i })).sort((a, b) => rank(a.f) - rank(b.f) || a.i - b.i).map(({ f }) => f);
  }
}

const alias = { "@": path.resolve(import.meta.dirname), "server-only": path.resolve(import.meta.dirname, "tests/server-only-stub.ts") };

export default defineConfig({
  resolve: { alias },
  test: {
    sequence: { sequencer: LongFirst },
    // Vitest's default is one worker fewer than the cores: one worker on a 2-core machine, so the unit files ran one
    // at a time. The unit files are CPU-bound and independent; one per core. (Integration, scale and browser files
    // run one at a time anyway: fileParallelism false.)
    maxWorkers: Math.max(2, availableParallelism()),
    projects: [
      {
        resolve: { alias },
        test: { name: "unit", include: ["lib/**/*.test.ts", "components/**/*.test.ts", "workers/**/*.test.ts", "scripts/**/*.test.ts", "cli/**/*.test.ts", "tests/layering.test.ts", "tests/file-length.test.ts"], environment: "node", testTimeout: 30_000 },
      },
      {
        resolve: { alias },
        test: {
          name: "integration",
          include: ["tests/integration/**/*.test.ts"],
          environment: "node",
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
          globalSetup: ["tests/integration/global-setup.ts"],
        },
      },
      {
        // several app and worker processes on loopback (tests/scale): needs a production build, run after it
        resolve: { alias },
        test: {
          name: "scale",
          include: ["tests/scale/**/*.test.ts"],
          environment: "node",
          testTimeout: 600_000,
          hookTimeout: 3_600_000,
          fileParallelism: false,
        },
      },
      {
        resolve: { alias },
        test: {
          name: "e2e",
          include: ["tests/e2e/**/*.test.ts"],
          environment: "node",
          testTimeout: 120_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
