#!/usr/bin/env node
// Entry point of `npx kitwright <command>`: loads the TypeScript CLI through tsx's CommonJS loader.
import { createRequire } from "node:module";
import { register } from "tsx/cjs/api";
register();
const require = createRequire(import.meta.url);
const { main } = require("../cli/main.ts");
process.exitCode = await main(process.argv.slice(2));
