import { getReach, setReach } from "@/db/queries/reach";
import { mayChooseReminders, requirePortalViewer } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { reachSchema } from "@/lib/validations/reach";

/** The viewer's own number, consent to texts, quiet hours and (patients) reminders. */
export const GET = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  return json({ reach: await getReach({ userId: viewer.userId }) });
});

export const PUT = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const input = await parseJsonBody(request, reachSchema);
  const current = await getReach({ userId: viewer.userId });
  if (input.reminders && !mayChooseReminders(viewer)) throw new AppError("forbidden", "Reminders are the patient's own choice.");
  const reach = { phone: input.phone, smsConsent: input.smsConsent, quietStart: input.quietStart, quietEnd: input.quietEnd, reminders: input.reminders ?? current.reminders };
  await setReach({ userId: viewer.userId, reach });
  return json({ reach: await getReach({ userId: viewer.userId }) });
});
