import { addDiaryEntry, getDiaryEntryByClientKey, listDiaryEntries, toDiaryDto } from "@/db/queries/diary";
import { audit } from "@/lib/records/audit";
import { writeRecord } from "@/lib/records/record-state";
import { canRemoveDiaryEntry, openPortalBody, patientIdIn, requirePortalPatient, requirePortalViewer } from "@/lib/auth/permissions";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { diaryEntrySchema, diaryRangeSchema } from "@/lib/validations/diary";

export const GET = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const query = searchParamsObject(request.url);
  await requirePortalPatient(viewer, patientIdIn(query));
  const input = parseInput(diaryRangeSchema, query);
  const rows = await listDiaryEntries({ patientId: input.patientId, from: new Date(input.from), to: new Date(input.to) });
  return json({ entries: rows.map((r) => toDiaryDto(r, canRemoveDiaryEntry(r, viewer.userId), viewer.userId)) });
});

export const POST = handle(async (request) => {
  const { viewer, via, input } = await openPortalBody(request, diaryEntrySchema);
  // The time it was drunk or emptied, bounded by the schema; an entry sent at once is timed now.
  const at = input.at ? new Date(input.at) : new Date();
  const { row, created } = await writeRecord(input.patientId, async (tx) => {
    const entry = await addDiaryEntry(
      { patientId: input.patientId, kind: input.kind, volumeMl: input.volumeMl, at, recordedByUserId: viewer.userId, clientKey: input.clientKey },
      tx,
    );
    if (!entry) {
      // Sent again from the phone's outbox: the entry it made the first time, unless the key is someone else's.
      const first = await getDiaryEntryByClientKey({ clientKey: input.clientKey! }, tx);
      if (!first || first.patientId !== input.patientId) throw new AppError("conflict", "This entry key has been used already.");
      return { row: first, created: false };
    }
    await audit({ action: "diary.add", actor: viewer, patientId: input.patientId, via, request, details: { entryId: entry.id, kind: entry.kind, delayed: Date.now() - at.getTime() > 5 * 60_000 } }, tx);
    return { row: entry, created: true };
  });
  return json({ entry: toDiaryDto(row, canRemoveDiaryEntry(row, viewer.userId), viewer.userId) }, { status: created ? 201 : 200 });
});
