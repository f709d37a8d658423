import { afterAll, describe, expect, it } from "vitest";
import { encodeWav, measureWav } from "../audio";
import { hit } from "../audio/signals";
import { MeasurePool } from "./pool";

// The pool must give exactly what measureWav gives on the calling thread (the worker and the CLI rely on it).
const files = [110, 180, 260].map((f, i) => encodeWav([hit(48000, 0.6, { f, tau: 0.08, leadSec: 0.004, seed: i + 1 })], { sampleRate: 48000, bits: 24 }));
const pool = new MeasurePool(2);
afterAll(() => pool.close());

describe("MeasurePool (measureWav on worker threads)", () => {
  it("answers each file with the same outcome as measureWav inline, options included", async () => {
    const inline = files.map((b) => measureWav(b, { crossCheck: true }));
    const threaded = await Promise.all(files.map((b) => pool.measureWav(b.slice(), { crossCheck: true })));
    expect(threaded).toEqual(inline);
    expect(threaded.every((r) => r.ok)).toBe(true);
  });

  it("passes refusals through with their code, and options such as maxSeconds", async () => {
    expect(await pool.measureWav(new Uint8Array([1, 2, 3]))).toMatchObject({ ok: false, code: "not-riff", final: true });
    expect(await pool.measureWav(files[0]!.slice(), { maxSeconds: 0.1 })).toMatchObject({ ok: false, code: "too-long", final: true });
  });

  it("hands a whole buffer over to the thread (transferred, not copied) and copies a partial view", async () => {
    const whole = files[1]!.slice();
    const p = pool.measureWav(whole);
    expect(whole.byteLength).toBe(0); // detached by the transfer
    expect((await p).ok).toBe(true);
    const backing = new Uint8Array(files[1]!.length + 8);
    backing.set(files[1]!, 8);
    const view = backing.subarray(8);
    expect((await pool.measureWav(view)).ok).toBe(true);
    expect(view.byteLength).toBe(files[1]!.length);
  });

  it("size 0 measures on the calling thread", async () => {
    const none = new MeasurePool(0);
    expect(await none.measureWav(files[2]!)).toEqual(measureWav(files[2]!));
    await none.close();
  });
});

describe("MeasurePool with Node Buffers", () => {
  it("copies a small Buffer that sits in Node's shared allocation pool instead of taking the pool away", async () => {
    const small = encodeWav([new Float32Array(400).fill(0.25)], { sampleRate: 8000, bits: 16 });
    const buf = Buffer.from(small); // under 4 KB: a view into Node's shared slab
    expect(buf.byteLength).toBeLessThan(buf.buffer.byteLength);
    const p2 = new MeasurePool(1);
    try {
      expect(await p2.measureWav(buf)).toEqual(measureWav(small));
      expect(Buffer.from("still usable").toString()).toBe("still usable");
      expect(buf.byteLength).toBe(small.byteLength);
    } finally {
      await p2.close();
    }
  });
});
