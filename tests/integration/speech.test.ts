// Listen, on the server: a sentence of a portal page spoken by espeak-ng in the page's language,
// kept in the object store and served from it the next time; never for staff or strangers.
import { describe, expect, it } from "vitest";
import { GET as speech } from "@/app/api/speech/route";
import { speechKey } from "@/lib/speech";
import { headObject } from "@/lib/storage";
import { call, sessionFor } from "../support/http";

const url = (lang: string, text: string) => `/api/speech?lang=${lang}&text=${encodeURIComponent(text)}`;

describe("speech for the Listen control", () => {
  it.each([
    ["en", "Keep the bag below your bladder."],
    ["ar", "اجعل الكيس أسفل المثانة."],
    ["pl", "Trzymaj worek poniżej pęcherza."],
    ["ur", "بیگ کو مثانے سے نیچے رکھیں۔"],
  ])("%s: a WAV file made for the language, kept in the object store", async (lang, text) => {
    const cookie = await sessionFor("patient");
    const res = await call(speech, url(lang, text), { cookie });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("audio/wav");
    expect(res.headers.get("content-language")).toBe(lang);
    const audio = Buffer.from(await res.arrayBuffer());
    expect(audio.subarray(0, 4).toString()).toBe("RIFF");
    expect(audio.subarray(8, 12).toString()).toBe("WAVE");
    expect(audio.length).toBeGreaterThan(10_000);
    expect((await headObject({ key: speechKey(lang as "en", text) }))?.size).toBe(audio.length);
    // The second time it comes from the store, the same bytes.
    const again = Buffer.from(await (await call(speech, url(lang, text), { cookie })).arrayBuffer());
    expect(again.equals(audio)).toBe(true);
  });

  it("reads the emergency number as separate digits", async () => {
    const cookie = await sessionFor("carer");
    const res = await call(speech, url("en", "Call 999 now."), { cookie });
    expect(res.status).toBe(200);
    expect(await headObject({ key: speechKey("en", "Call 9 9 9 now.") })).not.toBeNull();
  });

  it("refuses an unknown language, empty or overlong text; staff and strangers get nothing", async () => {
    const cookie = await sessionFor("patient");
    for (const bad of [url("xx", "Hello."), url("en", ""), url("en", "a".repeat(401)), url("en", "bad\u0000text")]) {
      expect((await call(speech, bad, { cookie })).status, bad).toBe(400);
    }
    expect((await call(speech, url("en", "Hello."), { cookie: await sessionFor("communityNurse") })).status).toBe(403);
    expect((await call(speech, url("en", "Hello."), {})).status).toBe(401);
  });
});
