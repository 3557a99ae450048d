import "server-only";
// What the staff-administration e-mails need to know: which language to write in, and whether an
// invitation's e-mail has gone.
import { and, asc, eq, inArray } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { carerLinks, memberships, organisations, outboundMessages, patients, user } from "@/db/schema";

export const STAFF_INVITE_KIND = "staff-invite";
export const PASSWORD_RESET_KIND = "password-reset";
export const SIGN_IN_ATTEMPTS_KIND = "sign-in-attempts";

/** The locales of organisations, in the order of `ids` (the first chosen decides an invitation's language). */
export async function organisationLocales({ ids }: { ids: string[] }, tx: Executor = db) {
  if (ids.length === 0) return [] as { id: string; name: string; locale: string }[];
  const rows = await tx
    .select({ id: organisations.id, name: organisations.name, locale: organisations.locale })
    .from(organisations)
    .where(inArray(organisations.id, ids));
  return ids.map((id) => rows.find((r) => r.id === id)).filter((r): r is NonNullable<typeof r> => Boolean(r));
}

/**
 * The language of an account's e-mail: a patient's preferred language; a carer's, the language
 * of the (first) patient they help, else their own; staff, their first organisation's (by name).
 * The patient's id comes back so a patient's e-mail is part of their record.
 */
export async function accountMailContext({ userId }: { userId: string }, tx: Executor = db): Promise<{ locale: string | null; patientId: string | null }> {
  const [u] = await tx.select({ role: user.role, locale: user.locale }).from(user).where(eq(user.id, userId));
  if (!u) return { locale: null, patientId: null };
  if (u.role === "patient") {
    const [p] = await tx.select({ id: patients.id, locale: patients.preferredLocale }).from(patients).where(eq(patients.userId, userId));
    return { locale: p?.locale ?? u.locale, patientId: p?.id ?? null };
  }
  if (u.role === "carer") {
    const [p] = await tx
      .select({ locale: patients.preferredLocale })
      .from(carerLinks)
      .innerJoin(patients, eq(patients.id, carerLinks.patientId))
      .where(and(eq(carerLinks.carerUserId, userId), eq(carerLinks.status, "active")))
      .orderBy(asc(carerLinks.createdAt))
      .limit(1);
    return { locale: p?.locale ?? u.locale, patientId: null };
  }
  const [o] = await tx
    .select({ locale: organisations.locale })
    .from(memberships)
    .innerJoin(organisations, eq(organisations.id, memberships.organisationId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(organisations.name))
    .limit(1);
  return { locale: o?.locale ?? u.locale, patientId: null };
}

export type InvitationMailState = { status: "queued" | "sending" | "sent" | "failed"; sentAt: Date | null; lastError: string | null };

/** The state of each invitation's e-mail in the outbox, by invitation id. */
export async function invitationMailStates({ invitationIds }: { invitationIds: string[] }, tx: Executor = db) {
  const out = new Map<string, InvitationMailState>();
  if (invitationIds.length === 0) return out;
  const rows = await tx
    .select({ sourceId: outboundMessages.sourceId, status: outboundMessages.status, sentAt: outboundMessages.sentAt, lastError: outboundMessages.lastError })
    .from(outboundMessages)
    .where(and(eq(outboundMessages.kind, STAFF_INVITE_KIND), inArray(outboundMessages.sourceId, invitationIds)));
  for (const r of rows) if (r.sourceId) out.set(r.sourceId, { status: r.status, sentAt: r.sentAt, lastError: r.lastError });
  return out;
}
