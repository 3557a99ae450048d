import { setCarerAlert } from "@/db/queries/invitations";
import { openPortalBody, requireRole } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { carerAlertSchema } from "@/lib/validations/invitations";

// A carer chooses whether (and by e-mail, push or text) she is told when the patient reports an urgent or emergency problem
// (sent by raiseAlert). Only the carer's own link: the patient themself is refused (403).
export const PUT = handle(async (request) => {
  await requireRole(request, "carer");
  const { viewer, via, input } = await openPortalBody(request, carerAlertSchema);
  if (via !== "carer") throw new AppError("forbidden", "Only a carer chooses to be told.");
  await writeRecord(input.patientId, async (tx) => {
    if (!(await setCarerAlert({ patientId: input.patientId, carerUserId: viewer.userId, on: input.on, channel: input.channel }, tx))) throw new AppError("not_found");
    await audit({ action: "carer.alerts", actor: viewer, patientId: input.patientId, via, request, details: { on: input.on, ...(input.channel ? { channel: input.channel } : {}) } }, tx);
  });
  return json({ on: input.on, ...(input.channel ? { channel: input.channel } : {}) });
});
