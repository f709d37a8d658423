import "server-only";
// Who is on the other end of a request. Forwarding headers (X-Forwarded-For, X-Forwarded-Host) are written by
// whoever sends the request, so they are believed only when the request came from a proxy we were told to
// trust (KW_TRUSTED_PROXIES, empty by default). The address the request actually came from is the socket's
// peer: the web server's guard (scripts/serve-guard.cjs) writes it into a header of its own on every request,
// replacing anything a client sent under that name, and names that header in KW_PEER_HEADER.
import net from "node:net";
import { env } from "./env";

type HeaderBag = Headers | Record<string, string | string[] | undefined> | undefined;

function header(h: HeaderBag, name: string): string | null {
  if (!h) return null;
  if (typeof (h as Headers).get === "function") return (h as Headers).get(name);
  const v = (h as Record<string, string | string[] | undefined>)[name.toLowerCase()];
  return (Array.isArray(v) ? v.join(",") : v) ?? null;
}

/** "::ffff:10.0.0.1" -> "10.0.0.1"; trims; null when it is not an IP address. */
export function normaliseIp(raw: string | null | undefined): string | null {
  const v = (raw ?? "").trim().replace(/^\[(.*)\]$/, "$1");
  const plain = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(v)?.[1] ?? v;
  return net.isIP(plain) ? plain.toLowerCase() : null;
}

/** A list of addresses and CIDR ranges ("10.0.0.1, 192.168.0.0/16, ::1") as a matcher. */
export function proxyMatcher(list: string): (ip: string) => boolean {
  const block = new net.BlockList();
  for (const item of list.split(",").map((s) => s.trim()).filter(Boolean)) {
    const [addr, bits] = item.split("/");
    const ip = normaliseIp(addr);
    if (!ip) throw new Error(`KW_TRUSTED_PROXIES: "${item}" is not an IP address or range`);
    const type = net.isIPv6(ip) ? "ipv6" : "ipv4";
    if (bits === undefined) block.addAddress(ip, type);
    else block.addSubnet(ip, Number(bits), type);
  }
  return (ip) => block.check(ip, net.isIPv6(ip) ? "ipv6" : "ipv4");
}

export interface AddressConfig {
  /** The header the server's guard writes the socket's peer into (KW_PEER_HEADER); none: not known. */
  peerHeader?: string;
  trusted: (ip: string) => boolean;
}

let cachedConfig: AddressConfig | undefined;
function config(): AddressConfig {
  if (!cachedConfig) {
    const e = env();
    cachedConfig = { peerHeader: e.KW_PEER_HEADER, trusted: proxyMatcher(e.KW_TRUSTED_PROXIES) };
  }
  return cachedConfig;
}

/** The socket's peer, when the server's guard recorded it. */
export function peerAddress(h: HeaderBag, c: AddressConfig = config()): string | null {
  return c.peerHeader ? normaliseIp(header(h, c.peerHeader)) : null;
}

/** Whether the request came straight from a trusted proxy (so its forwarding headers can be believed). */
export function fromTrustedProxy(h: HeaderBag, c: AddressConfig = config()): boolean {
  const peer = peerAddress(h, c);
  return !!peer && c.trusted(peer);
}

/**
 * The client's address: the socket's peer, or, while that is a trusted proxy, the address it says it forwarded
 * for (X-Forwarded-For is read from the right: each hop appends the address it received from, so only the
 * entries added by trusted proxies can be believed; the first untrusted one is the client). "unknown" when the
 * server did not record the peer (a development server without the guard).
 */
export function clientAddress(h: HeaderBag, c: AddressConfig = config()): string {
  const peer = peerAddress(h, c);
  if (!peer) return "unknown";
  let addr = peer;
  const hops = (header(h, "x-forwarded-for") ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  while (c.trusted(addr) && hops.length) {
    const next = normaliseIp(hops.pop());
    if (!next) break;
    addr = next;
  }
  return addr;
}

/** The host the client asked for: X-Forwarded-Host from a trusted proxy, else the Host header. */
export function requestHost(h: HeaderBag, c: AddressConfig = config()): string | null {
  const forwarded = header(h, "x-forwarded-host")?.split(",")[0]?.trim();
  return forwarded && fromTrustedProxy(h, c) ? forwarded : header(h, "host");
}
