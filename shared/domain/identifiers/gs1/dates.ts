import { checkedDate, daysInMonth, isoDate, windowedYear } from '../dates.ts';
import { fail, ok, type Result } from '../types.ts';

/**
 * A GS1 date field YYMMDD (AIs 11, 13, 15, 16, 17) as an ISO date. The century comes from the sliding
 * window of §7.12 against `reference`'s year. Day 00 means the month only; we read it as the month's last
 * day (GS1 General Specifications, AI (17): "If only year and month are available, DD must be filled with
 * two zeroes", and for an expiry the end of that month is the safe reading; from memory of the spec
 * wording; GS1 has since asked new labels to carry a real day).
 */
export function parseGs1Date(yymmdd: string, reference: Date, what: string): Result<string> {
  if (!/^\d{6}$/.test(yymmdd)) return fail(`${what} "${yymmdd}" must be six digits YYMMDD`);
  const yy = Number(yymmdd.slice(0, 2));
  const mm = Number(yymmdd.slice(2, 4));
  const dd = Number(yymmdd.slice(4, 6));
  if (mm < 1 || mm > 12) return fail(`${what} "${yymmdd}" has month ${mm}; months run 01 to 12`);
  const year = windowedYear(yy, reference.getUTCFullYear());
  if (dd === 0) return ok(isoDate(year, mm, daysInMonth(year, mm)));
  const date = checkedDate(year, mm, dd);
  return date ? ok(date) : fail(`${what} "${yymmdd}" is not a calendar date (day ${dd} of month ${mm} in ${year})`);
}
