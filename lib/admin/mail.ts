import "server-only";
// The e-mails of staff administration: invitations and password resets, through the outbox
// (lib/email queueMessage). The links they hold are one-time secrets: the body is blanked once
// sent and never resent (redactAfterSend), and the link is never shown on any screen.
// Staff e-mails are in the organisation's language; a patient's in the patient's.
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { getRegion } from "@/lib/config/settings";
import { accountMailContext, PASSWORD_RESET_KIND, SIGN_IN_ATTEMPTS_KIND, STAFF_INVITE_KIND } from "@/db/queries/admin-mail";
import { user } from "@/db/schema";
import { env } from "@/lib/config/env";
import { emailDates, emailLocale, emailTranslator } from "@/lib/email/i18n";
import { queueMessage, type QueuedMessage } from "@/lib/email/outbox";
import { renderEmail } from "@/lib/email/render";
import { translatorFor } from "@/lib/i18n/catalogues";
import type { Locale } from "@/lib/i18n/routing";

function adminMailTranslator(locale: Locale) {
  return translatorFor(locale, "AdminEmail");
}

export type StaffInvitationMail = {
  invitationId: string;
  email: string;
  name: string | null;
  /** The first chosen organisation's language. */
  locale: string;
  /** The accept link with the plain token; never stored except in the outbox body until sent. */
  link: string;
  expiresAt: Date;
  invitedByName: string;
  invitedByUserId: string;
  organisationNames: string[];
  role: "admin" | "clinician";
};

/** Queues the invitation e-mail in the caller's transaction (the one that writes the invitation). */
export async function sendStaffInvitation(tx: Executor, mail: StaffInvitationMail): Promise<QueuedMessage> {
  const locale = emailLocale(mail.locale);
  const t = adminMailTranslator(locale);
  const common = emailTranslator(locale);
  const d = emailDates(locale, await getRegion(tx));
  const content = {
    locale,
    subject: t("staffInvite.subject"),
    title: t("staffInvite.title"),
    intro: mail.name ? t("staffInvite.greetingNamed", { name: mail.name }) : t("staffInvite.greeting"),
    blocks: [
      { type: "paragraph" as const, text: t("staffInvite.intro", { inviter: mail.invitedByName }) },
      {
        type: "facts" as const,
        rows: [
          { label: t("staffInvite.organisations"), value: mail.organisationNames.join(", ") },
          { label: t("staffInvite.role"), value: translatorFor(locale, "Vocabulary")(`role.${mail.role}`) },
        ],
      },
      { type: "action" as const, href: mail.link, label: t("staffInvite.action") },
      { type: "paragraph" as const, text: t("staffInvite.expires", { date: d.at(mail.expiresAt) }) },
      { type: "paragraph" as const, text: t("staffInvite.once") },
      { type: "paragraph" as const, text: t("notYou") },
    ],
    footer: [common("common.footerNoReply")],
  };
  return queueMessage(tx, {
    idempotencyKey: `${STAFF_INVITE_KIND}:${mail.invitationId}`,
    kind: STAFF_INVITE_KIND,
    to: mail.email,
    ...renderEmail(content),
    locale,
    sourceId: mail.invitationId,
    createdByUserId: mail.invitedByUserId,
    redactAfterSend: true,
  });
}

/**
 * The reset link better-auth makes (valid one hour, single use). better-auth writes its own
 * verification row before calling this, outside any transaction of ours, so the message is
 * queued on its own; one message per link (the key is the token's hash).
 */
export async function sendPasswordReset(
  { userId, email, name, url, expiresInSeconds }: { userId: string; email: string; name: string; url: string; expiresInSeconds: number },
  tx: Executor = db,
): Promise<QueuedMessage> {
  const context = await accountMailContext({ userId }, tx);
  const locale = emailLocale(context.locale);
  const t = adminMailTranslator(locale);
  const common = emailTranslator(locale);
  const d = emailDates(locale, await getRegion(tx));
  const link = new URL(url);
  // The page that sets the new password opens in the e-mail's language.
  link.searchParams.set("callbackURL", `/${locale}/reset-password`);
  const tokenHash = createHash("sha256").update(link.pathname).digest("hex").slice(0, 32);
  const patientFacing = context.patientId !== null;
  const content = {
    locale,
    subject: t("passwordReset.subject"),
    title: t("passwordReset.title"),
    intro: t("passwordReset.greeting", { name }),
    blocks: [
      { type: "paragraph" as const, text: t("passwordReset.intro") },
      { type: "action" as const, href: link.toString(), label: t("passwordReset.action") },
      { type: "paragraph" as const, text: t("passwordReset.expires", { date: d.at(new Date(Date.now() + expiresInSeconds * 1000)) }) },
      { type: "paragraph" as const, text: t("passwordReset.signedOut") },
      { type: "paragraph" as const, text: t("passwordReset.notYou") },
    ],
    footer: patientFacing ? [common("patient.footerHelp"), common("patient.footerNoReply")] : [common("common.footerNoReply")],
  };
  return queueMessage(tx, {
    idempotencyKey: `${PASSWORD_RESET_KIND}:${tokenHash}`,
    kind: PASSWORD_RESET_KIND,
    to: email,
    ...renderEmail(content),
    locale,
    patientId: context.patientId,
    sourceId: userId,
    redactAfterSend: true,
  });
}

/**
 * Tells the owner of an account that someone keeps failing to sign in to it (at most once a day,
 * lib/auth/sign-in-throttle.ts), in the caller's transaction. Nothing in it is a secret: the link
 * is the ordinary "forgot password" page.
 */
export async function sendSignInAttemptsNotice(
  {
    userId,
    since,
    attempts,
    addresses,
    secondStepFailures,
    noticeKey,
  }: { userId: string; since: Date; attempts: number; addresses: number; secondStepFailures: number; noticeKey: string },
  tx: Executor = db,
): Promise<QueuedMessage | null> {
  const [u] = await tx.select({ email: user.email, name: user.name }).from(user).where(eq(user.id, userId));
  if (!u) return null;
  const context = await accountMailContext({ userId }, tx);
  const locale = emailLocale(context.locale);
  const t = adminMailTranslator(locale);
  const common = emailTranslator(locale);
  const d = emailDates(locale, await getRegion(tx));
  const patientFacing = context.patientId !== null;
  const content = {
    locale,
    subject: t("signInAttempts.subject"),
    title: t("signInAttempts.title"),
    intro: t("signInAttempts.greeting", { name: u.name }),
    blocks: [
      { type: "paragraph" as const, text: t("signInAttempts.intro", { date: d.at(since), count: attempts }) },
      { type: "paragraph" as const, text: t("signInAttempts.places", { count: addresses }) },
      ...(secondStepFailures > 0 ? [{ type: "paragraph" as const, text: t("signInAttempts.secondStep", { count: secondStepFailures }) }] : []),
      { type: "paragraph" as const, text: t("signInAttempts.slowed") },
      { type: "paragraph" as const, text: t("signInAttempts.knownDevice") },
      { type: "paragraph" as const, text: t("signInAttempts.whatToDo") },
      { type: "action" as const, href: new URL(`/${locale}/forgot-password`, env.APP_URL).toString(), label: t("signInAttempts.action") },
      { type: "paragraph" as const, text: t("signInAttempts.ifYou") },
    ],
    footer: patientFacing ? [common("patient.footerHelp"), common("patient.footerNoReply")] : [common("common.footerNoReply")],
  };
  return queueMessage(tx, {
    idempotencyKey: `${SIGN_IN_ATTEMPTS_KIND}:${noticeKey}`,
    kind: SIGN_IN_ATTEMPTS_KIND,
    to: u.email,
    ...renderEmail(content),
    locale,
    patientId: context.patientId,
    sourceId: userId,
  });
}
