import "server-only";
// E-mails to patients and the people they invite, in the patient's language (patients.
// preferred_locale). They hold a one-time code or link, so the body is blanked once sent.
import type { Executor } from "@/db";
import { getRegion } from "@/lib/config/settings";
import { getPatientForMail } from "@/db/queries/mail-context";
import { emailDates, emailLocale, emailTranslator } from "./i18n";
import { queueMessage, type QueuedMessage } from "./outbox";
import { renderEmail } from "./render";

/** The portal invitation with the activation code (portal: lib/portal/invitations.ts sendPatientInvitation). */
export async function queuePatientInvitation(
  tx: Executor,
  { patientId, email, code, activateUrl, inviteId, expiresAt }: { patientId: string; email: string; code: string; activateUrl: string; inviteId: string; expiresAt?: Date },
): Promise<QueuedMessage> {
  const patient = await getPatientForMail({ patientId }, tx);
  if (!patient) throw new Error(`invitation: patient ${patientId} not found`);
  const locale = emailLocale(patient.preferredLocale);
  const t = emailTranslator(locale);
  const d = emailDates(locale, await getRegion(tx));
  const content = {
    locale,
    subject: t("invite.subject"),
    title: t("invite.title"),
    intro: t("invite.intro", { name: patient.givenName }),
    blocks: [
      { type: "facts" as const, rows: [{ label: t("invite.codeLabel"), value: code }] },
      ...(expiresAt ? [{ type: "paragraph" as const, text: t("invite.expires", { date: d.at(expiresAt) }) }] : []),
      { type: "action" as const, href: activateUrl, label: t("invite.action") },
      { type: "paragraph" as const, text: t("invite.notYou") },
    ],
    footer: [t("patient.footerHelp"), t("patient.footerNoReply")],
  };
  return queueMessage(tx, {
    idempotencyKey: `portal-invite:${inviteId}`,
    kind: "portal-invite",
    to: email,
    ...renderEmail(content),
    patientId,
    locale,
    sourceId: inviteId,
    redactAfterSend: true,
  });
}

/** The carer invitation link (portal: lib/portal/invitations.ts sendCarerInvitation). */
export async function queueCarerInvitation(
  tx: Executor,
  { patientId, email, inviteUrl, linkId, invitedBy, expiresAt }: { patientId: string; email: string; inviteUrl: string; linkId: string; invitedBy: string; expiresAt?: Date },
): Promise<QueuedMessage> {
  const patient = await getPatientForMail({ patientId }, tx);
  if (!patient) throw new Error(`carer invitation: patient ${patientId} not found`);
  const locale = emailLocale(patient.preferredLocale);
  const t = emailTranslator(locale);
  const d = emailDates(locale, await getRegion(tx));
  const content = {
    locale,
    subject: t("carerInvite.subject", { name: patient.givenName }),
    title: t("carerInvite.title"),
    intro: t("carerInvite.intro", { inviter: invitedBy, name: patient.givenName }),
    blocks: [
      ...(expiresAt ? [{ type: "paragraph" as const, text: t("carerInvite.expires", { date: d.at(expiresAt) }) }] : []),
      { type: "action" as const, href: inviteUrl, label: t("carerInvite.action") },
      { type: "paragraph" as const, text: t("invite.notYou") },
    ],
    footer: [t("patient.footerHelp"), t("patient.footerNoReply")],
  };
  return queueMessage(tx, {
    idempotencyKey: `carer-invite:${linkId}`,
    kind: "carer-invite",
    to: email,
    ...renderEmail(content),
    patientId,
    locale,
    sourceId: linkId,
    redactAfterSend: true,
  });
}
