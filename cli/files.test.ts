// The CLI's one folder walk and its in-order runner. Which names are WAVs: .wav and .wave (RIFF/WAVE, the
// 1991 RIFF spec's own extension and a common variant) and .bwf (Broadcast Wave, EBU Tech 3285, also RIFF/WAVE).
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { findWavs, inOrder, WAV_NAME } from "./files";

let dir: string;
beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "kw-walk-"));
  for (const f of ["b/2.WAV", "b/1.wav", "a.bwf", "c.wave", "notes.txt", "d.wav.bak", ".hidden/x.wav", ".y.wav", "b/sub/3.wav"]) {
    fs.mkdirSync(path.join(dir, path.dirname(f)), { recursive: true });
    fs.writeFileSync(path.join(dir, f), "x");
  }
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe("findWavs (the one rule for which files are WAVs)", () => {
  it("walks depth first in localeCompare order, skips hidden entries and other extensions", async () => {
    const rel = (await findWavs(dir)).map((f) => path.relative(dir, f).split(path.sep).join("/"));
    expect(rel).toEqual(["a.bwf", "b/1.wav", "b/2.WAV", "b/sub/3.wav", "c.wave"]);
  });
  it("takes a file named explicitly whatever its name, and throws for a missing target", async () => {
    expect(await findWavs(path.join(dir, "notes.txt"))).toEqual([path.join(dir, "notes.txt")]);
    await expect(findWavs(path.join(dir, "nothing-here"))).rejects.toMatchObject({ code: "ENOENT" });
  });
  it("the name rule", () => {
    expect(["x.wav", "x.WAVE", "x.Bwf"].every((n) => WAV_NAME.test(n))).toBe(true);
    expect(["x.wav.part", "x.aiff", "x.w64", "wav"].some((n) => WAV_NAME.test(n))).toBe(false);
  });
});

describe("inOrder", () => {
  it("emits results in the items' order while running up to `limit` at once", async () => {
    let running = 0;
    let most = 0;
    const emitted: number[] = [];
    const delays = [30, 5, 20, 1, 15, 2];
    const out = await inOrder(
      delays,
      3,
      async (ms, i) => {
        running++;
        most = Math.max(most, running);
        await new Promise((r) => setTimeout(r, ms));
        running--;
        return i * 10;
      },
      (r) => emitted.push(r),
    );
    expect(out).toEqual([0, 10, 20, 30, 40, 50]);
    expect(emitted).toEqual([0, 10, 20, 30, 40, 50]);
    expect(most).toBe(3);
  });
});
