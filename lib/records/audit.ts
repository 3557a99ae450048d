import "server-only";
// Audit events: who saw or changed what, when, how and why (ASVS 16.2.1). Written in the same
// transaction as the change they describe; the client address is kept only as a keyed hash.
import { db, type Executor } from "@/db";
import { auditEvents, type NewAuditEvent } from "@/db/schema";
import type { Viewer } from "@/lib/auth/session";
import { clientIp, hashIp } from "@/lib/http/client-ip";

export type AuditInput = {
  action: string;
  actor?: Pick<Viewer, "userId" | "role"> | null;
  patientId?: string | null;
  organisationId?: string | null;
  via?: NewAuditEvent["via"];
  reason?: string | null;
  request?: Request | { headers: Headers } | null;
  details?: Record<string, unknown>;
};

export async function audit(input: AuditInput, tx: Executor = db) {
  await tx.insert(auditEvents).values({
    action: input.action,
    actorUserId: input.actor?.userId ?? null,
    actorRole: input.actor?.role ?? null,
    patientId: input.patientId ?? null,
    organisationId: input.organisationId ?? null,
    via: input.via ?? null,
    reason: input.reason ?? null,
    ipHash: input.request ? hashIp(clientIp(input.request.headers)) : null,
    details: input.details ?? {},
  });
}
