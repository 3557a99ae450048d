import "server-only";
// Shared by the card pages: the signed-in viewer if a session cookie came (so an anonymous
// scan costs no session lookup), and the request headers for the audit event.
import { headers } from "next/headers";
import { sessionCookieNameFor } from "@/lib/auth/cookies";
import { getViewer } from "@/lib/auth/session";
import { env } from "@/lib/config/env";

const sessionCookie = sessionCookieNameFor(env.APP_URL);

export async function cardRequest() {
  const h = await headers();
  const cookie = h.get("cookie") ?? "";
  const viewer = cookie.split(/;\s*/).some((c) => c.startsWith(`${sessionCookie}=`)) ? await getViewer() : null;
  return { request: { headers: h }, viewer };
}
