// The client address from a connection (ASVS 5.0.0 15.3.4): the TCP peer unless the peer is a
// listed trusted proxy, then the right-most forwarded address that is not a trusted proxy.
import { describe, expect, it } from "vitest";
import { normaliseAddress, parseTrustedProxies, requestWasHttps, resolveClientAddress, UNKNOWN_ADDRESS } from "@/lib/http/client-address";
import { limiterAddress } from "@/lib/http/client-ip";

const none = parseTrustedProxies("");
const lb = parseTrustedProxies("10.0.0.0/8, 192.0.2.10, 2001:db8:ffff::/48");

describe("resolveClientAddress", () => {
  it("with no trusted proxy, is the TCP peer whatever the headers say", () => {
    for (const xff of ["203.0.113.5", "1.2.3.4, 5.6.7.8", "", undefined]) {
      expect(resolveClientAddress({ peer: "198.51.100.7", forwardedFor: xff, proxies: none })).toBe("198.51.100.7");
    }
  });

  it("ignores the header of a peer that is not a listed proxy", () => {
    expect(resolveClientAddress({ peer: "198.51.100.7", forwardedFor: "203.0.113.5", proxies: lb })).toBe("198.51.100.7");
  });

  it("from a listed proxy, takes the address it appended", () => {
    expect(resolveClientAddress({ peer: "10.1.2.3", forwardedFor: "203.0.113.5", proxies: lb })).toBe("203.0.113.5");
  });

  it("takes the right-most address that is not a trusted proxy; what the client wrote to its left is ignored", () => {
    // The client sent "X-Forwarded-For: 1.1.1.1"; the edge proxy appended the real peer, an inner proxy its own peer.
    expect(resolveClientAddress({ peer: "10.0.0.2", forwardedFor: "1.1.1.1, 203.0.113.5, 10.0.0.1", proxies: lb })).toBe("203.0.113.5");
    expect(resolveClientAddress({ peer: "192.0.2.10", forwardedFor: ["1.1.1.1", "203.0.113.9"], proxies: lb })).toBe("203.0.113.9");
  });

  it("stops at a garbled entry and keeps the last address a trusted proxy vouched for", () => {
    expect(resolveClientAddress({ peer: "10.0.0.2", forwardedFor: "not-an-address, 10.0.0.1", proxies: lb })).toBe("10.0.0.1");
    expect(resolveClientAddress({ peer: "10.0.0.2", forwardedFor: "", proxies: lb })).toBe("10.0.0.2");
  });

  it("reads IPv4-mapped IPv6 peers and IPv6 proxies", () => {
    expect(resolveClientAddress({ peer: "::ffff:10.0.0.9", forwardedFor: "203.0.113.5", proxies: lb })).toBe("203.0.113.5");
    expect(resolveClientAddress({ peer: "2001:db8:ffff::1", forwardedFor: "[2001:db8:1::5]:4431", proxies: lb })).toBe("2001:db8:1::5");
  });

  it("has no address without a peer", () => {
    expect(resolveClientAddress({ peer: undefined, forwardedFor: "203.0.113.5", proxies: lb })).toBe(UNKNOWN_ADDRESS);
  });
});

describe("parseTrustedProxies", () => {
  it("refuses an entry that is not an address or range, so a typo cannot trust everybody", () => {
    expect(() => parseTrustedProxies("10.0.0.0/8, lb.internal")).toThrow(/lb\.internal/);
    expect(() => parseTrustedProxies("10.0.0.0/33")).toThrow(/prefix/);
  });
});

describe("requestWasHttps", () => {
  it("believes X-Forwarded-Proto only from a trusted proxy, and only its right-most value", () => {
    expect(requestWasHttps({ peer: "10.0.0.1", encrypted: false, forwardedProto: "https", proxies: lb })).toBe(true);
    expect(requestWasHttps({ peer: "10.0.0.1", encrypted: false, forwardedProto: "https, http", proxies: lb })).toBe(false);
    expect(requestWasHttps({ peer: "198.51.100.7", encrypted: false, forwardedProto: "https", proxies: lb })).toBe(false);
    expect(requestWasHttps({ peer: "198.51.100.7", encrypted: true, forwardedProto: undefined, proxies: none })).toBe(true);
  });
});

describe("addresses", () => {
  it("normalises ports, brackets and mapped IPv4", () => {
    expect(normaliseAddress("203.0.113.5:5123")).toBe("203.0.113.5");
    expect(normaliseAddress("[2001:DB8::1]")).toBe("2001:db8::1");
    expect(normaliseAddress("::ffff:203.0.113.5")).toBe("203.0.113.5");
    expect(normaliseAddress("unknown")).toBeNull();
  });

  it("limits IPv6 clients by their /64, IPv4 by the address", () => {
    expect(limiterAddress("2001:db8:1:2:aaaa::1")).toBe(limiterAddress("2001:db8:1:2:bbbb:cccc:dddd:eeee"));
    expect(limiterAddress("2001:db8:1:2::1")).not.toBe(limiterAddress("2001:db8:1:3::1"));
    expect(limiterAddress("203.0.113.5")).toBe("203.0.113.5");
  });
});
