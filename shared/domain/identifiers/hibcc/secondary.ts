import { checkedDate, dateOfDayOfYear, daysInMonth, isoDate, windowedYear } from '../dates.ts';
import { fail, ok, type Result } from '../types.ts';

/** What an HIBC secondary data structure carries. */
export type HibcSecondary = {
  lot: string | null; serial: string | null; expiry: string | null; productionDate: string | null;
  quantity: number | null; notes: string[];
};

/**
 * Reads an HIBC secondary data structure without its "+", link and check characters (ANSI/HIBC 2.x,
 * Secondary Data Structure and its date formats; the flag table from memory):
 *   "$" lot · "$+" serial · "$$" date + lot · "$$+" date + serial · "$$8" 2-digit quantity, date, lot ·
 *   "$$9" 5-digit quantity, date, lot · five digits YYJJJ (Julian date, read as the expiry) then lot.
 * The date after "$$" is flagged by its first digit: 0 or 1 → MMYY; 2 → MMDDYY; 3 → YYMMDD; 4 → YYMMDDHH;
 * 5 → YYJJJ; 6 → YYJJJHH; 7 → no date. Supplemental fields after "/" (ANSI/HIBC 2.5 and later, from
 * memory): "S" serial, "14D" expiry YYYYMMDD, "16D" production date YYYYMMDD, "Q" quantity.
 */
export function parseSecondary(data: string, reference: Date): Result<HibcSecondary> {
  const out: HibcSecondary = { lot: null, serial: null, expiry: null, productionDate: null, quantity: null, notes: [] };
  const [main = '', ...supplements] = data.split('/');
  let rest: string;
  let field: 'lot' | 'serial' = 'lot';
  if (main.startsWith('$$')) {
    rest = main.slice(2);
    if (rest.startsWith('+')) { field = 'serial'; rest = rest.slice(1); }
    const qtyDigits = rest[0] === '8' ? 2 : rest[0] === '9' ? 5 : 0;
    if (qtyDigits > 0) {
      const qty = rest.slice(1, 1 + qtyDigits);
      if (!/^\d+$/.test(qty) || qty.length !== qtyDigits) return fail(`HIBC quantity after "$$${rest[0]}" must be ${qtyDigits} digits`);
      out.quantity = Number(qty);
      rest = rest.slice(1 + qtyDigits);
    }
    const date = readFlaggedDate(rest, reference);
    if (!date.ok) return date;
    out.expiry = date.value.expiry;
    if (date.value.note) out.notes.push(date.value.note);
    rest = rest.slice(date.value.used);
  } else if (main.startsWith('$+')) {
    field = 'serial';
    rest = main.slice(2);
  } else if (main.startsWith('$')) {
    rest = main.slice(1);
  } else if (/^\d{5}/.test(main)) {
    const date = julian(main.slice(0, 5), reference);
    if (!date) return fail(`HIBC Julian date "${main.slice(0, 5)}" is not a day of its year`);
    out.expiry = date;
    rest = main.slice(5);
  } else {
    return fail('HIBC secondary data must start with "$", "$$", "$+", "$$+" or a five-digit Julian date');
  }
  if (rest.length > 18) return fail(`HIBC ${field} "${rest}" is longer than 18 characters`);
  if (rest.length > 0) out[field] = rest;
  for (const s of supplements) {
    const problem = readSupplement(s, out);
    if (problem) return fail(problem);
  }
  return ok(out);
}

type FlaggedDate = { expiry: string | null; used: number; note?: string };

function readFlaggedDate(text: string, reference: Date): Result<FlaggedDate> {
  const flag = text[0];
  const year = (yy: string) => windowedYear(Number(yy), reference.getUTCFullYear());
  const need = (n: number, format: string) => /^\d+$/.test(text.slice(0, n)) && text.length >= n ? null : `HIBC expiry in format ${format} needs ${n} digits`;
  const bad = (format: string, s: string) => fail<FlaggedDate>(`HIBC expiry "${s}" (${format}) is not a calendar date`);
  if (flag === '0' || flag === '1') {
    const e = need(4, 'MMYY'); if (e) return fail(e);
    const mm = Number(text.slice(0, 2)); const y = year(text.slice(2, 4));
    if (mm < 1 || mm > 12) return bad('MMYY', text.slice(0, 4));
    // A month-only expiry runs to the month's end (common practice, as GS1's day 00).
    return ok({ expiry: isoDate(y, mm, daysInMonth(y, mm)), used: 4 });
  }
  if (flag === '2' || flag === '3' || flag === '4') {
    const format = flag === '2' ? 'MMDDYY' : flag === '3' ? 'YYMMDD' : 'YYMMDDHH';
    const n = flag === '4' ? 8 : 6;
    const e = need(1 + n, format); if (e) return fail(e);
    const s = text.slice(1, 1 + n);
    const [mm, dd, yy] = flag === '2' ? [s.slice(0, 2), s.slice(2, 4), s.slice(4, 6)] : [s.slice(2, 4), s.slice(4, 6), s.slice(0, 2)];
    const date = checkedDate(year(yy), Number(mm), Number(dd));
    if (!date) return bad(format, s);
    if (flag === '4' && Number(s.slice(6, 8)) > 23) return bad(format, s);
    return ok({ expiry: date, used: 1 + n, note: flag === '4' ? `HIBC expiry hour ${s.slice(6, 8)} not kept` : undefined });
  }
  if (flag === '5' || flag === '6') {
    const n = flag === '5' ? 5 : 7;
    const e = need(1 + n, flag === '5' ? 'YYJJJ' : 'YYJJJHH'); if (e) return fail(e);
    const s = text.slice(1, 1 + n);
    const date = julian(s.slice(0, 5), reference);
    if (!date || (flag === '6' && Number(s.slice(5, 7)) > 23)) return bad(flag === '5' ? 'YYJJJ' : 'YYJJJHH', s);
    return ok({ expiry: date, used: 1 + n, note: flag === '6' ? `HIBC expiry hour ${s.slice(5, 7)} not kept` : undefined });
  }
  if (flag === '7') return ok({ expiry: null, used: 1 });
  return fail('HIBC "$$" must be followed by a date format digit 0–7 (or 8 or 9 and a quantity)');
}

function julian(yyjjj: string, reference: Date): string | null {
  if (!/^\d{5}$/.test(yyjjj)) return null;
  return dateOfDayOfYear(windowedYear(Number(yyjjj.slice(0, 2)), reference.getUTCFullYear()), Number(yyjjj.slice(2)));
}

function yyyymmdd(s: string): string | null {
  if (!/^\d{8}$/.test(s)) return null;
  return checkedDate(Number(s.slice(0, 4)), Number(s.slice(4, 6)), Number(s.slice(6, 8)));
}

function readSupplement(s: string, out: HibcSecondary): string | null {
  if (s.startsWith('14D') || s.startsWith('16D')) {
    const date = yyyymmdd(s.slice(3));
    if (!date) return `HIBC supplemental date "${s}" must be YYYYMMDD after its flag`;
    if (s.startsWith('14D')) out.expiry = date;
    else out.productionDate = date;
  } else if (s.startsWith('S')) {
    if (s.length < 2) return 'HIBC supplemental serial "/S" is empty';
    out.serial = s.slice(1);
  } else if (s.startsWith('Q') && /^Q\d+$/.test(s)) {
    out.quantity = Number(s.slice(1));
  } else {
    out.notes.push(`HIBC supplemental field "/${s}" not used`);
  }
  return null;
}
