// The Scan page accepts only a passport address from a QR: …/p/<43-character token>, with or
// without a locale; anything else is "not a Caddis passport".
import { describe, expect, it } from "vitest";
import { tokenFromQr } from "@/components/scan/passport-scanner";

const token = "5mb2cr2xcDXWKtU8IVGDRRDnM-LAb1wX7dPVs3D4dhY";

describe("tokenFromQr", () => {
  it("reads the token from the passport's address", () => {
    expect(tokenFromQr(`https://caddis.example/p/${token}`)).toBe(token);
    expect(tokenFromQr(`http://localhost:3000/ar/p/${token}/`)).toBe(token);
    expect(tokenFromQr(`  https://caddis.example/p/${token}\n`)).toBe(token);
  });

  it("refuses anything else", () => {
    for (const text of [token, `https://caddis.example/p/${token.slice(1)}`, `https://caddis.example/x/p/${token}`, `https://caddis.example/p/${token}/visit`, "(01)09506000134352", "", "javascript:alert(1)"]) {
      expect(tokenFromQr(text)).toBeNull();
    }
  });
});
