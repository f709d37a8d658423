// Which folders may import which (dependency-cruiser 17). Checked by tests/layering.test.ts (unit project,
// so by `scripts/test.sh`), or by hand: npx depcruise app components lib workers cli db scripts bench tests --config .dependency-cruiser.cjs
//
//   lib/audio, lib/catalogue, lib/audit   the pure core: each other and their listed packages only, no Node built-in
//   lib/synth                           pure too: the core and itself
//   lib/audio-pool                      lib/audio, Node built-ins and tsx (its thread bootstrap) only
//   lib/api-types                       request/answer types for server and client: types only (data-layer.test.ts),
//                                       importing the pure core, lib/validation, lib/permissions and zod at most
//   lib/server                          anything but workers/, cli/, app/, components/
//   components/                         never lib/server (types they draw live in lib/api-types); their tests
//                                       may read lib/server/errors.ts (the error answers the client must read)
//   cli/                                never lib/server, workers/, app/, components/
//   workers/                            only wiring; nothing outside workers/ imports it
//
// Test files (*.test.ts and the test-*.ts helpers beside them) of the pure folders may also use test packages,
// Node built-ins and lib/synth, but nothing of the server, the workers, the app or the CLI.

/** Packages the pure core may use (package.json dependencies). */
const PURE_PACKAGES = ["wavefile", "music-metadata", "meyda", "fft.js", "simple-statistics", "ml-random-forest", "munkres-js", "zod"];
const pkg = (names) => `^node_modules/(${names.map((n) => n.replace(/[.]/g, "\\.")).join("|")})/`;
const TEST_FILE = "(\\.test\\.ts|/test-[a-z-]+\\.ts)$";
const PURE = "^lib/(audio|catalogue|audit)/";
const OUTSIDE_CORE = "^(lib/server|lib/audio-pool|workers|app|components|cli|db)/";

module.exports = {
  forbidden: [
    {
      name: "pure-core-imports-only-core",
      comment: "lib/audio, lib/catalogue and lib/audit import each other and their listed packages only (no Node built-in, no framework, no server)",
      severity: "error",
      from: { path: PURE, pathNot: TEST_FILE },
      to: { pathNot: ["^lib/(audio|catalogue|audit)/", pkg(PURE_PACKAGES)] },
    },
    {
      name: "pure-core-tests-stay-out-of-the-server",
      comment: "tests of the pure core may use test packages, Node built-ins and lib/synth, never the server, workers, app or CLI",
      severity: "error",
      from: { path: PURE },
      to: { path: OUTSIDE_CORE },
    },
    {
      name: "synth-is-pure",
      comment: "lib/synth (the demo and test synthesizer) imports the pure core and itself only",
      severity: "error",
      from: { path: "^lib/synth/", pathNot: TEST_FILE },
      to: { pathNot: ["^lib/(audio|catalogue|audit|synth)/"] },
    },
    {
      name: "audio-pool-imports-audio-and-node-only",
      comment: "lib/audio-pool (measuring threads, shared by the worker and the CLI) imports lib/audio, Node built-ins and tsx only",
      severity: "error",
      from: { path: "^lib/audio-pool/", pathNot: TEST_FILE },
      to: { pathNot: ["^lib/(audio|audio-pool)/", pkg(["tsx"])], dependencyTypesNot: ["core"] },
    },
    {
      name: "types-are-neutral",
      comment: "lib/api-types holds the request and answer shapes both server and client import: it imports the pure core, lib/validation, lib/permissions and zod at most, never the server",
      severity: "error",
      from: { path: "^lib/api-types/" },
      to: { pathNot: ["^lib/(audio|catalogue|audit|api-types|validation)/", "^lib/permissions\\.ts$", pkg(["zod"])] },
    },
    {
      name: "server-never-imports-up",
      comment: "lib/server is the bottom of the app: it never imports workers/, cli/, app/ or components/",
      severity: "error",
      from: { path: "^lib/" },
      to: { path: "^(workers|cli|app|components)/" },
    },
    {
      name: "only-workers-import-workers",
      comment: "workers/ only wires processes together: nothing outside it imports it",
      severity: "error",
      from: { pathNot: "^workers/" },
      to: { path: "^workers/" },
    },
    {
      name: "components-not-server",
      comment: "client components never import lib/server (not even its types: those live in lib/api-types)",
      severity: "error",
      from: { path: "^components/", pathNot: TEST_FILE },
      to: { path: "^lib/server/" },
    },
    {
      name: "component-tests-only-the-error-door",
      comment: "tests of components/ may import lib/server/errors.ts (to read the answers the server's door really writes), nothing else of lib/server",
      severity: "error",
      from: { path: `^components/.*${TEST_FILE}` },
      to: { path: "^lib/server/", pathNot: "^lib/server/errors\\.ts$" },
    },
    {
      name: "cli-without-server",
      comment: "the command line runs without the database: no lib/server, workers/, app/ or components/",
      severity: "error",
      from: { path: "^cli/" },
      to: { path: "^(lib/server|workers|app|components)/" },
    },
  ],
  options: {
    // type-only imports count too: a type is a dependency of the design even if the compiler erases it
    tsPreCompilationDeps: true,
    tsConfig: { fileName: "tsconfig.json" },
    doNotFollow: { path: "node_modules" },
    exclude: { path: "^(\\.next|\\.data|\\.run)/" },
    enhancedResolveOptions: { exportsFields: ["exports"], conditionNames: ["import", "require", "node", "default", "types"], extensions: [".ts", ".tsx", ".mjs", ".js", ".cjs", ".json"] },
  },
};
