import { acceptInvitation } from "@/lib/admin/staff";
import { handle, json } from "@/lib/http/handle";
import { isLocale } from "@/lib/i18n/routing";
import { parseJsonBody } from "@/lib/http/validate";
import { acceptInviteSchema } from "@/lib/validations/staff";

/**
 * Public: the invitee accepts with the token from their link, their name and a password that
 * meets the rules. Then they sign in as usual. A token that is unknown, used, withdrawn or
 * expired answers 404, all alike.
 */
export const POST = handle(async (request) => {
  const input = await parseJsonBody(request, acceptInviteSchema);
  const requested = new URL(request.url).searchParams.get("locale") ?? "en";
  const result = await acceptInvitation({ input, request, locale: isLocale(requested) ? requested : "en" });
  return json(result, { status: 201 });
});
