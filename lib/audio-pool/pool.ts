// A pool of worker threads that run lib/audio's measureWav, so CPU-bound decoding uses every core and never
// blocks the caller's event loop (the worker process's BullMQ lock renewals, Redis and database; the CLI's
// reading of the next files). Used by the worker's measure jobs and by `kitwright measure | catalogue | audit`.
// Not in lib/audio, which stays pure: this module needs node:worker_threads. It imports nothing but
// lib/audio and Node built-ins, so the CLI can use it without importing workers/ or lib/server.
// A thread that dies is replaced and the measurements it held fail (the worker's job is retried).
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { measureWav, type MeasureOutcome, type MeasureWavOptions } from "../audio/measure-wav";

interface Pending { resolve: (r: MeasureOutcome) => void; reject: (e: Error) => void }
interface Slot { worker: Worker; busy: Map<number, Pending> }

const here = path.dirname(fileURLToPath(import.meta.url));

export class MeasurePool {
  private slots: Slot[] = [];
  private next = 0;
  private seq = 0;
  private closed = false;
  /** `size` threads (one per core by default); 0 measures on the calling thread. */
  constructor(readonly size = os.availableParallelism()) {
    for (let i = 0; i < size; i++) this.slots.push(this.spawn());
  }
  private spawn(): Slot {
    const worker = new Worker(path.join(here, "thread.mjs"));
    const slot: Slot = { worker, busy: new Map() };
    worker.on("message", (m: { id: number; result: MeasureOutcome }) => {
      const p = slot.busy.get(m.id);
      slot.busy.delete(m.id);
      p?.resolve(m.result);
    });
    const fail = (e: Error) => {
      for (const p of slot.busy.values()) p.reject(e);
      slot.busy.clear();
      const i = this.slots.indexOf(slot);
      if (i >= 0 && !this.closed) this.slots[i] = this.spawn();
    };
    worker.on("error", fail);
    worker.on("exit", (code) => code !== 0 && fail(new Error(`measuring thread exited with code ${code}`)));
    return slot;
  }
  /**
   * measureWav on the least busy thread. The bytes are handed over to that thread (their buffer is transferred
   * when the view covers all of it, else copied): do not use them afterwards.
   */
  measureWav(bytes: Uint8Array, opts: MeasureWavOptions = {}): Promise<MeasureOutcome> {
    if (this.size === 0) return Promise.resolve(measureWav(bytes, opts));
    let slot = this.slots[this.next++ % this.slots.length]!;
    for (const s of this.slots) if (s.busy.size < slot.busy.size) slot = s;
    const id = ++this.seq;
    return new Promise((resolve, reject) => {
      slot.busy.set(id, { resolve, reject });
      // a copy (new Uint8Array, not slice: Buffer's slice is a view) when the view shares its buffer
      const own = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? bytes : new Uint8Array(bytes);
      slot.worker.postMessage({ id, bytes: own, opts }, [own.buffer as ArrayBuffer]);
    });
  }
  async close(): Promise<void> {
    this.closed = true;
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }
}
