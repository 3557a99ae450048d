import "server-only";
// Shared by the card's route handlers and the visit page: the signed-in viewer if a session
// cookie came (so an anonymous scan costs no session lookup), and the request headers for the
// audit event.
import { sessionCookieNameFor } from "@/lib/auth/cookies";
import { getViewerFromHeaders } from "@/lib/auth/session";
import { env } from "@/lib/config/env";

const sessionCookie = sessionCookieNameFor(env.APP_URL);

export async function cardRequest(h: Headers) {
  const cookie = h.get("cookie") ?? "";
  const viewer = cookie.split(/;\s*/).some((c) => c.startsWith(`${sessionCookie}=`)) ? await getViewerFromHeaders(h) : null;
  return { request: { headers: h }, viewer };
}
