// A small HTTP server that serves the app's real route handlers (health, studios, libraries, samples,
// uploads) in its own process, with its own environment: the fault tests point it at a private MariaDB and
// Redis they can stop and start without touching the test profile's services.
// Run: node --conditions=react-server --import tsx tests/faults/serve.ts --port 34180
import http from "node:http";
import { Readable } from "node:stream";
import { NextRequest } from "next/server";
import * as health from "@/app/api/health/route";
import * as studios from "@/app/api/studios/route";
import * as libraries from "@/app/api/studios/[studioId]/libraries/route";
import * as samples from "@/app/api/studios/[studioId]/libraries/[libraryId]/samples/route";
import * as uploads from "@/app/api/studios/[studioId]/libraries/[libraryId]/uploads/route";

type Handler = (req: NextRequest, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
const ROUTES: { re: RegExp; keys: string[]; mod: Record<string, unknown> }[] = [
  { re: /^\/api\/health$/, keys: [], mod: health },
  { re: /^\/api\/studios$/, keys: [], mod: studios },
  { re: /^\/api\/studios\/([^/]+)\/libraries$/, keys: ["studioId"], mod: libraries },
  { re: /^\/api\/studios\/([^/]+)\/libraries\/([^/]+)\/samples$/, keys: ["studioId", "libraryId"], mod: samples },
  { re: /^\/api\/studios\/([^/]+)\/libraries\/([^/]+)\/uploads$/, keys: ["studioId", "libraryId"], mod: uploads },
];

const i = process.argv.indexOf("--port");
const port = i > 0 ? Number(process.argv[i + 1]) : 34180;

const server = http.createServer(async (req, res) => {
  try {
    const url = new URL(req.url ?? "/", `http://${req.headers.host}`);
    const hit = ROUTES.map((r) => ({ r, m: r.re.exec(url.pathname) })).find((x) => x.m);
    const handler = hit?.r.mod[req.method ?? "GET"] as Handler | undefined;
    if (!hit || !handler) {
      res.writeHead(404).end();
      return;
    }
    const params = Object.fromEntries(hit.r.keys.map((k, j) => [k, decodeURIComponent(hit.m![j + 1]!)]));
    const headers = new Headers();
    for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
    const hasBody = req.method !== "GET" && req.method !== "HEAD";
    const nreq = new NextRequest(url, { method: req.method, headers, body: hasBody ? (Readable.toWeb(req) as ReadableStream<Uint8Array>) : undefined, duplex: "half" } as ConstructorParameters<typeof NextRequest>[1]);
    const out = await handler(nreq, { params: Promise.resolve(params) });
    res.writeHead(out.status, Object.fromEntries(out.headers.entries()));
    res.end(Buffer.from(await out.arrayBuffer()));
  } catch (e) {
    res.writeHead(599, { "content-type": "text/plain" }).end(`serve.ts: ${(e as Error).stack}`);
  }
});
server.listen(port, "127.0.0.1", () => process.stdout.write(`[serve] listening on ${port}\n`));
process.on("SIGTERM", () => server.close(() => process.exit(0)));
