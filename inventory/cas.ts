/**
 * CAS Registry Numbers: format and check digit.
 *
 * A CAS number is written NNNNNNN-NN-R (2 to 7 digits, 2 digits, 1 check digit). The check
 * digit R is the sum of every other digit times its position counted from the right
 * (the digit just left of R is position 1), modulo 10 — the rule published by the
 * Chemical Abstracts Service ("CAS Registry Number — check digit verification").
 * Example: water 7732-18-5: 8·1 + 1·2 + 2·3 + 3·4 + 7·5 + 7·6 = 105 → 5.
 */

const CAS_FORMAT = /^(\d{2,7})-(\d{2})-(\d)$/;

/** The check digit the other digits of `cas` call for, or null when the format is wrong. */
export function casCheckDigit(cas: string): number | null {
  const m = CAS_FORMAT.exec(cas.trim());
  if (!m) return null;
  const digits = `${m[1]}${m[2]}`;
  let sum = 0;
  for (let i = 0; i < digits.length; i++) sum += Number(digits[digits.length - 1 - i]) * (i + 1);
  return sum % 10;
}

/** Why `cas` is not a valid CAS number, or null when it is (format and check digit). */
export function casProblem(cas: string): string | null {
  const m = CAS_FORMAT.exec(cas.trim());
  if (!m) return "must look like 7732-18-5 (2–7 digits, 2 digits, 1 check digit)";
  const expected = casCheckDigit(cas);
  if (expected !== Number(m[3])) return `check digit should be ${expected}, not ${m[3]}`;
  return null;
}

/** Whether `cas` is a well-formed CAS number with the right check digit. */
export function isValidCas(cas: string): boolean {
  return casProblem(cas) === null;
}
