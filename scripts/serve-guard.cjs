// What must happen to a request before Next.js sees it, installed into the web server's process by
// scripts/serve-guard-preload.cjs (scripts/serve-app.sh starts `next start` with it):
// - TRACE is answered 405 here. Next.js makes a Fetch-standard Request of every request, and the Fetch standard
//   forbids the method: it came back as a 500. It is not ours to serve (it would echo the request back,
//   RFC 9110 section 9.3.8). Node itself refuses TRACK (400) and closes a CONNECT that no "connect" listener
//   takes, so neither reaches Next.
// - The socket's peer address is written into our own header on every request, replacing whatever a client
//   sent under that name, and the header's name is given to the app (KW_PEER_HEADER), so that it can tell a
//   trusted proxy's forwarding headers from a client's (lib/server/client-address.ts).
"use strict";
const http = require("node:http");

const PEER_HEADER = "x-kitwright-peer";
const REFUSED = new Set(["TRACE"]);
const ALLOW = "GET, HEAD, POST, PUT, PATCH, DELETE, OPTIONS";

/** Handles the request itself when it must not reach the app (returns true), else marks it and returns false. */
function guard(req, res) {
  req.headers[PEER_HEADER] = (req.socket && req.socket.remoteAddress) || "";
  if (!REFUSED.has(req.method)) return false;
  const body = JSON.stringify({ error: { code: "method-not-allowed", message: `The ${req.method} method is not served here.` } });
  res.writeHead(405, { allow: ALLOW, "content-type": "application/json", "content-length": Buffer.byteLength(body), "cache-control": "no-store", connection: "close" });
  res.end(body);
  req.resume();
  return true;
}

let installed = false;
/** Puts the guard in front of every HTTP server of this process. */
function install() {
  if (installed) return;
  installed = true;
  process.env.KW_PEER_HEADER = PEER_HEADER;
  const emit = http.Server.prototype.emit;
  http.Server.prototype.emit = function guardedEmit(event, ...args) {
    if (event === "request" && guard(args[0], args[1])) return true;
    return emit.call(this, event, ...args);
  };
}

module.exports = { guard, install, PEER_HEADER };
