import { canRemove, deleteDiaryEntry, getDiaryEntry } from "@/db/queries/diary";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { isUuid, requirePortalPatient, requirePortalViewer } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle } from "@/lib/http/handle";

// Only the person who added an entry removes it, and only within 24 hours: the diary the care
// team reads is not rewritten later.
export const DELETE = handle<{ params: Promise<{ id: string }> }>(async (request, { params }) => {
  const viewer = await requirePortalViewer(request);
  const { id } = await params;
  if (!isUuid(id)) throw new AppError("not_found");
  const entry = await getDiaryEntry({ id });
  if (!entry) throw new AppError("not_found");
  const via = await requirePortalPatient(viewer, entry.patientId);
  if (!canRemove(entry, viewer.userId)) throw new AppError("forbidden", "Only entries you added in the last 24 hours can be removed.");
  await writeRecord(entry.patientId, async (tx) => {
    await deleteDiaryEntry({ id }, tx);
    await audit(
      { action: "diary.delete", actor: viewer, patientId: entry.patientId, via, request, details: { entryId: id, kind: entry.kind, volumeMl: entry.volumeMl, at: entry.at.toISOString() } },
      tx,
    );
  });
  return new Response(null, { status: 204 });
});
