import "server-only";
// The client address for every limiter and audit event (ASVS 5.0.0 15.3.4), from one source: the
// header the server entry (scripts/server.ts) sets after working it out from the TCP peer and the
// trusted proxies (lib/http/client-address.ts). A client cannot send that header: the entry
// removes it from every request first. A request that did not come through the entry (a bare
// `next start`) has no address and shares one bucket with every other such request.
import { createHmac } from "node:crypto";
import { isIP } from "node:net";
import { env } from "@/lib/config/env";
import { CLIENT_ADDRESS_HEADER, UNKNOWN_ADDRESS } from "@/lib/http/client-address";

export { CLIENT_ADDRESS_HEADER };

export function clientIp(headers: Headers): string {
  const value = headers.get(CLIENT_ADDRESS_HEADER)?.trim();
  return value && isIP(value) ? value : UNKNOWN_ADDRESS;
}

/**
 * The part of an address a limiter counts by: IPv4 whole, IPv6 by its /64 (one home or phone
 * network is given a /64, so counting single IPv6 addresses would let one client rotate freely).
 */
export function limiterAddress(ip: string): string {
  if (isIP(ip) !== 6) return ip;
  const [head = "", tail = ""] = ip.split("::");
  const left = head ? head.split(":") : [];
  const right = tail ? tail.split(":") : [];
  const groups = ip.includes("::") ? [...left, ...Array(8 - left.length - right.length).fill("0"), ...right] : ip.split(":");
  return `${groups.slice(0, 4).map((g) => g.padStart(4, "0")).join(":")}::/64`;
}

/** Keyed hash of an address so logs can correlate requests without holding the address. */
export function hashIp(ip: string): string {
  return createHmac("sha256", env.AUDIT_IP_SALT).update(ip).digest("hex").slice(0, 32);
}

/**
 * An address coarse enough to show a person ("which of my devices is this?") without pinning a
 * household: IPv4 without its last part, IPv6 by its first three groups (the site's /48).
 */
export function approximateAddress(ip: string | null | undefined): string | null {
  if (!ip) return null;
  const family = isIP(ip);
  if (family === 4) return `${ip.split(".").slice(0, 3).join(".")}.x`;
  if (family === 6) return limiterAddress(ip).split(":").slice(0, 3).map((g) => g.replace(/^0+(?=.)/, "")).join(":") + ":…";
  return null;
}
