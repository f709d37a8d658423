// Bootstrap of a measuring thread: registers tsx's CommonJS loader in this thread (package.json has no "type",
// so .ts files load as CommonJS, as in bin/kitwright.mjs), then loads the entry. Works whether or not the
// parent process runs under `--import tsx` (the worker does, the CLI and vitest do not).
import { createRequire } from "node:module";
import { register } from "tsx/cjs/api";

register();
createRequire(import.meta.url)("./thread.ts");
