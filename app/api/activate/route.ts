import { handle, json } from "@/lib/http/handle";
import { activatePatient, withCookies } from "@/lib/portal/invitations";
import { parseJsonBody } from "@/lib/http/validate";
import { activateSchema } from "@/lib/validations/invitations";

// The patient enters the activation code, their e-mail and a new password, and is signed in.
// Limited per address in PostgreSQL (lib/http/rate-limit.ts).
export const POST = handle(async (request) => {
  const input = await parseJsonBody(request, activateSchema);
  const { locale, cookies } = await activatePatient({ ...input, request });
  return withCookies(json({ next: `/${locale}/today`, signedIn: Boolean(cookies) }, { status: 201 }), cookies);
});
