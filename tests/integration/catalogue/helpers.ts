// Test helpers of the catalogue tests: small generated WAVs (RIFF/WAVE written by lib/audio's encoder), broken
// files, multipart bodies, zip packs (stored or deflated, written by hand per the PKZIP APPNOTE 4.3 layout),
// and a real worker process.
import { spawn, type ChildProcess } from "node:child_process";
import { zipOf as writeZip } from "@/tests/hostile/zip";
import { encodeWav } from "@/lib/audio/encode";
import { db } from "@/lib/server/db";

/** A decaying noisy drum-like hit, 0.2 s mono 16-bit 44.1 kHz; `seed` makes every file's bytes different. */
export function hitWav(seed: number, opts: { seconds?: number; gain?: number; freq?: number } = {}): Uint8Array {
  const fs = 44_100;
  const n = Math.round((opts.seconds ?? 0.2) * fs);
  const x = new Float32Array(n);
  let s = (seed * 2654435761) >>> 0 || 1;
  const rnd = () => ((s = (s * 1664525 + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
  const g = opts.gain ?? 0.5;
  const f = opts.freq ?? 180;
  for (let i = 0; i < n; i++) {
    const t = i / fs;
    x[i] = g * Math.exp(-t * 18) * (0.6 * Math.sin(2 * Math.PI * f * t) + 0.4 * rnd());
  }
  return encodeWav([x], { sampleRate: fs, bits: 16 });
}

/** RIFF/WAVE magic with a fmt chunk that says 0 channels: passes the upload check, refused by the decoder. */
export function badHeaderWav(seed: number): Uint8Array {
  const b = hitWav(seed);
  const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
  v.setUint16(22, 0, true); // channels = 0
  return b;
}

/** An RF64 file header (EBU Tech 3306) followed by junk. */
export function rf64(seed: number): Uint8Array {
  const b = hitWav(seed);
  b.set([0x52, 0x46, 0x36, 0x34], 0); // "RF64"
  return b;
}

export function notWav(seed: number): Uint8Array {
  return new TextEncoder().encode(`this is a text file pretending to be audio #${seed}\n`.repeat(20));
}

export async function multipart(files: { name: string; data: Uint8Array }[]): Promise<{ body: Uint8Array; type: string }> {
  const fd = new FormData();
  for (const f of files) fd.append("file", new Blob([f.data as BlobPart]), f.name);
  const r = new Request("http://localhost/", { method: "POST", body: fd });
  return { body: new Uint8Array(await r.arrayBuffer()), type: r.headers.get("content-type")! };
}

/** A zip pack (deflate, or stored) of the given entries; names are written as given (even with ".."). */
export function zipOf(entries: { name: string; data: Uint8Array; deflate?: boolean }[]): Uint8Array {
  return writeZip(entries.map((e) => ({ name: e.name, data: e.data, store: e.deflate === false })));
}

/** Starts the real worker process (workers/main.ts) with the test environment. */
export function startWorker(log: string[] = []): ChildProcess {
  const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "workers/main.ts"], { env: { ...process.env, KW_MEASURE_THREADS: "2" }, stdio: ["ignore", "pipe", "pipe"] });
  child.stdout!.on("data", (d) => log.push(String(d)));
  child.stderr!.on("data", (d) => log.push(String(d)));
  return child;
}

export async function waitForReady(log: string[], timeoutMs = 30_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (log.join("").includes("[worker] ready")) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`worker did not start:\n${log.join("")}`);
}

export async function stateCounts(libraryId: string): Promise<Record<string, number>> {
  const rows = await db()("samples").where({ library_id: libraryId }).groupBy("state").select("state").count({ n: "*" });
  const out: Record<string, number> = { queued: 0, measuring: 0, measured: 0, catalogued: 0, rejected: 0 };
  for (const r of rows as { state: string; n: number }[]) out[r.state] = Number(r.n);
  return out;
}

export async function waitFor<T>(fn: () => Promise<T>, ok: (v: T) => boolean, timeoutMs: number, what: string): Promise<T> {
  const end = Date.now() + timeoutMs;
  let v = await fn();
  while (!ok(v)) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}: ${JSON.stringify(v)}`);
    await new Promise((r) => setTimeout(r, 250));
    v = await fn();
  }
  return v;
}
