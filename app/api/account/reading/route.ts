import { getReadingComfort, setReadingComfort } from "@/db/queries/reading";
import { requirePortalViewer } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { readingSchema } from "@/lib/validations/reading";

/** The viewer's own reading comfort (text size, contrast): patients and carers, for themselves. */
export const GET = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  return json({ reading: await getReadingComfort({ userId: viewer.userId }) });
});

export const PUT = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const comfort = await parseJsonBody(request, readingSchema);
  await setReadingComfort({ userId: viewer.userId, comfort });
  return json({ reading: comfort });
});
