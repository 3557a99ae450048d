import "server-only";
// "Who looked at my record" in plain words: one line per access-log entry (lib's listAccessLog),
// as message keys, so the portal page and the patient's data download say the same thing, each
// translating in its own language.
import { listAccessLog, type AccessLogEntry } from "@/db/queries/audit-log";
import type { Executor } from "@/db";
import { db } from "@/db";
import { actionMessageKey, AUDIT_VIA } from "@/lib/shared/audit-actions";

const ROLES = ["admin", "clinician", "patient", "carer"] as const;

export type AccessLine = {
  id: number;
  at: string;
  firstAt: string;
  count: number;
  /** The person's name; null for an account since removed or nobody signed in (a device card view). */
  name: string | null;
  role: (typeof ROLES)[number] | null;
  organisation: string | null;
  /** PortalReach.access.how.<key>: care team, visit access, QR, code, … */
  how: (typeof AUDIT_VIA)[number] | "unknown";
  /** The reason given for visit access. */
  reason: string | null;
  action: string;
  /** PatientAccessLog.actions.<key> */
  actionKey: string;
};

export function accessLine(e: AccessLogEntry): AccessLine {
  return {
    id: e.id,
    at: e.at,
    firstAt: e.firstAt,
    count: e.count,
    name: e.actorName,
    role: (ROLES as readonly string[]).includes(e.actorRole ?? "") ? (e.actorRole as AccessLine["role"]) : null,
    organisation: e.organisationName,
    how: e.via && (AUDIT_VIA as readonly string[]).includes(e.via) ? e.via : "unknown",
    reason: e.reason,
    action: e.action,
    actionKey: actionMessageKey(e.action),
  };
}

/** Every line of the log (for the data download), newest first, in pages of the same query. */
export async function allAccessLines({ patientId }: { patientId: string }, tx: Executor = db): Promise<AccessLine[]> {
  const out: AccessLine[] = [];
  for (let page = 1; ; page++) {
    const log = await listAccessLog({ patientId, page, pageSize: 500 }, tx);
    out.push(...log.entries.map(accessLine));
    if (out.length >= log.total || log.entries.length === 0) return out;
  }
}
