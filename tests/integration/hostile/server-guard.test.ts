// The web server's guard (scripts/serve-guard.cjs, preloaded by scripts/serve-app.sh in front of `next start`):
// TRACE is answered 405 before Next.js turns it into a Fetch Request (which throws for it: one of the Fetch
// standard's forbidden methods), and every request carries its socket's peer address in our
// own header, whatever the client sent under that name. Runs a real Node HTTP server with the preload in a
// child process (the browser tests check the same against the production server).
import { spawn, type ChildProcess } from "node:child_process";
import http from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

let child: ChildProcess;
let port = 0;

// a stand-in for Next: answers with the headers and environment it was given
const SERVER = `
const http = require("node:http");
const s = http.createServer((req, res) => res.end(JSON.stringify({ method: req.method, peer: req.headers[process.env.KW_PEER_HEADER], header: process.env.KW_PEER_HEADER })));
s.listen(0, "127.0.0.1", () => process.stdout.write("port " + s.address().port + "\\n"));
`;

beforeAll(async () => {
  child = spawn(process.execPath, ["--require", "./scripts/serve-guard-preload.cjs", "-e", SERVER], { stdio: ["ignore", "pipe", "inherit"] });
  port = await new Promise<number>((resolve, reject) => {
    child.stdout!.on("data", (d: Buffer) => {
      const m = /port (\d+)/.exec(String(d));
      if (m) resolve(Number(m[1]));
    });
    child.on("exit", (code) => reject(new Error(`guard server exited ${code}`)));
  });
});

afterAll(() => {
  child?.kill();
});

function send(method: string, headers: Record<string, string> = {}): Promise<{ status: number; headers: http.IncomingHttpHeaders; body: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request({ host: "127.0.0.1", port, method, path: "/api/health", headers }, (res) => {
      let body = "";
      res.on("data", (c) => (body += c));
      res.on("end", () => resolve({ status: res.statusCode!, headers: res.headers, body }));
    });
    req.on("error", reject);
    req.end();
  });
}

describe("the web server's guard", () => {
  it("TRACE gets 405 with Allow and a JSON reason (RFC 9110 sections 9.3.8, 15.5.6), never reaching the app", async () => {
    const r = await send("TRACE");
    expect(r.status).toBe(405);
    expect(r.headers.allow).toBe("GET, HEAD, POST, PUT, PATCH, DELETE, OPTIONS");
    expect(JSON.parse(r.body)).toEqual({ error: { code: "method-not-allowed", message: "The TRACE method is not served here." } });
    // TRACK is refused by Node's own parser, a 4xx all the same
    expect((await send("TRACK")).status).toBe(400);
  });

  it("other methods reach the app with the socket's address in the peer header, a forged value replaced", async () => {
    const r = await send("GET", { "x-kitwright-peer": "203.0.113.66", "x-forwarded-for": "203.0.113.66" });
    expect(r.status).toBe(200);
    expect(JSON.parse(r.body)).toEqual({ method: "GET", peer: "127.0.0.1", header: "x-kitwright-peer" });
  });
});
