// What the three commands share: the one folder walk (which files are WAVs, in which order) and measuring a
// list of files on every core (lib/audio-pool: the worker threads the worker process uses too), in order.
import os from "node:os";
import { readdir, stat } from "node:fs/promises";
import path from "node:path";
import { MeasurePool } from "../lib/audio-pool/pool";

/** A WAV file by its name: .wav, .wave, or .bwf (Broadcast Wave, EBU Tech 3285: a RIFF/WAVE file). */
export const WAV_NAME = /\.(wav|wave|bwf)$/i;

/**
 * The WAV files under `target`, a folder walked depth first with its entries in localeCompare order, hidden
 * entries (".name") skipped; or `target` itself when it is a file (named explicitly, so taken whatever its
 * name). Appends to `out` as it goes; throws when `target` or a folder inside cannot be read (what was found
 * before stays in `out`).
 */
export async function findWavs(target: string, out: string[] = []): Promise<string[]> {
  const walk = async (dir: string) => {
    const entries = (await readdir(dir, { withFileTypes: true })).sort((a, b) => a.name.localeCompare(b.name));
    for (const e of entries) {
      if (e.name.startsWith(".")) continue;
      const p = path.join(dir, e.name);
      if (e.isDirectory()) await walk(p);
      else if (WAV_NAME.test(e.name)) out.push(p);
    }
  };
  if ((await stat(target)).isDirectory()) await walk(target);
  else out.push(target);
  return out;
}

/** A pool for measuring `count` files: one thread per core, no more threads than files. */
export function poolFor(count: number): MeasurePool {
  return new MeasurePool(Math.max(1, Math.min(os.availableParallelism(), count)));
}

/**
 * Runs `work` on every item with at most `limit` at once and hands the results to `emit` in the items' order,
 * each as soon as it and all before it are done (so output streams in order while the threads stay busy).
 */
export async function inOrder<T, R>(items: readonly T[], limit: number, work: (item: T, i: number) => Promise<R>, emit: (r: R, i: number) => void): Promise<R[]> {
  const results: R[] = new Array(items.length);
  const done: boolean[] = new Array(items.length).fill(false);
  let next = 0;
  let emitted = 0;
  const lane = async () => {
    while (next < items.length) {
      const i = next++;
      results[i] = await work(items[i]!, i);
      done[i] = true;
      while (emitted < items.length && done[emitted]) emit(results[emitted]!, emitted++);
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, Math.min(limit, items.length)) }, lane));
  return results;
}
