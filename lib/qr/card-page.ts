import "server-only";
// Shared by the card's route handlers and the visit page: the signed-in viewer if a session
// cookie came (so an anonymous scan costs no session lookup, and the card's route does not load
// the sign-in library until someone signed in scans), and the request headers for the audit event.
import { sessionCookieNameFor } from "@/lib/auth/cookies";
import type { Viewer } from "@/lib/auth/session";
import { env } from "@/lib/config/env";

const sessionCookie = sessionCookieNameFor(env.APP_URL);

export async function cardRequest(h: Headers) {
  const cookie = h.get("cookie") ?? "";
  const signedIn = cookie.split(/;\s*/).some((c) => c.startsWith(`${sessionCookie}=`));
  const viewer: Viewer | null = signedIn ? await (await import("@/lib/auth/session")).getViewerFromHeaders(h) : null;
  return { request: { headers: h }, viewer };
}
