// Worker-thread entry of the measuring pool: receives { id, bytes }, answers { id, result }.
import { parentPort } from "node:worker_threads";
import { measureFile } from "./measure-core";

parentPort!.on("message", (msg: { id: number; bytes: Uint8Array }) => {
  const result = measureFile(msg.bytes);
  parentPort!.postMessage({ id: msg.id, result });
});
