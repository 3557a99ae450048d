/**
 * GS1 mod-10 check digit (GS1 General Specifications 7.9.1): weights 3,1,3,… from the
 * right of the digits before the check digit; check = (10 − sum mod 10) mod 10.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function gs1CheckDigit(digitsWithoutCheck: string): number {
  let sum = 0;
  for (let i = 0; i < digitsWithoutCheck.length; i++) {
    const digit = digitsWithoutCheck.charCodeAt(digitsWithoutCheck.length - 1 - i) - 48;
    sum += digit * (i % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

/**
 * True for a GTIN-8, -12, -13 or -14 made of digits only whose check digit is right.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function isValidGtin(digits: string): boolean {
  if (typeof digits !== "string" || !/^\d+$/.test(digits)) return false;
  if (![8, 12, 13, 14].includes(digits.length)) return false;
  return gs1CheckDigit(digits.slice(0, -1)) === Number(digits[digits.length - 1]);
}
