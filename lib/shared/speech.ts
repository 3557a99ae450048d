// What the Listen control reads aloud, shared by the browser (which splits the page into
// sentences and marks the one being read) and the server (which makes speech where the browser
// has no voice for the page's language).

/** The longest piece of text the server turns into speech at once (one sentence, or a long one cut). */
export const SPEECH_MAX_CHARS = 400;

/** Sentences in reading order: after . ! ? and the Arabic and Urdu full stops and question mark. */
export function sentencesOf(text: string): { start: number; end: number }[] {
  const out: { start: number; end: number }[] = [];
  const re = /[^.!?؟۔\n]+(?:[.!?؟۔]+|\n|$)/g;
  for (const m of text.matchAll(re)) {
    const raw = m[0];
    const lead = raw.length - raw.trimStart().length;
    const body = raw.trim();
    if (!/[\p{L}\p{N}]/u.test(body)) continue;
    let start = m.index! + lead;
    const end = start + body.length;
    // A sentence longer than the server takes is read in pieces, cut at a space.
    while (end - start > SPEECH_MAX_CHARS) {
      const cut = text.lastIndexOf(" ", start + SPEECH_MAX_CHARS);
      const stop = cut > start ? cut : start + SPEECH_MAX_CHARS;
      out.push({ start, end: stop });
      start = stop + (cut > start ? 1 : 0);
    }
    out.push({ start, end });
  }
  return out;
}

/**
 * The words as they should be spoken: the emergency number as separate digits ("9 9 9", never
 * "nine hundred and ninety-nine"), and phone numbers digit by digit.
 */
export function speakable(text: string, emergencyNumber: string | null): string {
  let out = text;
  if (emergencyNumber) out = out.replace(new RegExp(`(?<![\\d])${emergencyNumber}(?![\\d])`, "g"), emergencyNumber.split("").join(" "));
  // A run of digits with spaces that looks like a phone number (8 digits or more).
  return out.replace(/\+?\d[\d ]{6,}\d/g, (m) => (m.replace(/\D/g, "").length >= 8 ? m.replace(/\s+/g, "").split("").join(" ") : m));
}
