// Test fixtures for staff administration: organisations and staff accounts made directly in the
// database (invented names, a random suffix so files never collide).
import { randomBytes, randomUUID } from "node:crypto";
import { and, eq, inArray } from "drizzle-orm";
import { db } from "@/db";
import { account, memberships, organisations, outboundMessages, user } from "@/db/schema";
import { enrolTotp } from "@/db/seed";
import { hashPassword } from "@/lib/auth/password";
import { base32Of, rememberTotpSecret } from "./totp";

export const suffix = () => randomUUID().slice(0, 8);

/** An organisation; like a real one it requires two-step sign-in of its staff unless told not to. */
export async function createOrganisation(
  { name = `Testwick Ward ${suffix()}`, kind = "hospital_ward", requireTwoFactor = true, locale = "en" }: {
    name?: string;
    kind?: "hospital_ward" | "community_team" | "gp_practice";
    requireTwoFactor?: boolean;
    locale?: string;
  } = {},
) {
  const relaxed = requireTwoFactor ? {} : { twoFactorRelaxedReason: "Test organisation with password-only sign-in", twoFactorRelaxedAt: new Date() };
  const [row] = await db
    .insert(organisations)
    .values({ name, kind, requireTwoFactor, locale, phone: "01632 960 999", ...relaxed })
    .returning({ id: organisations.id, name: organisations.name });
  return row;
}

export const testPassword = "Testwick-staff-pass-2026";

/**
 * A member of staff. Like every member of staff they sign in in two steps: a TOTP secret is
 * enrolled for them (`totp` is its base32 form, and signIn/sessionFor/signInAs compute the code
 * themselves). `twoFactor: false` leaves them to set it up at their first sign-in.
 */
export async function createStaff({
  role,
  organisationIds,
  name = `Test Person ${suffix()}`,
  email = `staff.${suffix()}@testwick.example`,
  password = testPassword,
  twoFactor = true,
}: {
  role: "admin" | "clinician";
  organisationIds: string[];
  name?: string;
  email?: string;
  password?: string;
  twoFactor?: boolean;
}) {
  const id = randomUUID();
  await db.insert(user).values({ id, email, name, role, emailVerified: true });
  await db.insert(account).values({ id: randomUUID(), userId: id, accountId: id, providerId: "credential", password: await hashPassword(password) });
  if (organisationIds.length) await db.insert(memberships).values(organisationIds.map((organisationId) => ({ userId: id, organisationId })));
  let totp: string | null = null;
  if (twoFactor) {
    const key = randomBytes(24).toString("base64url");
    await enrolTotp(db, id, { key, backupCodes: [`TEST${suffix().slice(0, 1).toUpperCase()}-00001`] });
    totp = base32Of(key);
    rememberTotpSecret(email, totp);
  }
  return { id, email, password, name, totp };
}

export async function orgIdsByName(names: string[]) {
  const rows = await db.select({ id: organisations.id, name: organisations.name }).from(organisations).where(inArray(organisations.name, names));
  return Object.fromEntries(rows.map((r) => [r.name, r.id])) as Record<string, string>;
}

export async function userIdByEmail(email: string) {
  const [row] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
  return row.id;
}

/** The outbox row of an invitation's e-mail (kept unsent in integration tests: no worker runs). */
export async function invitationMessage(invitationId: string) {
  const [m] = await db
    .select()
    .from(outboundMessages)
    .where(and(eq(outboundMessages.kind, "staff-invite"), eq(outboundMessages.sourceId, invitationId)));
  if (!m) throw new Error(`no e-mail queued for invitation ${invitationId}`);
  return m;
}

/** The accept link from the invitation e-mail's text part. */
export async function invitationLink(invitationId: string) {
  const m = await invitationMessage(invitationId);
  const link = m.text.match(/https?:\/\/\S+\/accept-invite\/[A-Za-z0-9_-]+/)?.[0];
  if (!link) throw new Error("no accept link in the invitation e-mail");
  return link;
}

export const tokenOf = (link: string) => link.split("/accept-invite/")[1];
