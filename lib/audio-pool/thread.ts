// Worker-thread entry of the measuring pool: receives { id, bytes, opts }, answers { id, result } (measureWav).
import { parentPort } from "node:worker_threads";
import { measureWav, type MeasureWavOptions } from "../audio/measure-wav";

parentPort!.on("message", (msg: { id: number; bytes: Uint8Array; opts?: MeasureWavOptions }) => {
  const result = measureWav(msg.bytes, msg.opts);
  parentPort!.postMessage({ id: msg.id, result });
});
