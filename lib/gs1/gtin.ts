// GS1 check digits and GTIN normalisation.
//
// Check digit rule (GS1 General Specifications section 7.9.1, "Standard check digit
// calculation for GS1 data structures"; also trade-facts.md section 6): weights 3,1,3,1...
// applied from the rightmost digit of the body (the digit just left of the check digit);
// check = (10 - sum mod 10) mod 10. The same rule covers GTIN-8/12/13/14, SSCC (18 digits)
// and GLN, so the body may be any length of digits.

export class Gs1CheckDigitError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "Gs1CheckDigitError";
  }
}

const DIGITS = /^[0-9]+$/;

/** Mod-10 check digit for a string of digits (without its check digit). */
export function gtinCheckDigit(body: string): number {
  if (!DIGITS.test(body)) throw new Gs1CheckDigitError("the body must be one or more digits 0-9");
  let sum = 0;
  for (let i = body.length - 1, w = 3; i >= 0; i--, w = 4 - w) {
    sum += (body.charCodeAt(i) - 48) * w;
  }
  return (10 - (sum % 10)) % 10;
}

/** True when the last digit of `s` is the correct mod-10 check digit of the rest (any length >= 2). */
export function hasValidCheckDigit(s: string): boolean {
  if (s.length < 2 || !DIGITS.test(s)) return false;
  return gtinCheckDigit(s.slice(0, -1)) === s.charCodeAt(s.length - 1) - 48;
}

const GTIN_LENGTHS = new Set([8, 12, 13, 14]);

/** A GTIN-8, -12, -13 or -14 with a correct check digit (no spaces, no padding beyond 14). */
export function isValidGtin(s: string): boolean {
  return typeof s === "string" && GTIN_LENGTHS.has(s.length) && hasValidCheckDigit(s);
}

/**
 * The 14-digit form of a GTIN (GTIN-8/12/13 right-aligned, padded with leading zeros, as AI (01)
 * carries them), or null when the input is not 8, 12, 13 or 14 digits after removing spaces, or its
 * check digit is wrong.
 */
export function normalizeGtin(s: string): string | null {
  if (typeof s !== "string") return null;
  const compact = s.replace(/\s+/g, "");
  if (!isValidGtin(compact)) return null;
  return compact.padStart(14, "0");
}
