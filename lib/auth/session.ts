import "server-only";
import { headers } from "next/headers";
import { cache } from "react";
import { getMemberships, getOwnPatientIds, secondFactorRequired, type Role } from "@/db/queries/access";
import { deleteSession, noteSessionUse } from "@/db/queries/account-sessions";
import { auth } from "@/lib/auth";
import { clientIp } from "@/lib/http/client-ip";

export type { Role };
export const roles: readonly Role[] = ["admin", "clinician", "patient", "carer"];

export type Viewer = {
  userId: string;
  /** The better-auth session this request came with (its id, never its token). */
  sessionId: string;
  name: string;
  email: string;
  role: Role;
  locale: string;
  /** Staff: the organisations they belong to. */
  organisationIds: string[];
  /** Patients: themselves. Carers: the patients whose link is active. */
  patientIds: string[];
  /**
   * Whether they have two-step sign-in, and whether they must (staff, unless every organisation
   * of theirs relaxed it; patients and carers may turn it on). Missing means not known.
   */
  secondFactor?: { enabled: boolean; required: boolean };
};

/**
 * The longest a session lives from its sign-in, however active: one long shift for staff, a month
 * for patients and carers on their own phones. Without use it ends sooner, 7 days after its last
 * refresh (better-auth's expiresIn, lib/auth/index.ts). docs/security.md gives the reasons.
 */
export const SESSION_MAX_HOURS = { staff: 13, portal: 30 * 24 } as const;

function isRole(value: unknown): value is Role {
  return typeof value === "string" && (roles as readonly string[]).includes(value);
}

/** The signed-in person for a request, or null. Deactivated accounts count as signed out. */
export async function getViewerFromHeaders(h: Headers): Promise<Viewer | null> {
  const result = await auth.api.getSession({ headers: h });
  if (!result) return null;
  const u = result.user as typeof result.user & {
    role?: unknown;
    locale?: unknown;
    deactivatedAt?: unknown;
    twoFactorEnabled?: unknown;
  };
  if (u.deactivatedAt || !isRole(u.role)) return null;
  const staff = u.role === "admin" || u.role === "clinician";
  // However active, a session ends a fixed time after its sign-in (ASVS 5.0.0 7.3.2).
  if (Date.now() - new Date(result.session.createdAt).getTime() > SESSION_MAX_HOURS[staff ? "staff" : "portal"] * 3_600_000) {
    await deleteSession({ sessionId: result.session.id });
    return null;
  }
  const [memberships, patientIds] = await Promise.all([
    staff ? getMemberships({ userId: u.id }) : Promise.resolve([]),
    staff ? Promise.resolve([]) : getOwnPatientIds({ userId: u.id, role: u.role }),
  ]);
  await noteSessionUse({ sessionId: result.session.id, ipAddress: clientIp(h), userAgent: h.get("user-agent") });
  return {
    userId: u.id,
    sessionId: result.session.id,
    name: u.name,
    email: u.email,
    role: u.role,
    locale: typeof u.locale === "string" ? u.locale : "en",
    organisationIds: memberships.map((m) => m.organisationId),
    patientIds,
    secondFactor: { enabled: u.twoFactorEnabled === true, required: staff && secondFactorRequired(memberships) },
  };
}

/** Cached per request for server components, layouts and actions. */
export const getViewer = cache(async (): Promise<Viewer | null> => getViewerFromHeaders(await headers()));

/** A member of staff whose organisation requires two-step sign-in and who has not set it up. */
export function needsSecondFactorSetup(viewer: Viewer): boolean {
  return Boolean(viewer.secondFactor?.required && !viewer.secondFactor.enabled);
}

export function homePathFor(role: Role): string {
  switch (role) {
    case "admin":
      return "/admin";
    case "clinician":
      return "/caseload";
    case "patient":
    case "carer":
      return "/today";
  }
}
