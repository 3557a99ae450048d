import { openPortalBody } from "@/lib/auth/permissions";
import { submitCheckIn } from "@/lib/portal/check-ins";
import { handle, json } from "@/lib/http/handle";
import { checkInSchema } from "@/lib/validations/check-in";

// A check-in from the patient or a carer. 201 the first time; the same idempotency key again
// answers 200 with the first result and writes nothing.
export const POST = handle(async (request) => {
  const { viewer, via, input } = await openPortalBody(request, checkInSchema);
  const { created, checkIn, reasons } = await submitCheckIn({ viewer, via, ...input, request });
  return json({ checkIn, reasons }, { status: created ? 201 : 200 });
});
