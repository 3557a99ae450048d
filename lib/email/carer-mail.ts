import "server-only";
// E-mails to carers and, about carers, to the patient, each in the reader's own language:
// the carer's alert when the patient reports an urgent or emergency problem (called from
// raiseAlert, the one alert path), and the two letters when a carer is removed.
import { and, eq } from "drizzle-orm";
import type { Executor } from "@/db";
import { carerLinks, patients, reachSettings, user } from "@/db/schema";
import { env } from "@/lib/config/env";
import { getEmergencyNumber, getRegion } from "@/lib/config/settings";
import { emailDates, emailLocale, emailTranslator } from "./i18n";
import { queueMessage, queuePush, queueText, type QueuedMessage } from "./outbox";
import { renderEmail } from "./render";

const footer = (t: ReturnType<typeof emailTranslator>) => [t("patient.footerHelp"), t("patient.footerNoReply")];

/**
 * Every active carer of the patient who chose to be told, except the one who answered: one e-mail
 * each, keyed by the check-in and the link, so a retry never sends twice.
 */
export async function queueCarerAlerts(
  tx: Executor,
  { patientId, checkInId, level, reporterUserId }: { patientId: string; checkInId: string; level: "urgent" | "emergency"; reporterUserId?: string | null },
): Promise<QueuedMessage[]> {
  const carers = await tx
    .select({
      linkId: carerLinks.id,
      userId: user.id,
      email: user.email,
      locale: user.locale,
      givenName: patients.givenName,
      channel: carerLinks.alertChannel,
      phone: reachSettings.phone,
      smsConsentAt: reachSettings.smsConsentAt,
    })
    .from(carerLinks)
    .innerJoin(user, eq(user.id, carerLinks.carerUserId))
    .innerJoin(patients, eq(patients.id, carerLinks.patientId))
    .leftJoin(reachSettings, eq(reachSettings.userId, user.id))
    .where(and(eq(carerLinks.patientId, patientId), eq(carerLinks.status, "active"), eq(carerLinks.alertOnUrgent, true)));
  const emergencyNumber = await getEmergencyNumber(tx);
  const out: QueuedMessage[] = [];
  for (const c of carers) {
    if (c.userId === reporterUserId) continue;
    const locale = emailLocale(c.locale);
    const t = emailTranslator(locale);
    const content = {
      locale,
      subject: t(`carerAlert.subject.${level}`, { name: c.givenName }),
      title: t(`carerAlert.subject.${level}`, { name: c.givenName }),
      intro: t("carerAlert.intro", { name: c.givenName }),
      blocks: [
        { type: "paragraph" as const, text: t("carerAlert.teamTold") },
        {
          type: "paragraph" as const,
          text: emergencyNumber ? t("carerAlert.emergency", { number: emergencyNumber }) : t("carerAlert.emergencyUnset"),
        },
        { type: "action" as const, href: `${env.APP_URL}/${locale}/today?patient=${patientId}`, label: t("carerAlert.action") },
        { type: "paragraph" as const, text: t("carerAlert.why") },
      ],
      footer: footer(t),
    };
    const key = `carer-alert:${checkInId}:${c.linkId}`;
    const subject = t(`carerAlert.subject.${level}`, { name: c.givenName });
    const emergency = emergencyNumber ? t("carerAlert.emergency", { number: emergencyNumber }) : t("carerAlert.emergencyUnset");
    // Push or text as she chose; when that cannot reach her (no phone subscribed, no number or
    // no consent), the e-mail goes as well: an alert is never only a failed row.
    if (c.channel === "push") {
      const pushed = await queuePush(tx, { idempotencyKey: `${key}:push`, kind: "carer-alert", userId: c.userId, title: subject, body: `${t("carerAlert.teamTold")} ${emergency}`, link: `/${locale}/today?patient=${patientId}`, patientId, locale, sourceId: checkInId });
      out.push(...pushed);
      if (pushed.some((r) => r.status !== "failed")) continue;
    } else if (c.channel === "sms") {
      const text = await queueText(tx, { idempotencyKey: `${key}:sms`, kind: "carer-alert", to: c.smsConsentAt ? c.phone : null, text: `${subject}. ${t("carerAlert.teamTold")} ${emergency}`, patientId, locale, sourceId: checkInId });
      out.push(text);
      if (text.status !== "failed") continue;
    }
    out.push(
      await queueMessage(tx, {
        idempotencyKey: key,
        kind: "carer-alert",
        to: c.email,
        ...renderEmail(content),
        patientId,
        locale,
        sourceId: checkInId,
      }),
    );
  }
  return out;
}

/** A carer was removed: she is told, and the patient gets a confirmation. */
export async function queueCarerRemoved(
  tx: Executor,
  { patientId, linkId, carerUserId, at }: { patientId: string; linkId: string; carerUserId: string | null; at: Date },
): Promise<void> {
  const [p] = await tx
    .select({ givenName: patients.givenName, familyName: patients.familyName, locale: patients.preferredLocale, email: user.email })
    .from(patients)
    .leftJoin(user, eq(user.id, patients.userId))
    .where(eq(patients.id, patientId));
  if (!p) return;
  const region = await getRegion(tx);
  const [carer] = carerUserId ? await tx.select({ name: user.name, email: user.email, locale: user.locale }).from(user).where(eq(user.id, carerUserId)) : [];
  if (carer) {
    const locale = emailLocale(carer.locale);
    const t = emailTranslator(locale);
    await queueMessage(tx, {
      idempotencyKey: `carer-removed:${linkId}`,
      kind: "carer-removed",
      to: carer.email,
      ...renderEmail({
        locale,
        subject: t("carerRemoved.subject", { name: p.givenName }),
        title: t("carerRemoved.subject", { name: p.givenName }),
        intro: t("carerRemoved.intro", { name: p.givenName, date: emailDates(locale, region).at(at) }),
        blocks: [{ type: "paragraph" as const, text: t("carerRemoved.mistake", { name: p.givenName }) }],
        footer: footer(t),
      }),
      patientId,
      locale,
      sourceId: linkId,
    });
  }
  if (p.email) {
    const locale = emailLocale(p.locale);
    const t = emailTranslator(locale);
    const who = carer?.name ?? t("carerRemoved.invitation");
    await queueMessage(tx, {
      idempotencyKey: `carer-removed-confirm:${linkId}`,
      kind: "carer-removed-confirm",
      to: p.email,
      ...renderEmail({
        locale,
        subject: t("carerRemoved.confirmSubject"),
        title: t("carerRemoved.confirmSubject"),
        intro: t("carerRemoved.confirmIntro", { carer: who, date: emailDates(locale, region).at(at) }),
        blocks: [{ type: "paragraph" as const, text: t("carerRemoved.confirmNotYou") }],
        footer: footer(t),
      }),
      patientId,
      locale,
      sourceId: linkId,
    });
  }
}
