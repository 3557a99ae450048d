import { addBagChange } from "@/db/queries/bag-changes";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { requirePortalPatient, requirePortalViewer } from "@/lib/auth/permissions";
import { nextBagChange } from "@/lib/clinical";
import { handle, json } from "@/lib/http/handle";
import { todayIso } from "@/lib/shared/time-zone";
import { parseJsonBody } from "@/lib/http/validate";
import { bagChangeSchema } from "@/lib/validations/diary";

// "I changed my leg bag / valve today": stores today's date; the next change comes from lib/clinical.
export const POST = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const input = await parseJsonBody(request, bagChangeSchema);
  const via = await requirePortalPatient(viewer, input.patientId);
  const today = todayIso();
  const row = await writeRecord(input.patientId, async (tx) => {
    const change = await addBagChange({ patientId: input.patientId, kind: input.kind, changedOn: today, recordedByUserId: viewer.userId }, tx);
    await audit({ action: "bag-change.add", actor: viewer, patientId: input.patientId, via, request, details: { kind: input.kind, changedOn: today } }, tx);
    return change;
  });
  const next = nextBagChange({ kind: row.kind, lastChangedOn: row.changedOn }, today);
  return json({ change: { kind: row.kind, changedOn: row.changedOn }, next: { nextOn: next.nextOn, daysUntil: next.daysUntil, state: next.state } }, { status: 201 });
});
