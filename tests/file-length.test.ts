// Big mixed files are hard to find one's way in: a source file under lib/ or components/ longer than 300 lines
// says why at its top, in a line "// Over 300 lines: <reason>" (generated data says so the same way).
// Our own rule, no published source.
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const ROOT = path.resolve(__dirname, "..");
const LIMIT = 300;
const REASON = /^\/\/ Over 300 lines: \S.{9,}/;

function sources(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sources(p));
    else if (/\.(ts|tsx|mjs|cjs|js)$/.test(e.name)) out.push(p);
  }
  return out;
}

describe("file length", () => {
  it("every file of lib/ and components/ over 300 lines states its reason at its top", () => {
    const unexplained: string[] = [];
    let long = 0;
    for (const f of [...sources(path.join(ROOT, "lib")), ...sources(path.join(ROOT, "components"))]) {
      const lines = fs.readFileSync(f, "utf8").split("\n");
      if (lines.at(-1) === "") lines.pop();
      if (lines.length <= LIMIT) continue;
      long++;
      if (!lines.slice(0, 3).some((l) => REASON.test(l))) unexplained.push(`${path.relative(ROOT, f)} (${lines.length} lines)`);
    }
    expect(long).toBeGreaterThan(0); // the walk found the long files there are
    expect(unexplained).toEqual([]);
  });
});
