// A running app for tests that need one over HTTP (the command line's upload): an HTTP server on a free
// loopback port serving every route handler of app/api as Next.js would route it (found on disk, as the role
// matrix finds them; a static segment wins over a dynamic one), in this process, on the test services.
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import { Readable } from "node:stream";
import type { AddressInfo } from "node:net";
import { NextRequest } from "next/server";

type Handler = (req: NextRequest, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>;
interface Route { re: RegExp; keys: { name: string; many: boolean }[]; dynamic: number; mod: Record<string, unknown> }

const API = path.resolve("app/api");

function routeFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? routeFiles(p) : e.name === "route.ts" ? [p] : [];
  });
}

async function loadRoutes(): Promise<Route[]> {
  const routes: Route[] = [];
  for (const file of routeFiles(API)) {
    const segs = path.relative(API, path.dirname(file)).split(path.sep);
    const keys: Route["keys"] = [];
    const re = segs.map((s) => {
      const many = /^\[\.\.\.(\w+)\]$/.exec(s);
      const one = /^\[(\w+)\]$/.exec(s);
      if (many) keys.push({ name: many[1]!, many: true });
      else if (one) keys.push({ name: one[1]!, many: false });
      return many ? "(.+)" : one ? "([^/]+)" : s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
    });
    routes.push({ re: new RegExp(`^/api/${re.join("/")}$`), keys, dynamic: keys.length, mod: (await import(/* @vite-ignore */ file)) as Record<string, unknown> });
  }
  return routes.sort((a, b) => a.dynamic - b.dynamic);
}

export interface RunningApp {
  url: string;
  close(): Promise<void>;
}

export async function startRouteServer(): Promise<RunningApp> {
  const routes = await loadRoutes();
  const server = http.createServer(async (req, res) => {
    try {
      const url = new URL(req.url ?? "/", `http://${req.headers.host}`);
      const hit = routes.map((r) => ({ r, m: r.re.exec(url.pathname) })).find((x) => x.m);
      const handler = hit?.r.mod[req.method ?? "GET"] as Handler | undefined;
      if (!hit || !handler) {
        res.writeHead(404, { "content-type": "text/html" }).end("<h1>404</h1>");
        return;
      }
      const params = Object.fromEntries(hit.r.keys.map((k, j) => {
        const v = decodeURIComponent(hit.m![j + 1]!);
        return [k.name, k.many ? v.split("/") : v];
      }));
      const headers = new Headers();
      for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers.set(k, v);
      const hasBody = req.method !== "GET" && req.method !== "HEAD";
      const nreq = new NextRequest(url, { method: req.method, headers, body: hasBody ? (Readable.toWeb(req) as ReadableStream<Uint8Array>) : undefined, duplex: "half" } as ConstructorParameters<typeof NextRequest>[1]);
      const out = await handler(nreq, { params: Promise.resolve(params) });
      res.writeHead(out.status, Object.fromEntries(out.headers.entries()));
      res.end(Buffer.from(await out.arrayBuffer()));
    } catch (e) {
      if (!res.headersSent) res.writeHead(599, { "content-type": "text/plain" });
      res.end(`route-server: ${(e as Error).stack}`);
    }
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () => new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    }),
  };
}
