import { fail, ok, type Result } from '../types.ts';

/**
 * GS1 standard check digit (GS1 General Specifications §7.9.1, "Standard check digit calculations for GS1
 * data structures"): from the rightmost data digit leftwards, multiply alternately by 3 and 1, add up, and
 * take the amount that brings the sum to the next multiple of ten.
 */
export function gs1CheckDigit(digitsWithoutCheck: string): number | null {
  if (!/^\d+$/.test(digitsWithoutCheck)) return null;
  let sum = 0;
  for (let i = digitsWithoutCheck.length - 1, weight = 3; i >= 0; i--, weight = 4 - weight) {
    sum += (digitsWithoutCheck.charCodeAt(i) - 48) * weight;
  }
  return (10 - (sum % 10)) % 10;
}

/**
 * A GTIN-8, -12, -13 or -14 checked and normalised to 14 digits by leading zeros (GS1 General
 * Specifications: a GTIN is right-justified in the 14-digit field of AI (01); from memory).
 */
export function normaliseGtin(text: string): Result<string> {
  const gtin = text.trim();
  if (!/^\d+$/.test(gtin)) return fail(`GTIN "${gtin}" must be digits only`);
  if (![8, 12, 13, 14].includes(gtin.length)) return fail(`GTIN "${gtin}" has ${gtin.length} digits; a GTIN has 8, 12, 13 or 14`);
  const expected = gs1CheckDigit(gtin.slice(0, -1));
  const given = Number(gtin.at(-1));
  if (expected !== given) return fail(`GTIN ${gtin} fails its check digit: the last digit should be ${expected}, not ${given}`);
  return ok(gtin.padStart(14, '0'));
}
