// A small pool of worker threads for measuring, so CPU-bound decoding never blocks the worker's event loop
// (BullMQ lock renewals, Redis, the database). A thread that dies is replaced and its job fails (retried).
import os from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { measureFile, type MeasureResult } from "./measure-core";

interface Pending { resolve: (r: MeasureResult) => void; reject: (e: Error) => void }
interface Slot { worker: Worker; busy: Map<number, Pending> }

const here = path.dirname(fileURLToPath(import.meta.url));

export class MeasurePool {
  private slots: Slot[] = [];
  private next = 0;
  private seq = 0;
  constructor(readonly size = os.availableParallelism()) {
    for (let i = 0; i < size; i++) this.slots.push(this.spawn());
  }
  private spawn(): Slot {
    const worker = new Worker(path.join(here, "measure-thread.mjs"));
    const slot: Slot = { worker, busy: new Map() };
    worker.on("message", (m: { id: number; result: MeasureResult }) => {
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
  private closed = false;
  measure(bytes: Uint8Array): Promise<MeasureResult> {
    if (this.size === 0) return Promise.resolve(measureFile(bytes));
    // least busy thread
    let slot = this.slots[this.next++ % this.slots.length]!;
    for (const s of this.slots) if (s.busy.size < slot.busy.size) slot = s;
    const id = ++this.seq;
    return new Promise((resolve, reject) => {
      slot.busy.set(id, { resolve, reject });
      const own = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength ? bytes : bytes.slice();
      slot.worker.postMessage({ id, bytes: own }, [own.buffer as ArrayBuffer]);
    });
  }
  async close(): Promise<void> {
    this.closed = true;
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }
}
