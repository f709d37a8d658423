// The upload figures alone, without touching bench/RESULTS.md: for trying a change to the upload path or the
// server's settings. `npm run bench:upload -- [next|serve] [GB]` (default: next, 2). Prints one JSON line.
// With KW_BENCH_NODE_FLAGS, KW_BENCH_TRACE_GC and KW_BENCH_SERVER_LOG as described in bench/upload.ts.
import { benchEnv } from "./env";
import { runUploadBench } from "./upload";

const via = process.argv[2] === "serve" ? "serve" : "next";
const gb = Number(process.argv[3] ?? 2);
void runUploadBench(benchEnv(), { totalBytes: Math.round(gb * 1024 ** 3), via, port: via === "next" ? 3471 : 3470 }).then((u) => console.log(JSON.stringify(u)));
