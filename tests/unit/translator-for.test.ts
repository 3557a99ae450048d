// translatorFor (lib/i18n/catalogues.ts) keeps a message asked for without values as text: the
// same text every time, values still formatted on each call, the translator's other calls intact.
import { describe, expect, it } from "vitest";
import { translatorFor } from "@/lib/i18n/catalogues";
import en from "@/messages/en.json";
import pl from "@/messages/pl.json";

describe("translatorFor", () => {
  it("gives a message without values as the catalogue's text, the same each time and per locale", () => {
    const t = translatorFor("en", "DeviceCard");
    expect(t("title")).toBe(en.DeviceCard.title);
    expect(t("title")).toBe(en.DeviceCard.title);
    expect(translatorFor("pl", "DeviceCard")("title")).toBe(pl.DeviceCard.title);
    expect(translatorFor("en", "DeviceCard")).toBe(t);
  });

  it("formats a message with values on every call", () => {
    const t = translatorFor("en", "DeviceCard");
    expect(t("mm", { mm: 4 })).toBe("4 mm outer diameter");
    expect(t("mm", { mm: 6 })).toBe("6 mm outer diameter");
  });

  it("keeps has, raw and rich", () => {
    const t = translatorFor("en", "DeviceCard");
    expect(t.has("title")).toBe(true);
    expect(t.raw("mm")).toBe(en.DeviceCard.mm);
    expect(typeof t.rich).toBe("function");
  });
});
