import "server-only";
// The e-mails of staff administration: invitations and password resets. Every e-mail goes
// through the outbox (lib/email `queueMessage`, in the caller's transaction).
// TODO(outbox): lib/email is not on main yet. Until it is, the invitation link is shown to the
// admin on screen (the API returns it) and a reset link is logged in development only.
import type { Executor } from "@/db";
import { env } from "@/lib/env";

export type StaffInvitationMail = {
  invitationId: string;
  email: string;
  name: string | null;
  locale: string;
  /** The accept link with the plain token; never stored. */
  link: string;
  expiresAt: Date;
  invitedByName: string;
  organisationNames: string[];
};

/** Queues the invitation e-mail. Returns whether it went to the outbox. */
export async function sendStaffInvitation(tx: Executor, mail: StaffInvitationMail): Promise<{ queued: boolean }> {
  void tx;
  void mail;
  return { queued: false };
}

export async function sendPasswordReset({ email, url }: { email: string; name: string; locale: string; url: string }) {
  if (env.NODE_ENV === "development") console.log(`[auth] password reset link for ${email}: ${url}`);
}

/** Whether invitation links are e-mailed (then the admin is not shown them). */
export const invitationsByEmail = false;
