import "server-only";
// Shared by the card pages: the signed-in viewer if a session cookie came (so an anonymous
// scan costs no session lookup), and the request headers for the audit event.
import { headers } from "next/headers";
import { getViewer } from "@/lib/auth/session";

export async function cardRequest() {
  const h = await headers();
  const cookie = h.get("cookie") ?? "";
  const viewer = /(^|;\s*)(__Secure-)?better-auth\.session_token=/.test(cookie) ? await getViewer() : null;
  return { request: { headers: h }, viewer };
}
