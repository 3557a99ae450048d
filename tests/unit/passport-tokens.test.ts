// Passport secrets: the QR token is 32 bytes from the CSPRNG (≥ 128 bits, ASVS 11.5.1); the short
// code is ≥ 50 bits from an alphabet without look-alike characters.
import { describe, expect, it } from "vitest";
import {
  formatShortCode,
  generateShortCode,
  generateToken,
  hashesEqual,
  hashShortCode,
  hashToken,
  isWellFormedShortCode,
  isWellFormedToken,
  normaliseShortCode,
  readShortCode,
  shortCodeCheckCharacter,
  sha256Hex,
  SHORT_CODE_ALPHABET,
  SHORT_CODE_LENGTH,
} from "@/lib/passport/tokens";

describe("QR token", () => {
  it("is 43 base64url characters that decode to 32 bytes (256 bits)", () => {
    for (let i = 0; i < 200; i++) {
      const t = generateToken();
      expect(t).toMatch(/^[A-Za-z0-9_-]{43}$/);
      expect(Buffer.from(t, "base64url")).toHaveLength(32);
      expect(isWellFormedToken(t)).toBe(true);
    }
  });

  it("looks random: no repeats in 5000, and each bit is set about half the time", () => {
    const n = 5000;
    const seen = new Set<string>();
    const ones = new Array(256).fill(0);
    for (let i = 0; i < n; i++) {
      const t = generateToken();
      seen.add(t);
      const bytes = Buffer.from(t, "base64url");
      for (let b = 0; b < 256; b++) if (bytes[b >> 3] & (1 << (b & 7))) ones[b]++;
    }
    expect(seen.size).toBe(n);
    // Binomial(5000, 0.5): sd ≈ 35; 6 sd either side fails by chance about once in 10^9 runs per bit.
    for (const count of ones) expect(Math.abs(count - n / 2)).toBeLessThan(6 * Math.sqrt(n / 4));
  });

  it("is stored as its SHA-256, and a changed token has another hash", () => {
    const t = generateToken();
    expect(hashToken(t)).toBe(sha256Hex(t));
    expect(hashToken(t)).toMatch(/^[0-9a-f]{64}$/);
    expect(hashToken(t)).not.toBe(hashToken(`${t.slice(0, -1)}${t.endsWith("A") ? "B" : "A"}`));
  });

  it("refuses what is not a token before any lookup", () => {
    for (const bad of ["", "short", "a".repeat(42), "a".repeat(44), `${"a".repeat(42)}=`, `${"a".repeat(42)}/`]) {
      expect(isWellFormedToken(bad), bad).toBe(false);
    }
  });
});

describe("short code", () => {
  it("has at least 50 bits: 12 symbols of 30", () => {
    expect(SHORT_CODE_ALPHABET).toHaveLength(30);
    expect(new Set(SHORT_CODE_ALPHABET).size).toBe(30);
    expect(SHORT_CODE_LENGTH * Math.log2(SHORT_CODE_ALPHABET.length)).toBeGreaterThanOrEqual(50);
    // No characters that read like others: 0/O, 1/I/L, U/V.
    for (const c of "01OILU") expect(SHORT_CODE_ALPHABET).not.toContain(c);
  });

  it("draws every symbol about equally often (no modulo bias)", () => {
    const counts = new Map<string, number>();
    const codes = 4000;
    for (let i = 0; i < codes; i++) {
      const c = generateShortCode();
      // 12 random symbols and the check symbol; only the random ones are counted.
      expect(c).toHaveLength(SHORT_CODE_LENGTH + 1);
      for (const ch of c.slice(0, SHORT_CODE_LENGTH)) counts.set(ch, (counts.get(ch) ?? 0) + 1);
    }
    const expected = (codes * SHORT_CODE_LENGTH) / 30;
    // Chi-square with 29 degrees of freedom: 80 is far beyond the 0.9999 quantile (≈ 67).
    const chi = [...SHORT_CODE_ALPHABET].reduce((sum, ch) => sum + ((counts.get(ch) ?? 0) - expected) ** 2 / expected, 0);
    expect(chi).toBeLessThan(80);
  });

  it("a check symbol tells every single mistyped symbol and every swap of neighbours from a real code", () => {
    for (let n = 0; n < 300; n++) {
      const code = generateShortCode();
      expect(readShortCode(code)).toEqual({ kind: "code", symbols: code.slice(0, SHORT_CODE_LENGTH) });
      for (let i = 0; i < code.length; i++) {
        for (const other of SHORT_CODE_ALPHABET) {
          if (other === code[i]) continue;
          const typo = code.slice(0, i) + other + code.slice(i + 1);
          expect(readShortCode(typo).kind, `${code} → ${typo}`).toBe("typo");
        }
        if (i + 1 < code.length && code[i] !== code[i + 1]) {
          const swapped = code.slice(0, i) + code[i + 1] + code[i] + code.slice(i + 2);
          const pair = [code[i], code[i + 1]].map((c) => SHORT_CODE_ALPHABET.indexOf(c)).sort((a, b) => a - b);
          // Luhn's one blind spot: the first and last symbols of the alphabet swapped.
          if (!(pair[0] === 0 && pair[1] === 29)) expect(readShortCode(swapped).kind, `${code} ⇄ ${swapped}`).toBe("typo");
        }
      }
    }
  });

  it("a code printed before the check symbol (12 symbols) still reads, and hashes like its 13-symbol form", () => {
    const code = generateShortCode();
    expect(readShortCode(code.slice(0, SHORT_CODE_LENGTH)).kind).toBe("code");
    expect(hashShortCode(code)).toBe(hashShortCode(code.slice(0, SHORT_CODE_LENGTH)));
    expect(readShortCode("ABCD-EFGH-JK").kind).toBe("malformed");
  });

  it("is shown grouped and read back whatever the case, spaces or dashes", () => {
    expect(formatShortCode("ABCDEFGHJKMN" + shortCodeCheckCharacter("ABCDEFGHJKMN"))).toMatch(/^ABCD-EFGH-JKMN.$/);
    expect(normaliseShortCode(" abcd-efgh jkmn ")).toBe("ABCDEFGHJKMN");
    expect(hashShortCode("abcd efgh-jkmn")).toBe(hashShortCode("ABCD-EFGH-JKMN"));
    // Keyed, so a leaked table cannot be searched offline; never the plain SHA-256.
    expect(hashShortCode("ABCD-EFGH-JKMN")).toMatch(/^[0-9a-f]{64}$/);
    expect(hashShortCode("ABCD-EFGH-JKMN")).not.toBe(sha256Hex("ABCDEFGHJKMN"));
    expect(hashShortCode("ABCD-EFGH-JKMN")).not.toBe(hashShortCode("ABCD-EFGH-JKMP"));
    expect(isWellFormedShortCode("abcd-efgh-jkmn")).toBe(true);
    expect(isWellFormedShortCode("ABCD-EFGH-JKM0")).toBe(false);
    expect(isWellFormedShortCode(`abcd-efgh-jkmn${shortCodeCheckCharacter("ABCDEFGHJKMN").toLowerCase()}`)).toBe(true);
    expect(isWellFormedShortCode("ABCD-EFGH-JK")).toBe(false);
  });
});

describe("hash comparison", () => {
  it("is equal only for the same digest", () => {
    const a = sha256Hex("a");
    expect(hashesEqual(a, sha256Hex("a"))).toBe(true);
    expect(hashesEqual(a, sha256Hex("b"))).toBe(false);
    expect(hashesEqual(a, a.slice(0, 62))).toBe(false);
    expect(hashesEqual("", "")).toBe(false);
  });
});
