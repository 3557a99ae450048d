import "server-only";
// Staff administration: invitations, memberships, roles, deactivation. Each change runs in one
// transaction with its audit event, under the admin-roster lock, and is refused if it would leave
// the deployment — or an organisation that has admins — without an active admin.
import { randomUUID } from "node:crypto";
import { db, type Executor } from "@/db";
import { organisationLocales } from "@/db/queries/admin-mail";
import { organisationNames } from "@/db/queries/organisations";
import {
  addMemberships,
  adminRoster,
  countMemberships,
  createStaffAccount,
  currentAdminOrganisationIds,
  deactivateUser,
  endAllSessions,
  findInvitationByTokenHash,
  findOpenInvitations,
  findUserByEmail,
  getStaffMember,
  insertInvitation,
  listPendingInvitations,
  lockAdminRoster,
  markInvitationAccepted,
  reactivateUser,
  removeMemberships,
  revokeInvitation,
  setRole,
} from "@/db/queries/staff";
import { audit } from "@/lib/records/audit";
import { hashPassword } from "@/lib/auth/password";
import type { Viewer } from "@/lib/auth/session";
import { env } from "@/lib/config/env";
import { AppError } from "@/lib/http/errors";
import type { AcceptInviteInput, InviteStaffInput, UpdateStaffInput } from "@/lib/validations/staff";
import { sendStaffInvitation } from "./mail";
import { hashToken, newToken } from "./tokens";

export const INVITATION_LIFETIME_HOURS = 72;

type RequestLike = Request | { headers: Headers } | null;

function assertManages(viewer: Viewer, organisationIds: string[]) {
  // An organisation the admin does not belong to is, to them, one that does not exist.
  if (organisationIds.some((id) => !viewer.organisationIds.includes(id))) throw new AppError("not_found");
}

/**
 * Runs a change to the admin roster under the roster lock and refuses it if it leaves an
 * admin-less deployment or organisation. The acting admin's own organisations are read again
 * under the lock: a change committed a moment ago may have taken one away.
 */
async function guardAdmins<T>(tx: Executor, viewer: Viewer, change: (actor: Viewer) => Promise<T>): Promise<T> {
  await lockAdminRoster(tx);
  const organisationIds = await currentAdminOrganisationIds({ userId: viewer.userId }, tx);
  if (!organisationIds) throw new AppError("forbidden");
  const before = await adminRoster(tx);
  const result = await change({ ...viewer, organisationIds });
  const after = await adminRoster(tx);
  if (after.total === 0) throw new AppError("last_admin", "This is the last active administrator of Caddis.");
  const orphaned = [...before.organisationsWithAdmins].filter((id) => !after.organisationsWithAdmins.has(id));
  if (orphaned.length) {
    const names = (await organisationNames({ ids: orphaned }, tx)).map((o) => o.name);
    throw new AppError("last_admin", `This would leave ${names.join(", ")} without an administrator.`);
  }
  return result;
}

export async function inviteStaff({ viewer, input, request }: { viewer: Viewer; input: InviteStaffInput; request: RequestLike }) {
  assertManages(viewer, input.organisationIds);
  const token = newToken();
  const expiresAt = new Date(Date.now() + INVITATION_LIFETIME_HOURS * 3600_000);
  const result = await db.transaction(async (tx) => {
    if (await findUserByEmail({ email: input.email }, tx)) {
      throw new AppError("conflict", "There is already an account with this e-mail address.", { fields: { email: ["account_exists"] } });
    }
    for (const open of await findOpenInvitations({ email: input.email }, tx)) {
      if (open.expiresAt.getTime() > Date.now()) {
        throw new AppError("conflict", "This address has an open invitation. Withdraw it to send a new one.", {
          fields: { email: ["already_invited"] },
        });
      }
      await revokeInvitation({ id: open.id }, tx);
    }
    const orgs = await organisationLocales({ ids: input.organisationIds }, tx);
    // Staff e-mails are in the organisation's language: the first one chosen.
    const locale = orgs[0]?.locale ?? "en";
    const row = await insertInvitation(
      {
        values: { email: input.email, name: input.name ?? null, role: input.role, tokenHash: hashToken(token), expiresAt, invitedByUserId: viewer.userId },
        organisationIds: input.organisationIds,
      },
      tx,
    );
    // The link is e-mailed in this transaction and never returned: only the invitee sees it.
    const mail = await sendStaffInvitation(tx, {
      invitationId: row.id,
      email: input.email,
      name: input.name ?? null,
      locale,
      link: `${env.APP_URL}/${locale}/accept-invite/${token}`,
      expiresAt,
      invitedByName: viewer.name,
      invitedByUserId: viewer.userId,
      organisationNames: orgs.map((o) => o.name),
      role: input.role,
    });
    for (const organisationId of input.organisationIds) {
      await audit(
        {
          action: "admin.staff.invite",
          actor: viewer,
          organisationId,
          via: "admin",
          request,
          details: { invitationId: row.id, role: input.role, messageId: mail.id, locale },
        },
        tx,
      );
    }
    return { id: row.id, messageStatus: mail.status, locale };
  });
  return {
    invitation: { id: result.id, email: input.email, role: input.role, expiresAt, locale: result.locale },
    emailed: true,
    messageStatus: result.messageStatus,
  };
}

export async function withdrawInvitation({ viewer, invitationId, request }: { viewer: Viewer; invitationId: string; request: RequestLike }) {
  await db.transaction(async (tx) => {
    const open = (await listPendingInvitations({ organisationIds: viewer.organisationIds }, tx)).find((i) => i.id === invitationId);
    if (!open) throw new AppError("not_found");
    await revokeInvitation({ id: invitationId }, tx);
    await audit(
      { action: "admin.staff.invite_withdraw", actor: viewer, organisationId: open.organisations[0]?.id, via: "admin", request, details: { invitationId } },
      tx,
    );
  });
}

/** Public: what the accept page shows for a link, or null when it is not valid (any reason). */
export async function previewInvitation(token: string) {
  if (!/^[A-Za-z0-9_-]{20,200}$/.test(token)) return null;
  return findInvitationByTokenHash({ tokenHash: hashToken(token) });
}

/** The invitee sets their name and password; the account is made with the invited role and memberships. */
export async function acceptInvitation({ input, request, locale }: { input: AcceptInviteInput; request: RequestLike; locale: string }) {
  const passwordHash = await hashPassword(input.password);
  return db.transaction(async (tx) => {
    const invitation = await findInvitationByTokenHash({ tokenHash: hashToken(input.token), forUpdate: true }, tx);
    if (!invitation) throw new AppError("not_found", "This invitation link is not valid any more. Ask your administrator for a new one.");
    if (await findUserByEmail({ email: invitation.email }, tx)) {
      throw new AppError("conflict", "There is already an account with this e-mail address.");
    }
    const userId = randomUUID();
    await createStaffAccount({ id: userId, email: invitation.email, name: input.name, role: invitation.role, locale, passwordHash }, tx);
    await addMemberships({ userId, organisationIds: invitation.organisations.map((o) => o.id) }, tx);
    await markInvitationAccepted({ id: invitation.id, userId }, tx);
    await audit(
      {
        action: "staff.invite.accept",
        actor: { userId, role: invitation.role },
        organisationId: invitation.organisations[0]?.id ?? null,
        request,
        details: { invitationId: invitation.id, organisationIds: invitation.organisations.map((o) => o.id) },
      },
      tx,
    );
    return { email: invitation.email };
  });
}

async function loadMember(viewer: Viewer, userId: string, tx: Executor) {
  const member = await getStaffMember({ userId, organisationIds: viewer.organisationIds }, tx);
  if (!member) throw new AppError("not_found");
  return member;
}

export async function updateStaff({ viewer, userId, input, request }: { viewer: Viewer; userId: string; input: UpdateStaffInput; request: RequestLike }) {
  return db.transaction(async (tx) =>
    guardAdmins(tx, viewer, async (actor) => {
      if (input.organisationIds) assertManages(actor, input.organisationIds);
      const before = await loadMember(actor, userId, tx);
      const details: Record<string, unknown> = {};
      if (input.role && input.role !== before.role) {
        await setRole({ userId, role: input.role }, tx);
        details.role = { from: before.role, to: input.role };
      }
      if (input.organisationIds) {
        const had = before.organisations.map((o) => o.id);
        const add = input.organisationIds.filter((id) => !had.includes(id));
        const remove = had.filter((id) => !input.organisationIds!.includes(id));
        await addMemberships({ userId, organisationIds: add }, tx);
        await removeMemberships({ userId, organisationIds: remove }, tx);
        if ((await countMemberships({ userId }, tx)) === 0) {
          throw new AppError("validation_failed", "A member of staff belongs to at least one organisation.", {
            fields: { organisationIds: ["organisations_required"] },
          });
        }
        if (add.length) details.added = add;
        if (remove.length) details.removed = remove;
      }
      if (Object.keys(details).length) {
        await audit({ action: "admin.staff.update", actor: viewer, via: "admin", request, details: { userId, ...details } }, tx);
      }
      return { userId, changed: Object.keys(details) };
    }),
  );
}

export async function deactivateStaff({ viewer, userId, request }: { viewer: Viewer; userId: string; request: RequestLike }) {
  if (userId === viewer.userId) {
    throw new AppError("conflict", "You cannot deactivate your own account. Ask another administrator.");
  }
  return db.transaction(async (tx) =>
    guardAdmins(tx, viewer, async (actor) => {
      const member = await loadMember(actor, userId, tx);
      if (!member.active) return { userId, sessionsEnded: 0 };
      const { sessionsEnded } = await deactivateUser({ userId }, tx);
      await audit({ action: "admin.staff.deactivate", actor: viewer, via: "admin", request, details: { userId, sessionsEnded } }, tx);
      return { userId, sessionsEnded };
    }),
  );
}

/** Signs a member of staff out on every device (ASVS 5.0.0 7.4.5), e.g. after a lost phone. */
export async function endStaffSessions({ viewer, userId, request }: { viewer: Viewer; userId: string; request: RequestLike }) {
  return db.transaction(async (tx) => {
    await loadMember(viewer, userId, tx);
    const { sessionsEnded } = await endAllSessions({ userId }, tx);
    await audit({ action: "admin.staff.sessions_end", actor: viewer, via: "admin", request, details: { userId, sessionsEnded } }, tx);
    return { userId, sessionsEnded };
  });
}

export async function reactivateStaff({ viewer, userId, request }: { viewer: Viewer; userId: string; request: RequestLike }) {
  return db.transaction(async (tx) => {
    const member = await loadMember(viewer, userId, tx);
    if (member.active) return { userId };
    await reactivateUser({ userId }, tx);
    await audit({ action: "admin.staff.reactivate", actor: viewer, via: "admin", request, details: { userId } }, tx);
    return { userId };
  });
}
