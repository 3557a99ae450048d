import { addDiaryEntry, listDiaryEntries, toDiaryDto } from "@/db/queries/diary";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { requirePortalPatient, requirePortalViewer } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseInput, parseJsonBody, searchParamsObject } from "@/lib/http/validate";
import { DIARY_BACKDATE_DAYS, diaryEntrySchema, diaryRangeSchema } from "@/lib/validations/diary";

export const GET = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const input = parseInput(diaryRangeSchema, searchParamsObject(request.url));
  await requirePortalPatient(viewer, input.patientId);
  const rows = await listDiaryEntries({ patientId: input.patientId, from: new Date(input.from), to: new Date(input.to) });
  return json({ entries: rows.map((r) => toDiaryDto(r, viewer.userId)) });
});

export const POST = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const input = await parseJsonBody(request, diaryEntrySchema);
  const via = await requirePortalPatient(viewer, input.patientId);
  const now = Date.now();
  const at = input.at ? new Date(input.at) : new Date(now);
  if (at.getTime() > now + 10 * 60_000 || at.getTime() < now - DIARY_BACKDATE_DAYS * 86_400_000) {
    throw new AppError("validation_failed", undefined, { fields: { at: [`must be within the last ${DIARY_BACKDATE_DAYS} days`] } });
  }
  const row = await writeRecord(input.patientId, async (tx) => {
    const entry = await addDiaryEntry({ patientId: input.patientId, kind: input.kind, volumeMl: input.volumeMl, at, recordedByUserId: viewer.userId }, tx);
    await audit({ action: "diary.add", actor: viewer, patientId: input.patientId, via, request, details: { entryId: entry.id, kind: entry.kind } }, tx);
    return entry;
  });
  return json({ entry: toDiaryDto(row, viewer.userId) }, { status: 201 });
});
