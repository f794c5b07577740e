/**
 * The HIBC LIC modulus 43 check character (HIBC Supplier Labeling Standard, ANSI/HIBC 2.x, "Check
 * Character Calculation"): each character of the data, from the leading "+" on, has a value in the table
 * 0–9 → 0–9, A–Z → 10–35, "-" 36, "." 37, space 38, "$" 39, "/" 40, "+" 41, "%" 42; the check character
 * is the one whose value is the sum modulo 43.
 */
export const HIBC_CHARACTERS = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZ-. $/+%';

const valueOf = new Map([...HIBC_CHARACTERS].map((c, i) => [c, i]));

/** The check character for `data`, or null if it holds a character outside the 43-character set. */
export function hibcCheckCharacter(data: string): string | null {
  let sum = 0;
  for (const c of data) {
    const v = valueOf.get(c);
    if (v === undefined) return null;
    sum += v;
  }
  return HIBC_CHARACTERS[sum % 43]!;
}

/** The first character of `text` outside the 43-character set, or null. */
export function firstForeignCharacter(text: string): string | null {
  for (const c of text) if (!valueOf.has(c)) return c;
  return null;
}
