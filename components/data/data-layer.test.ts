// The client's one data layer, checked on the sources (a lint, not a style guide). Outside components/data no
// file under components/ or app/ (route handlers aside) calls fetch or XMLHttpRequest, spells a query key as an
// array literal, calls TanStack Query's hooks, or spells an API address; inside it, only api.ts calls fetch,
// only uploads.ts uses XMLHttpRequest and only paths.ts spells addresses. Every address of paths.ts names a
// route under app/api. lib/api-types holds types only, importing nothing at run time.
// These are the project's own rules (DEVELOPERS.md, "Client data"), no published source.
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { paths } from "./paths";

const ROOT = path.resolve(import.meta.dirname, "../..");

interface Rule {
  name: string;
  pattern: RegExp;
  /** Files (relative to the repository, "/" separators) where the pattern may appear. */
  allowedIn: (file: string) => boolean;
}

const inData = (f: string) => f.startsWith("components/data/");

export const RULES: Rule[] = [
  { name: "calls fetch", pattern: /(?<![\w$])fetch\s*\(/, allowedIn: (f) => f === "components/data/api.ts" },
  { name: "uses XMLHttpRequest", pattern: /\bXMLHttpRequest\b/, allowedIn: (f) => f === "components/data/uploads.ts" },
  { name: "spells a query key literal", pattern: /queryKey\s*:\s*\[/, allowedIn: () => false },
  {
    name: "calls a TanStack Query hook",
    pattern: /\buse(?:Query|Queries|SuspenseQuery|InfiniteQuery|Mutation|QueryClient|IsFetching|IsMutating|MutationState)\s*[(<]/,
    allowedIn: inData,
  },
  { name: "spells an API address", pattern: /["'`]\/api\//, allowedIn: (f) => f === "components/data/paths.ts" },
];

/** The source without comments (block, JSX and line comments; "://" in addresses is kept). */
export function stripComments(src: string): string {
  return src.replace(/\/\*[\s\S]*?\*\//g, "").replace(/(^|[^:\\])\/\/.*$/gm, "$1");
}

/** The rules a file breaks, as "file: rule (line n)". */
export function violations(file: string, src: string): string[] {
  const out: string[] = [];
  const lines = stripComments(src).split("\n");
  for (const rule of RULES) {
    if (rule.allowedIn(file)) continue;
    lines.forEach((line, i) => {
      if (rule.pattern.test(line)) out.push(`${file}: ${rule.name} (line ${i + 1})`);
    });
  }
  return out;
}

function walk(dir: string, keep: (rel: string) => boolean): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(path.join(ROOT, dir), { withFileTypes: true })) {
    const rel = `${dir}/${e.name}`;
    if (e.isDirectory()) out.push(...walk(rel, keep));
    else if (keep(rel)) out.push(rel);
  }
  return out;
}

const isSource = (f: string) => /\.(ts|tsx)$/.test(f) && !/\.test\.tsx?$/.test(f);
const clientFiles = () => [...walk("components", isSource), ...walk("app", (f) => isSource(f) && !f.startsWith("app/api/"))];
const read = (f: string) => fs.readFileSync(path.join(ROOT, f), "utf8");

describe("the lint itself", () => {
  it("finds each kind of bypass in a component, and none in comments or in the data layer's own files", () => {
    const component = [
      'const r = await fetch("/x");',
      "const b = await window.fetch(url);",
      'useQuery({ queryKey: ["samples", id], queryFn });',
      "const qc = useQueryClient();",
      "const m = useMutation<Out, Error, In>({ mutationFn });",
      "const url = `/api/studios/${id}`;",
      "const x = new XMLHttpRequest();",
    ].join("\n");
    expect(violations("components/library/x.tsx", component)).toEqual([
      "components/library/x.tsx: calls fetch (line 1)",
      "components/library/x.tsx: calls fetch (line 2)",
      "components/library/x.tsx: uses XMLHttpRequest (line 7)",
      "components/library/x.tsx: spells a query key literal (line 3)",
      "components/library/x.tsx: calls a TanStack Query hook (line 3)",
      "components/library/x.tsx: calls a TanStack Query hook (line 4)",
      "components/library/x.tsx: calls a TanStack Query hook (line 5)",
      "components/library/x.tsx: spells an API address (line 6)",
    ]);
    expect(violations("app/(app)/s/[studioId]/page.tsx", 'const a = "/api/studios";')).toEqual(["app/(app)/s/[studioId]/page.tsx: spells an API address (line 1)"]);
    const commented = "// components never call fetch( or spell queryKey: [\n/* nor fetch(x) */\n{/* fetch(y) */}\nconst site = \"https://example.test/api/\";";
    expect(violations("components/a.tsx", commented)).toEqual([]);
    // a name that merely ends in "fetch" is not a call of fetch
    expect(violations("components/a.tsx", "const r = await prefetch(x); refetch();")).toEqual([]);
    // inside the data layer: hooks anywhere; fetch only in api.ts, addresses only in paths.ts, query keys never as literals
    expect(violations("components/data/samples.ts", "useQuery({ queryKey: sampleKeys.page(l, s), queryFn });")).toEqual([]);
    expect(violations("components/data/samples.ts", "await fetch(u);")).toEqual(["components/data/samples.ts: calls fetch (line 1)"]);
    expect(violations("components/data/samples.ts", 'useQuery({ queryKey: ["sample", id] });')).toEqual(["components/data/samples.ts: spells a query key literal (line 1)"]);
    expect(violations("components/data/api.ts", "await fetch(u);")).toEqual([]);
  });
});

describe("components and pages use the data layer", () => {
  it("no file under components/ or app/ (route handlers aside) bypasses components/data", () => {
    const files = clientFiles();
    // the scan reads the real tree (so it cannot pass by reading nothing)
    expect(files).toEqual(expect.arrayContaining(["components/library/samples-browser.tsx", "components/library/uploader.tsx", "components/data/api.ts", "app/(app)/s/[studioId]/audits/[auditId]/page.tsx"]));
    expect(files.some((f) => f.startsWith("app/api/"))).toBe(false);
    expect(files.flatMap((f) => violations(f, read(f)))).toEqual([]);
  });

  it("every hooks module keeps its query keys as functions (no key is spelled where it is used)", () => {
    const hooks = walk("components/data", isSource).filter((f) => !["components/data/api.ts", "components/data/paths.ts"].includes(f));
    expect(hooks.length).toBeGreaterThanOrEqual(12);
    for (const f of hooks) {
      const src = stripComments(read(f));
      if (!/\buse(?:Query|Mutation)\s*\(/.test(src)) continue;
      // each module that reads or writes declares `export const <name>Keys = {` or uses another module's keys
      expect(/export const \w+Keys = \{/.test(src) || /import \{[^}]*\w+Keys[^}]*\} from "\.\/\w+"/.test(src), `${f} has no query keys`).toBe(true);
    }
  });
});

describe("paths.ts names real routes", () => {
  /** Each app/api/**\/route.ts as a pattern over the request path ([x] one segment, [...x] one or more). */
  const routes = walk("app/api", (f) => f.endsWith("/route.ts")).map((f) => {
    const dir = f.slice("app".length, -"/route.ts".length);
    const re = dir.split("/").map((seg) => (/^\[\.\.\.\w+\]$/.test(seg) ? ".+" : /^\[\w+\]$/.test(seg) ? "[^/]+" : seg.replace(/[.*+?^${}()|[\]\\]/g, "\\$&"))).join("/");
    return { file: f, re: new RegExp(`^${re}$`) };
  });

  it("reads the route tree", () => {
    expect(routes.length).toBeGreaterThan(30);
    expect(routes.find((r) => r.file === "app/api/studios/[studioId]/libraries/[libraryId]/samples/[sampleId]/audio/route.ts")?.re.test("/api/studios/s/libraries/l/samples/x/audio")).toBe(true);
    expect(routes.some((r) => r.re.test("/api/studios/s/libraries/l/sample/x"))).toBe(false);
  });

  it("every address the browser uses has a route", () => {
    const entries = Object.entries(paths);
    expect(entries.length).toBeGreaterThan(40);
    for (const [name, fn] of entries) {
      const args = Array.from({ length: fn.length }, (_, i) => `p${i}`);
      const url = (fn as (...a: string[]) => string)(...args);
      const bare = url.split("?")[0]!;
      expect(routes.some((r) => r.re.test(bare)), `paths.${name}() = ${url} names no route under app/api`).toBe(true);
    }
  });

  it("query parts are written only when given", () => {
    expect(paths.audits("s")).toBe("/api/studios/s/audits");
    expect(paths.audits("s", "l")).toBe("/api/studios/s/audits?layoutId=l");
    expect(paths.auditExport("s", "a", "csv")).toBe("/api/studios/s/audits/a/export?format=csv");
    expect(paths.samples("s", "l", "")).toBe("/api/studios/s/libraries/l/samples");
    expect(paths.samples("s", "l", "page=2&q=snare")).toBe("/api/studios/s/libraries/l/samples?page=2&q=snare");
  });
});

describe("lib/api-types is shared by server and browser", () => {
  it("holds types only and imports nothing server-side", () => {
    const files = walk("lib/api-types", isSource);
    expect(files.length).toBeGreaterThanOrEqual(10);
    for (const f of files) {
      const src = stripComments(read(f));
      const imports = src.match(/^\s*(?:import|export)\b[^;]*?\bfrom\s+"[^"]+"/gm) ?? [];
      for (const line of imports) {
        expect(/^\s*(?:import|export) type\b/.test(line), `${f}: "${line.trim()}" is not a type-only import`).toBe(true);
        expect(/from "(?:@\/lib\/server|server-only|node:|next|react)/.test(line), `${f}: "${line.trim()}" reaches server or framework code`).toBe(false);
      }
      // no values: every top-level declaration is a type or an interface
      expect(src.match(/^export (?:const|let|var|function|class|enum|default)\b.*$/gm) ?? [], f).toEqual([]);
    }
  });
});
