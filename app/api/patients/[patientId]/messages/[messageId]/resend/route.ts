import { getMessageById, getPatientMessage, toMessageDto } from "@/db/queries/outbox";
import { isUuid, requireStaffPatientAccess, requireUser } from "@/lib/auth/permissions";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { resendMessage } from "@/lib/email/resend";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";

type Ctx = { params: Promise<{ patientId: string; messageId: string }> };

/** Re-queues a sent or failed message as a new one; the care team's clinicians only. */
export const POST = handle<Ctx>(async (request, { params }) => {
  const { patientId, messageId } = await params;
  const viewer = await requireUser(request);
  const via = await requireStaffPatientAccess(viewer, patientId);
  if (!isUuid(messageId)) throw new AppError("not_found");
  return writeRecord(patientId, async (tx) => {
    const original = await getPatientMessage({ patientId, messageId }, tx);
    if (!original) throw new AppError("not_found");
    const queued = await resendMessage(tx, { original, createdByUserId: viewer.userId });
    await audit(
      { action: "message.resend", actor: viewer, patientId, via, request, details: { messageId, resendId: queued.id, kind: original.kind } },
      tx,
    );
    const row = await getMessageById({ id: queued.id }, tx);
    return json({ message: toMessageDto(row!) }, { status: queued.created ? 201 : 200 });
  });
});
