// Which address a request came from, and which forwarding headers count. X-Forwarded-For is a list each proxy
// appends the address it received from to (de-facto standard; RFC 7239 section 5.2 describes the same for
// Forwarded: "for"), so it is read from the right and believed only as far as the hops are trusted proxies.
import { describe, expect, it } from "vitest";
import { clientAddress, fromTrustedProxy, normaliseIp, proxyMatcher, requestHost, type AddressConfig } from "./client-address";

const PEER = "x-kitwright-peer";
const direct: AddressConfig = { peerHeader: PEER, trusted: proxyMatcher("") };
const behindProxy: AddressConfig = { peerHeader: PEER, trusted: proxyMatcher("10.0.0.5, 192.168.1.0/24, ::1") };

describe("client address", () => {
  it("with no trusted proxy the socket's peer is the client, whatever X-Forwarded-For says", () => {
    for (const xff of ["1.2.3.4", "1.2.3.4, 5.6.7.8", "", "not an ip"]) {
      expect(clientAddress(new Headers({ [PEER]: "203.0.113.7", "x-forwarded-for": xff }), direct)).toBe("203.0.113.7");
    }
  });

  it("behind trusted proxies the last untrusted hop is the client; a value the client wrote first is ignored", () => {
    // client 198.51.100.9 forged "1.1.1.1"; proxy 192.168.1.20 appended the client; proxy 10.0.0.5 appended 192.168.1.20
    const h = new Headers({ [PEER]: "10.0.0.5", "x-forwarded-for": "1.1.1.1, 198.51.100.9, 192.168.1.20" });
    expect(clientAddress(h, behindProxy)).toBe("198.51.100.9");
    // an untrusted peer's header is not read at all
    expect(clientAddress(new Headers({ [PEER]: "198.51.100.9", "x-forwarded-for": "10.0.0.5" }), behindProxy)).toBe("198.51.100.9");
  });

  it("IPv4-mapped IPv6 peers are the IPv4 address (RFC 4291 section 2.5.5.2)", () => {
    expect(normaliseIp("::ffff:192.168.1.4")).toBe("192.168.1.4");
    expect(clientAddress({ [PEER]: "::ffff:10.0.0.5", "x-forwarded-for": "203.0.113.1" }, behindProxy)).toBe("203.0.113.1");
    expect(normaliseIp("[::1]")).toBe("::1");
    expect(normaliseIp("localhost")).toBeNull();
  });

  it("without the server's record of the peer the address is unknown (X-Forwarded-For alone is never believed)", () => {
    expect(clientAddress(new Headers({ "x-forwarded-for": "1.2.3.4" }), { trusted: proxyMatcher("") })).toBe("unknown");
    // every hop trusted: the leftmost address is the best there is (Next fills X-Forwarded-For with the peer
    // when the request brought none)
    expect(clientAddress(new Headers({ "x-forwarded-for": "1.2.3.4", [PEER]: "1.2.3.4" }), { peerHeader: PEER, trusted: proxyMatcher("0.0.0.0/0") })).toBe("1.2.3.4");
  });

  it("X-Forwarded-Host counts only from a trusted proxy", () => {
    const h = (peer: string) => new Headers({ host: "kitwright.local:3000", "x-forwarded-host": "evil.example", [PEER]: peer });
    expect(requestHost(h("203.0.113.7"), behindProxy)).toBe("kitwright.local:3000");
    expect(requestHost(h("10.0.0.5"), behindProxy)).toBe("evil.example");
    expect(fromTrustedProxy(h("10.0.0.5"), direct)).toBe(false);
  });

  it("a setting that is not an address is refused when read", () => {
    expect(() => proxyMatcher("10.0.0.1, proxy.internal")).toThrow(/proxy\.internal/);
  });
});
