/** Calendar-date arithmetic for identifiers: no time zones, just year, month and day. */

const pad = (n: number, width: number) => String(n).padStart(width, '0');

export const isoDate = (year: number, month: number, day: number) => `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;

const isLeap = (y: number) => (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;

export function daysInMonth(year: number, month: number): number {
  return [31, isLeap(year) ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1] ?? 0;
}

/**
 * The four-digit year of a two-digit year by GS1's sliding window (GS1 General Specifications §7.12,
 * "Determination of century in dates"; the rule as quoted in implementations that cite it, the spec text
 * itself not read here): with d = YY − (reference year mod 100), 51 ≤ d ≤ 99 means the previous century,
 * −99 ≤ d ≤ −50 the next one, anything else the reference year's own century.
 */
export function windowedYear(yy: number, referenceYear: number): number {
  const century = Math.floor(referenceYear / 100);
  const d = yy - (referenceYear % 100);
  if (d >= 51) return (century - 1) * 100 + yy;
  if (d <= -50) return (century + 1) * 100 + yy;
  return century * 100 + yy;
}

/** The date of day-of-year `dayOfYear` (1 = 1 January) in `year`, or null if the year has no such day. */
export function dateOfDayOfYear(year: number, dayOfYear: number): string | null {
  if (!Number.isInteger(dayOfYear) || dayOfYear < 1 || dayOfYear > (isLeap(year) ? 366 : 365)) return null;
  let left = dayOfYear;
  for (let month = 1; month <= 12; month++) {
    const dim = daysInMonth(year, month);
    if (left <= dim) return isoDate(year, month, left);
    left -= dim;
  }
  return null;
}

/** A valid calendar date as ISO text, or null (month 1–12, day 1 to the month's length). */
export function checkedDate(year: number, month: number, day: number): string | null {
  if (!Number.isInteger(month) || month < 1 || month > 12) return null;
  if (!Number.isInteger(day) || day < 1 || day > daysInMonth(year, month)) return null;
  return isoDate(year, month, day);
}

/** The calendar date of `on` as YYYY-MM-DD: a Date is read in the runtime's local time, text is taken as written. */
function calendarDate(on: Date | string): string | null {
  if (typeof on === 'string') return /^\d{4}-\d{2}-\d{2}/.test(on) ? on.slice(0, 10) : null;
  if (Number.isNaN(on.getTime())) return null;
  return isoDate(on.getFullYear(), on.getMonth() + 1, on.getDate());
}

/**
 * Whether an item whose expiry is `expiry` (YYYY-MM-DD) has expired on `onDate`. The expiry date itself is
 * still within date (GS1 General Specifications, AI (17): the date up to which the item may be used; common
 * practice for HIBC). No expiry, or an unreadable date, is never "expired".
 */
export function isExpired(expiry: string | null | undefined, onDate: Date | string): boolean {
  if (!expiry || !/^\d{4}-\d{2}-\d{2}$/.test(expiry)) return false;
  const on = calendarDate(onDate);
  return on !== null && on > expiry;
}
