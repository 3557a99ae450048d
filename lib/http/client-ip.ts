import "server-only";
// The client address, from one trusted source for every limiter and audit event (ASVS 15.3.4).
// Behind a load balancer that overwrites CLIENT_IP_HEADER, its value is the client; on loopback
// alone there is no header and the connection is local.
import { createHmac } from "node:crypto";
import { env } from "@/lib/config/env";

export function clientIp(headers: Headers): string {
  const name = env.CLIENT_IP_HEADER.trim().toLowerCase();
  if (name) {
    const value = headers.get(name);
    if (value) {
      const first = value.split(",")[0]?.trim();
      if (first) return first.slice(0, 64);
    }
  }
  return "127.0.0.1";
}

/** Keyed hash of an address so logs can correlate requests without holding the address. */
export function hashIp(ip: string): string {
  return createHmac("sha256", env.AUDIT_IP_SALT).update(ip).digest("hex").slice(0, 32);
}
