import "server-only";
// "Your sessions": where a person is signed in, and ending any of them (ASVS 5.0.0 7.5.2). The
// list never carries a session's token; ending one goes through better-auth's own revoke
// endpoints, called on the server with the token looked up there.
import Bowser from "bowser";
import { listOwnSessions, ownSessionToken } from "@/db/queries/account-sessions";
import { auth } from "@/lib/auth";
import type { Viewer } from "@/lib/auth/session";
import { AppError } from "@/lib/http/errors";
import { approximateAddress } from "@/lib/http/client-ip";
import { audit } from "@/lib/records/audit";

export type DeviceKind = "phone" | "tablet" | "computer" | "unknown";

export type SessionView = {
  id: string;
  current: boolean;
  browser: string | null;
  os: string | null;
  kind: DeviceKind;
  signedInAt: string;
  lastSeenAt: string;
  /** IPv4 without its last part, IPv6 by its /48: enough to tell home from work. */
  approximateAddress: string | null;
};

/** Browser, system and kind of device from a User-Agent header (bowser), or nulls. */
export function describeDevice(userAgent: string | null | undefined): Pick<SessionView, "browser" | "os" | "kind"> {
  if (!userAgent) return { browser: null, os: null, kind: "unknown" };
  const parsed = Bowser.parse(userAgent);
  const type = parsed.platform.type;
  const kind: DeviceKind = type === "mobile" ? "phone" : type === "tablet" ? "tablet" : type === "desktop" ? "computer" : "unknown";
  return { browser: parsed.browser.name || null, os: parsed.os.name || null, kind };
}

export async function listSessionsFor(viewer: Viewer): Promise<SessionView[]> {
  const rows = await listOwnSessions({ userId: viewer.userId });
  const views = rows.map((r) => ({
    id: r.id,
    current: r.id === viewer.sessionId,
    ...describeDevice(r.userAgent),
    signedInAt: r.createdAt.toISOString(),
    lastSeenAt: r.lastSeenAt.toISOString(),
    approximateAddress: approximateAddress(r.ipAddress),
  }));
  // This device first, then the others by when they were last used.
  return [...views.filter((v) => v.current), ...views.filter((v) => !v.current)];
}

type RoleActor = Pick<Viewer, "userId" | "role">;

/** Ends one of the viewer's sessions (404 for anyone else's); ending the current one signs out. */
export async function endSession(viewer: Viewer, sessionId: string, request: Request) {
  const token = await ownSessionToken({ userId: viewer.userId, sessionId });
  if (!token) throw new AppError("not_found");
  await auth.api.revokeSession({ body: { token }, headers: request.headers });
  await audit({ action: "account.session_end", actor: actorOf(viewer), request, details: { current: sessionId === viewer.sessionId } });
  return { endedCurrent: sessionId === viewer.sessionId };
}

/** Ends every session of the viewer's but this one. */
export async function endOtherSessions(viewer: Viewer, request: Request) {
  const others = (await listOwnSessions({ userId: viewer.userId })).filter((s) => s.id !== viewer.sessionId).length;
  await auth.api.revokeOtherSessions({ headers: request.headers });
  await audit({ action: "account.sessions_end_others", actor: actorOf(viewer), request, details: { ended: others } });
  return { ended: others };
}

const actorOf = (viewer: Viewer): RoleActor => ({ userId: viewer.userId, role: viewer.role });
