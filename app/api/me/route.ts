import { homePathFor } from "@/lib/auth/session";
import { requireUser } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";

/** The signed-in person, as the client needs it (no ids of other people, no tokens). */
export const GET = handle(async (request) => {
  const viewer = await requireUser(request);
  return json({
    name: viewer.name,
    email: viewer.email,
    role: viewer.role,
    locale: viewer.locale,
    home: homePathFor(viewer.role),
  });
});
