import { z } from "zod";
import { requirePortalViewer } from "@/lib/auth/permissions";
import { getEmergencyNumber } from "@/lib/config/settings";
import { locales } from "@/lib/i18n/routing";
import { handle } from "@/lib/http/handle";
import { LIMITS, limitByAddress } from "@/lib/http/rate-limit";
import { parseInput, searchParamsObject } from "@/lib/http/validate";
import { SPEECH_MAX_CHARS, speakable } from "@/lib/shared/speech";
import { SPEECH_CONTENT_TYPE, speechAudio } from "@/lib/speech";

const query = z.object({
  lang: z.enum(locales),
  text: z.string().trim().min(1).max(SPEECH_MAX_CHARS),
});

/**
 * One sentence of a portal page spoken in its language (the Listen control, when the browser has
 * no voice for it). Patients and carers only; made once, then served from the object store.
 */
export const GET = handle(async (request) => {
  await requirePortalViewer(request);
  const { lang, text } = parseInput(query, searchParamsObject(request.url));
  const words = speakable(text, await getEmergencyNumber());
  // Only new speech costs the server work: that is what the limit counts.
  const audio = await speechAudio(lang, words, () => limitByAddress(request, LIMITS.speech));
  return new Response(new Uint8Array(audio), {
    headers: {
      "Content-Type": SPEECH_CONTENT_TYPE,
      "Content-Length": String(audio.length),
      "Content-Language": lang,
      "Cache-Control": "private, max-age=86400",
    },
  });
});
