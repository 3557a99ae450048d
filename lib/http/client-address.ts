import "server-only";
// Working out the client's address from a connection (ASVS 5.0.0 15.3.4 / 2.4.1). Used by the
// server entry (scripts/server.ts) before Next.js sees the request; no other module reads a
// forwarding header. Pure: no Next.js, no database, no environment.
import { BlockList, isIP } from "node:net";

/** The header the server entry sets with the address it worked out, after removing any copy a client sent. */
export const CLIENT_ADDRESS_HEADER = "x-caddis-client-address";

/** What a request carries when it did not come through the server entry (one shared bucket for limits). */
export const UNKNOWN_ADDRESS = "unknown";

export type TrustedProxies = { list: BlockList; entries: string[] };

/**
 * A comma-separated list of addresses and CIDR ranges (`127.0.0.1, 10.0.0.0/8, ::1`). A bad entry
 * stops the server: a typo here would silently trust nobody, or everybody.
 */
export function parseTrustedProxies(value: string | undefined): TrustedProxies {
  const list = new BlockList();
  const entries = (value ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  for (const entry of entries) {
    const [address, prefix, extra] = entry.split("/");
    const family = isIP(address ?? "");
    if (!family || extra !== undefined) throw new Error(`TRUSTED_PROXIES: "${entry}" is not an address or CIDR range`);
    const type = family === 4 ? "ipv4" : "ipv6";
    if (prefix === undefined) {
      list.addAddress(address!, type);
      continue;
    }
    const bits = Number(prefix);
    if (!/^\d+$/.test(prefix) || bits > (family === 4 ? 32 : 128)) throw new Error(`TRUSTED_PROXIES: "${entry}" has a bad prefix length`);
    list.addSubnet(address!, bits, type);
  }
  return { list, entries };
}

/**
 * An address as a proxy or the socket gives it, in one form: without brackets or a port, and an
 * IPv4-mapped IPv6 address as plain IPv4. Null when it is not an address at all.
 */
export function normaliseAddress(raw: string | undefined | null): string | null {
  if (!raw) return null;
  let a = raw.trim();
  const bracketed = /^\[([^\]]+)\](?::\d+)?$/.exec(a);
  if (bracketed) a = bracketed[1]!;
  else if (/^\d{1,3}(\.\d{1,3}){3}:\d+$/.test(a)) a = a.slice(0, a.lastIndexOf(":"));
  const zone = a.indexOf("%");
  if (zone > 0) a = a.slice(0, zone);
  const mapped = /^::ffff:(\d{1,3}(\.\d{1,3}){3})$/i.exec(a);
  if (mapped) a = mapped[1]!;
  const family = isIP(a);
  if (!family) return null;
  return family === 6 ? a.toLowerCase() : a;
}

function isTrusted(address: string, proxies: TrustedProxies): boolean {
  return proxies.entries.length > 0 && proxies.list.check(address, isIP(address) === 4 ? "ipv4" : "ipv6");
}

/**
 * The client's address. With no trusted proxy, or a peer that is not one, it is the TCP peer and
 * every forwarding header is ignored. From a trusted proxy, the forwarding header is read from
 * the right (each proxy appends the address it saw) and the first address that is not itself a
 * trusted proxy is the client; anything to its left was written by the client and is ignored.
 * A garbled entry stops the walk at the last address a trusted proxy vouched for.
 */
export function resolveClientAddress({
  peer,
  forwardedFor,
  proxies,
}: {
  peer: string | undefined | null;
  forwardedFor: string | string[] | undefined | null;
  proxies: TrustedProxies;
}): string {
  const peerAddress = normaliseAddress(peer);
  if (!peerAddress) return UNKNOWN_ADDRESS;
  if (!isTrusted(peerAddress, proxies)) return peerAddress;
  const hops = (Array.isArray(forwardedFor) ? forwardedFor.join(",") : (forwardedFor ?? ""))
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  let client = peerAddress;
  for (let i = hops.length - 1; i >= 0; i--) {
    const hop = normaliseAddress(hops[i]);
    if (!hop) break;
    client = hop;
    if (!isTrusted(hop, proxies)) break;
  }
  return client;
}

/**
 * Whether the client reached us over https: the server's own TLS, or a trusted proxy's
 * `X-Forwarded-Proto` (its right-most value, the one the nearest proxy wrote).
 */
export function requestWasHttps({
  peer,
  encrypted,
  forwardedProto,
  proxies,
}: {
  peer: string | undefined | null;
  encrypted: boolean;
  forwardedProto: string | string[] | undefined | null;
  proxies: TrustedProxies;
}): boolean {
  if (encrypted) return true;
  const peerAddress = normaliseAddress(peer);
  if (!peerAddress || !isTrusted(peerAddress, proxies)) return false;
  const values = (Array.isArray(forwardedProto) ? forwardedProto.join(",") : (forwardedProto ?? "")).split(",");
  return values.at(-1)?.trim().toLowerCase() === "https";
}
