import { defineConfig } from "vitest/config";
import path from "node:path";

const alias = { "@": path.resolve(import.meta.dirname), "server-only": path.resolve(import.meta.dirname, "tests/server-only-stub.ts") };

export default defineConfig({
  resolve: { alias },
  test: {
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
