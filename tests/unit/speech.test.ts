// What the Listen control reads: sentences in order (also in Arabic and Urdu), the emergency
// number as separate digits, phone numbers digit by digit, nothing longer than the server takes.
import { describe, expect, it } from "vitest";
import { SPEECH_MAX_CHARS, sentencesOf, speakable } from "@/lib/shared/speech";

const cut = (text: string) => sentencesOf(text).map((s) => text.slice(s.start, s.end));

describe("sentences to read", () => {
  it("splits after full stops, question and exclamation marks, in English", () => {
    expect(cut("Drink water. Is the bag below your bladder? Yes!")).toEqual(["Drink water.", "Is the bag below your bladder?", "Yes!"]);
  });

  it("splits after the Arabic question mark and the Urdu full stop", () => {
    expect(cut("هل الكيس تحت المثانة؟ اشرب الماء.")).toEqual(["هل الكيس تحت المثانة؟", "اشرب الماء."]);
    expect(cut("پانی پئیں۔ بیگ مثانے سے نیچے رکھیں۔")).toEqual(["پانی پئیں۔", "بیگ مثانے سے نیچے رکھیں۔"]);
  });

  it("reads a heading without a full stop, skips bare punctuation, and cuts a very long sentence at a space", () => {
    expect(cut("When to get help\n—\nCall now.")).toEqual(["When to get help", "Call now."]);
    const long = Array.from({ length: 120 }, () => "word").join(" ");
    const parts = cut(long);
    expect(parts.length).toBeGreaterThan(1);
    for (const p of parts) expect(p.length).toBeLessThanOrEqual(SPEECH_MAX_CHARS);
    expect(parts.join(" ")).toBe(long);
  });
});

describe("spoken as", () => {
  it("the emergency number is read as separate digits", () => {
    expect(speakable("Call 999 now.", "999")).toBe("Call 9 9 9 now.");
    expect(speakable("اتصل بـ 112 الآن", "112")).toBe("اتصل بـ 1 1 2 الآن");
    expect(speakable("It is 1999.", "999")).toBe("It is 1999.");
  });

  it("a phone number is read digit by digit; amounts stay numbers", () => {
    expect(speakable("Ring 01632 960 101 today.", "999")).toBe("Ring 0 1 6 3 2 9 6 0 1 0 1 today.");
    expect(speakable("Drink 2000 ml.", "999")).toBe("Drink 2000 ml.");
  });
});
