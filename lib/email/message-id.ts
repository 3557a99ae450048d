import "server-only";
import { createHash } from "node:crypto";
import { env } from "@/lib/config/env";

/** The sender's domain, from MAIL_FROM ("Caddis <no-reply@caddis.invalid>" → caddis.invalid). */
export function senderDomain(from = env.MAIL_FROM): string {
  const m = /@([A-Za-z0-9.-]+)>?\s*$/.exec(from);
  return m ? m[1].toLowerCase() : "caddis.invalid";
}

/**
 * The Message-ID header for an outbox row, derived from its idempotency key: if a copy is ever
 * delivered twice (a worker killed after the SMTP server accepted it but before it was marked
 * sent), both copies carry the same id, and mail systems and people can see it is one message.
 */
export function messageIdFor(idempotencyKey: string, from = env.MAIL_FROM): string {
  const digest = createHash("sha256").update(idempotencyKey).digest("hex").slice(0, 40);
  return `<${digest}@${senderDomain(from)}>`;
}
