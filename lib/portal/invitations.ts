import "server-only";
// Getting into the portal: a clinician gives the patient a one-time activation code; a patient
// or clinician invites a carer by e-mail; the patient removes a carer at once.
import { db, type Executor } from "@/db";
import {
  activateCarerLink,
  createCredentialUser,
  findLivePatientInviteForUpdate,
  findOpenCarerLinks,
  findPendingCarerInvite,
  findUserByEmail,
  getPatientForInvite,
  insertCarerLink,
  insertPatientInvite,
  linkPatientUser,
  markPatientInviteUsed,
  revokeCarerLink,
  revokeLivePatientInvites,
} from "@/db/queries/invitations";
import { audit } from "@/lib/records/audit";
import { assertRecordOpen, writeRecord } from "@/lib/records/record-state";
import { queueCarerInvitation, queuePatientInvitation } from "@/lib/email/patient-mail";
import { queueCarerRemoved } from "@/lib/email/carer-mail";
import { auth } from "@/lib/auth";
import { hashPassword, passwordProblem } from "@/lib/auth/password";
import type { Viewer } from "@/lib/auth/session";
import { env } from "@/lib/config/env";
import { AppError } from "@/lib/http/errors";
import { LIMITS, limitByAddress } from "@/lib/http/rate-limit";
import {
  ACTIVATION_DAYS,
  CARER_INVITE_DAYS,
  hashActivationCode,
  hashInviteToken,
  newActivationCode,
  newInviteToken,
} from "@/lib/auth/secret-codes";

const DAY = 86_400_000;

function fieldError(field: string, code: string, message?: string): AppError {
  return new AppError("validation_failed", message, { fields: { [field]: [code] } });
}

function checkNewPassword(password: string) {
  const problem = passwordProblem(password);
  if (problem) throw fieldError("password", problem);
}

// ── patient activation ─────────────────────────────────────────────────────────────────────

export async function createPatientInvite({
  viewer,
  patientId,
  email,
  request,
}: {
  viewer: Viewer;
  patientId: string;
  email?: string;
  request: Request;
}) {
  await assertRecordOpen(db, patientId);
  const patient = await getPatientForInvite({ patientId });
  if (!patient) throw new AppError("not_found");
  if (patient.userId) throw new AppError("conflict", "This patient already has a portal account.");
  const activation = newPatientActivation(patient.preferredLocale);
  const { code, activateUrl } = activation;
  const delivery = await db.transaction(async (tx) => {
    const invite = await recordPatientInvite(tx, { viewer, patientId, activation, email, request });
    return email ? sendPatientInvitation(tx, { patientId, email, code, activateUrl, inviteId: invite.id, expiresAt: activation.expiresAt }) : { emailed: false };
  });
  return { code, expiresAt: activation.expiresAt.toISOString(), activateUrl, emailed: delivery.emailed };
}

export type PatientActivation = { code: string; expiresAt: Date; activateUrl: string };

/** A fresh code, its expiry and the page to type it on (nothing stored yet). */
export function newPatientActivation(preferredLocale: string): PatientActivation {
  return {
    code: newActivationCode(),
    expiresAt: new Date(Date.now() + ACTIVATION_DAYS * DAY),
    activateUrl: `${env.APP_URL}/${preferredLocale}/activate`,
  };
}

/**
 * Stores a code's HMAC in the caller's transaction (the passport issue prints one on the
 * booklet): any other live code is revoked first, and the audit event is written with it.
 * Refuses a patient who has an account by now (checked again inside the transaction).
 */
export async function recordPatientInvite(
  tx: Executor,
  {
    viewer,
    patientId,
    activation,
    email,
    request,
    details,
  }: { viewer: Viewer; patientId: string; activation: PatientActivation; email?: string; request?: Request | { headers: Headers } | null; details?: Record<string, unknown> },
) {
  await assertRecordOpen(tx, patientId);
  const patient = await getPatientForInvite({ patientId }, tx);
  if (!patient) throw new AppError("not_found");
  if (patient.userId) throw new AppError("conflict", "This patient already has a portal account.");
  // One live code per patient: a new one replaces any other.
  await revokeLivePatientInvites({ patientId }, tx);
  const invite = await insertPatientInvite(
    { patientId, codeHash: hashActivationCode(activation.code), email: email ?? null, createdByUserId: viewer.userId, expiresAt: activation.expiresAt },
    tx,
  );
  await audit({ action: "portal.invite", actor: viewer, patientId, via: "care_team", request, details: { inviteId: invite.id, byEmail: Boolean(email), ...details } }, tx);
  return invite;
}

/** The code and link go by e-mail through the outbox, queued in the invitation's transaction. */
async function sendPatientInvitation(
  tx: Executor,
  message: { patientId: string; email: string; code: string; activateUrl: string; inviteId: string; expiresAt: Date },
): Promise<{ emailed: boolean }> {
  await queuePatientInvitation(tx, message);
  return { emailed: true };
}

/** Copies better-auth's session cookie from a server-side sign-in onto our response. */
async function signInForResponse(request: Request, email: string, password: string): Promise<Headers | null> {
  try {
    const { headers } = await auth.api.signInEmail({ body: { email, password }, headers: request.headers, returnHeaders: true });
    const out = new Headers();
    for (const c of headers.getSetCookie()) out.append("set-cookie", c);
    return out;
  } catch {
    return null;
  }
}

export async function activatePatient({ code, email, password, request }: { code: string; email: string; password: string; request: Request }) {
  // Counted before anything is looked up, so guessing codes is slow (ASVS 2.4.1).
  await limitByAddress(request, LIMITS.activate);
  checkNewPassword(password);
  const codeHash = hashActivationCode(code);
  const patient = await db.transaction(async (tx) => {
    const invite = await findLivePatientInviteForUpdate({ codeHash }, tx);
    // The same answer for an unknown, used, expired code or a different e-mail address.
    if (!invite || (invite.email && invite.email.toLowerCase() !== email)) throw fieldError("code", "invalid");
    // A closed record takes no new account: the holder of a real code is told so, like every other write.
    await assertRecordOpen(tx, invite.patientId);
    const record = await getPatientForInvite({ patientId: invite.patientId }, tx);
    if (!record || record.userId) throw fieldError("code", "invalid");
    if (await findUserByEmail({ email }, tx)) throw fieldError("email", "taken");
    const userId = await createCredentialUser(
      { email, name: `${record.givenName} ${record.familyName}`, role: "patient", locale: record.preferredLocale, passwordHash: await hashPassword(password) },
      tx,
    );
    if (!(await linkPatientUser({ patientId: record.id, userId }, tx))) throw fieldError("code", "invalid");
    await markPatientInviteUsed({ id: invite.id }, tx);
    await audit({ action: "portal.activate", actor: { userId, role: "patient" }, patientId: record.id, via: "self", request, details: { inviteId: invite.id } }, tx);
    return record;
  });
  const cookies = await signInForResponse(request, email, password);
  return { locale: patient.preferredLocale, cookies };
}

// ── carers ─────────────────────────────────────────────────────────────────────────────────

/** Patient (self) or care-team clinician; the caller has checked which. */
export async function inviteCarer({
  viewer,
  via,
  patientId,
  email,
  locale,
  request,
}: {
  viewer: Viewer;
  via: "self" | "care_team";
  patientId: string;
  email: string;
  locale: string;
  request: Request;
}) {
  if (viewer.role === "patient" && viewer.email.toLowerCase() === email) throw fieldError("email", "own_address");
  const token = newInviteToken();
  const expiresAt = new Date(Date.now() + CARER_INVITE_DAYS * DAY);
  const inviteUrl = `${env.APP_URL}/${locale}/carer-invite/${token}`;
  return writeRecord(patientId, async (tx) => {
    const open = await findOpenCarerLinks({ patientId, email }, tx);
    if (open.some((l) => l.status === "active")) throw fieldError("email", "already_linked");
    // Inviting the same address again replaces the earlier invitation.
    for (const l of open) await revokeCarerLink({ id: l.id, patientId }, tx);
    const link = await insertCarerLink({ patientId, invitedEmail: email, invitedByUserId: viewer.userId, inviteTokenHash: hashInviteToken(token), inviteExpiresAt: expiresAt }, tx);
    await audit({ action: "carer.invite", actor: viewer, patientId, via, request, details: { linkId: link.id } }, tx);
    const delivery = await sendCarerInvitation(tx, { patientId, email, inviteUrl, linkId: link.id, invitedBy: viewer.name, expiresAt });
    return { linkId: link.id, expiresAt: expiresAt.toISOString(), emailed: delivery.emailed };
  });
}

/** The link goes only by e-mail (through the outbox), never to the inviter's screen. */
async function sendCarerInvitation(
  tx: Executor,
  message: { patientId: string; email: string; inviteUrl: string; linkId: string; invitedBy: string; expiresAt: Date },
): Promise<{ emailed: boolean }> {
  await queueCarerInvitation(tx, message);
  return { emailed: true };
}

export async function removeCarer({ viewer, via, patientId, linkId, request }: { viewer: Viewer; via: "self" | "care_team"; patientId: string; linkId: string; request: Request }) {
  await db.transaction(async (tx) => {
    const revoked = await revokeCarerLink({ id: linkId, patientId }, tx);
    if (!revoked) throw new AppError("not_found");
    await audit({ action: "carer.revoke", actor: viewer, patientId, via, request, details: { linkId, carerUserId: revoked.carerUserId, was: revoked.status } }, tx);
    // She is told, and the patient gets a confirmation, through the outbox with the change.
    await queueCarerRemoved(tx, { patientId, linkId, carerUserId: revoked.carerUserId, at: new Date() });
  });
}

export type CarerInviteView =
  | { state: "invalid" }
  | { state: "accept"; patientGivenName: string } // signed in as the invited carer
  | { state: "sign-in"; patientGivenName: string; email: string } // a carer account exists
  | { state: "create"; patientGivenName: string; email: string } // no account yet
  | { state: "wrong-account"; patientGivenName: string } // signed in as someone else
  | { state: "not-carer"; patientGivenName: string }; // the address has a staff or patient account

export async function viewCarerInvite({ token, viewer }: { token: string; viewer: Viewer | null }): Promise<CarerInviteView> {
  const link = await findPendingCarerInvite({ tokenHash: hashInviteToken(token) });
  if (!link) return { state: "invalid" };
  const name = link.patientGivenName;
  const existing = await findUserByEmail({ email: link.invitedEmail });
  if (viewer) {
    if (viewer.email.toLowerCase() !== link.invitedEmail.toLowerCase()) return { state: "wrong-account", patientGivenName: name };
    return viewer.role === "carer" ? { state: "accept", patientGivenName: name } : { state: "not-carer", patientGivenName: name };
  }
  if (!existing) return { state: "create", patientGivenName: name, email: link.invitedEmail };
  if (existing.role !== "carer") return { state: "not-carer", patientGivenName: name };
  return { state: "sign-in", patientGivenName: name, email: link.invitedEmail };
}

export async function acceptCarerInvite({
  token,
  name,
  password,
  viewer,
  request,
}: {
  token: string;
  name?: string;
  password?: string;
  viewer: Viewer | null;
  request: Request;
}): Promise<{ cookies: Headers | null }> {
  await limitByAddress(request, LIMITS.carerInvite);
  const link = await findPendingCarerInvite({ tokenHash: hashInviteToken(token) });
  if (!link) throw fieldError("token", "invalid");
  const email = link.invitedEmail.toLowerCase();
  const existing = await findUserByEmail({ email });
  let cookies: Headers | null = null;
  let carerUserId: string | null = null;
  let newAccount: { name: string; passwordHash: string } | null = null;

  if (viewer) {
    if (viewer.email.toLowerCase() !== email) throw new AppError("forbidden", "This invitation is for another e-mail address.");
    if (viewer.role !== "carer") throw new AppError("forbidden", "This address has another kind of account.");
    carerUserId = viewer.userId;
  } else if (existing) {
    if (existing.role !== "carer" || existing.deactivatedAt) throw new AppError("forbidden", "This address has another kind of account.");
    if (!password) throw fieldError("password", "required");
    cookies = await signInForResponse(request, email, password);
    if (!cookies) throw fieldError("password", "wrong");
    carerUserId = existing.id;
  } else {
    const fields: Record<string, string[]> = {};
    if (!name) fields.name = ["required"];
    if (!password) fields.password = ["required"];
    else if (passwordProblem(password)) fields.password = [passwordProblem(password)!];
    if (Object.keys(fields).length) throw new AppError("validation_failed", undefined, { fields });
    newAccount = { name: name!, passwordHash: await hashPassword(password!) };
  }

  // The new account and the link in one transaction: no account without its link.
  await writeRecord(link.patientId, async (tx) => {
    const userId = newAccount
      ? await createCredentialUser({ email, name: newAccount.name, role: "carer", locale: link.patientLocale, passwordHash: newAccount.passwordHash }, tx)
      : carerUserId!;
    if (!(await activateCarerLink({ id: link.id, carerUserId: userId }, tx))) throw fieldError("token", "invalid");
    await audit({ action: "carer.accept", actor: { userId, role: "carer" }, patientId: link.patientId, via: "carer", request, details: { linkId: link.id, newAccount: Boolean(newAccount) } }, tx);
  });
  if (newAccount) cookies = await signInForResponse(request, email, password!);
  return { cookies };
}

/** Puts the session cookies of a server-side sign-in on a route handler's response. */
export function withCookies(response: Response, cookies: Headers | null): Response {
  for (const c of cookies?.getSetCookie() ?? []) response.headers.append("set-cookie", c);
  return response;
}
