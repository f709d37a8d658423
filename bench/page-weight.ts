// Page weight from the production build output (.next): the JavaScript a page ships, gzip-compressed.
// A page's JS = the root main files of the build (framework and runtime, shared by every page) plus every chunk
// named by the page's client reference manifest (client components of the page and its layouts) and its entry
// files. Each file is counted once and gzipped at level 9 (node:zlib), as a server with gzip on would send it.
import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";
import vm from "node:vm";

export interface PageWeight { page: string; files: number; rawKb: number; gzipKb: number; sharedGzipKb: number; ownGzipKb: number }

function manifestFor(nextDir: string, page: string): { chunks: string[] } {
  const file = path.join(nextDir, "server/app", `${page}_client-reference-manifest.js`);
  const ctx: { globalThis: Record<string, unknown> } = { globalThis: {} };
  vm.runInNewContext(fs.readFileSync(file, "utf8"), ctx);
  const all = (ctx.globalThis.__RSC_MANIFEST as Record<string, { clientModules: Record<string, { chunks: string[] }>; entryJSFiles?: Record<string, string[]> }>)[page];
  if (!all) throw new Error(`no client manifest for ${page}`);
  const chunks = new Set<string>();
  for (const m of Object.values(all.clientModules)) for (const c of m.chunks) if (c.endsWith(".js")) chunks.add(c.replace(/^\/_next\//, ""));
  for (const list of Object.values(all.entryJSFiles ?? {})) for (const c of list) if (c.endsWith(".js")) chunks.add(c.replace(/^\/_next\//, ""));
  return { chunks: [...chunks] };
}

export function pageWeight(page: string, nextDir = path.resolve(".next")): PageWeight {
  const build = JSON.parse(fs.readFileSync(path.join(nextDir, "server/app", page, "build-manifest.json"), "utf8")) as { rootMainFiles: string[] };
  const shared = new Set(build.rootMainFiles.filter((f) => f.endsWith(".js")));
  const own = new Set(manifestFor(nextDir, page).chunks.filter((c) => !shared.has(c)));
  const size = (f: string) => {
    const b = fs.readFileSync(path.join(nextDir, f));
    return { raw: b.length, gz: zlib.gzipSync(b, { level: 9 }).length };
  };
  let raw = 0, sharedGz = 0, ownGz = 0;
  for (const f of shared) { const s = size(f); raw += s.raw; sharedGz += s.gz; }
  for (const f of own) { const s = size(f); raw += s.raw; ownGz += s.gz; }
  const kb = (n: number) => Math.round(n / 102.4) / 10;
  return { page, files: shared.size + own.size, rawKb: kb(raw), gzipKb: kb(sharedGz + ownGz), sharedGzipKb: kb(sharedGz), ownGzipKb: kb(ownGz) };
}

if (process.argv[1] && process.argv[1].endsWith("page-weight.ts")) {
  for (const p of process.argv.slice(2)) console.log(JSON.stringify(pageWeight(p)));
}
