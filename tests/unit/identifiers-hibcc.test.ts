import { describe, expect, it } from 'vitest';
import { combineHibcc, hibcCheckCharacter, parseIdentifier, type DeviceIdentifier } from '#shared/domain/identifiers/index.ts';

// Sources: the HIBC Supplier Labeling Standard (ANSI/HIBC 2.x): the mod-43 check character and its value
// table, the primary structure (+ LIC PCN U/M check), the secondary structure and its date formats, and the
// concatenated form (primary "/" secondary, one check character). The check-character worked example
// "+A123BJC5D6E71" → G (sum 145, 145 mod 43 = 16 = G) is the standard's own, as reproduced in scanner
// reference guides. Every other check character below was worked by hand with the same value table
// (0–9 → 0–9, A–Z → 10–35, - 36, . 37, space 38, $ 39, / 40, + 41, % 42).

const onDay = new Date('2026-03-01T00:00:00Z');
const value = (text: string): DeviceIdentifier => {
  const r = parseIdentifier(text, { referenceDate: onDay });
  if (!r.ok) throw new Error(`expected a reading of ${JSON.stringify(text)}, got: ${r.error}`);
  return r.value;
};
const error = (text: string): string => {
  const r = parseIdentifier(text, { referenceDate: onDay });
  if (r.ok) throw new Error(`expected ${JSON.stringify(text)} to be refused`);
  return r.error;
};

describe('the HIBC mod-43 check character', () => {
  it('is G for the standard’s worked example +A123BJC5D6E71', () => {
    // 41+10+1+2+3+11+19+12+5+13+6+14+7+1 = 145; 145 = 3·43 + 16; value 16 is G.
    expect(hibcCheckCharacter('+A123BJC5D6E71')).toBe('G');
  });

  it('refuses characters outside the 43-character set', () => {
    expect(hibcCheckCharacter('+a123')).toBeNull();
    expect(error('+A123BJC5D6E71g')).toMatch(/43-character set/);
  });
});

describe('an HIBC primary code', () => {
  it('gives labeler, product and unit of measure, and its check character as the link', () => {
    expect(value('+A123BJC5D6E71G')).toMatchObject({
      scheme: 'hibcc', form: 'hibcc_primary', labeler: 'A123', product: 'BJC5D6E7', unitOfMeasure: 1, linkCharacter: 'G', gtin: null, lot: null,
    });
  });

  it('refuses a code whose check character is wrong, saying the right one', () => {
    expect(error('+A123BJC5D6E71F')).toMatch(/should be "G", not "F"/);
  });

  it('reads the printed caption: asterisks dropped, an underscore for a space check character', () => {
    // +H12TABC01: 41+17+1+2+29+10+11+12+0+1 = 124 = 2·43 + 38 → space (by hand).
    expect(value('*+H12TABC01_*')).toMatchObject({ labeler: 'H12T', product: 'ABC0', unitOfMeasure: 1, linkCharacter: ' ' });
  });

  it('refuses a labeler code that does not start with a letter', () => {
    // +1123ABC01 → check by hand: 41+1+1+2+3+10+11+12+0+1 = 82 = 43 + 39 → $.
    expect(error('+1123ABC01$')).toMatch(/secondary data must start/);
  });
});

describe('an HIBC secondary code on its own', () => {
  it.each([
    // text, what it holds (check characters by hand)
    ['+$$0927LOT123GI', { expiry: '2027-09-30', lot: 'LOT123' }], // $$ MMYY: month-only expiry runs to its end
    ['+$$3270315LOT7GM', { expiry: '2027-03-15', lot: 'LOT7' }], // $$3 YYMMDD
    ['+$$527060LOTJGX', { expiry: '2027-03-01', lot: 'LOTJ' }], // $$5 YYJJJ: day 60 of 2027
    ['+$$427031514LOT8GT', { expiry: '2027-03-15', lot: 'LOT8', notes: ['HIBC expiry hour 14 not kept'] }], // $$4 YYMMDDHH, hour 14 noted
    ['+$$7LOTNODATEGS', { expiry: null, lot: 'LOTNODATE' }], // $$7: no date
    ['+$$8050927LOTQG8', { quantity: 5, expiry: '2027-09-30', lot: 'LOTQ' }], // $$8: two-digit quantity, then MMYY
    ['+$LOT99GG', { lot: 'LOT99', expiry: null }], // $: lot only
    ['+$+SN12345GV', { serial: 'SN12345', lot: null }], // $+: serial only
    ['+$$+2031527SN77G3', { serial: 'SN77', expiry: '2027-03-15' }], // $$+2 MMDDYY then serial
    ['+27060LOT5GM', { expiry: '2027-03-01', lot: 'LOT5' }], // five-digit Julian date then lot
  ])('reads %s', (text, expected) => {
    expect(value(text)).toMatchObject({ form: 'hibcc_secondary', linkCharacter: 'G', ...expected });
  });

  it('refuses an expiry that is not on the calendar', () => {
    // +$$3270230LOTXG → 1 (by hand); 30 February does not exist.
    expect(error('+$$3270230LOTXG1')).toMatch(/not a calendar date/);
  });

  it('joins with its primary when its link matches the primary’s check character', () => {
    const joined = combineHibcc(value('+A123BJC5D6E71G'), value('+$$3270315LOT7GM'));
    expect(joined).toMatchObject({ ok: true, value: { form: 'hibcc_concatenated', labeler: 'A123', lot: 'LOT7', expiry: '2027-03-15' } });
  });

  it('will not join with a primary it does not belong to', () => {
    // +H12TABC01 has check character space, so a secondary linked to G is another item's.
    expect(combineHibcc(value('+H12TABC01 '), value('+$$3270315LOT7GM'))).toMatchObject({ ok: false, error: expect.stringContaining('another primary') });
  });
});

describe('an HIBC concatenated code (primary / secondary, one check character)', () => {
  it('gives labeler, product, unit, expiry and lot together', () => {
    // +A123BJC5D6E71/$$3270315LOT7 → L (by hand).
    expect(value('+A123BJC5D6E71/$$3270315LOT7L')).toMatchObject({
      form: 'hibcc_concatenated', labeler: 'A123', product: 'BJC5D6E7', unitOfMeasure: 1, expiry: '2027-03-15', lot: 'LOT7',
    });
  });

  it('reads supplemental serial and production date fields after further slashes', () => {
    // Supplemental flags "/S" serial and "/16D" production date YYYYMMDD (ANSI/HIBC 2.5 on; from memory). Check 5 by hand.
    expect(value('+A123BJC5D6E71/$$3270315LOT7/S12345/16D202503015')).toMatchObject({ serial: '12345', productionDate: '2025-03-01', lot: 'LOT7' });
  });

  it('arrives the same through a scanner’s Code 128 symbology identifier', () => {
    expect(value(']C0+A123BJC5D6E71G')).toMatchObject({ labeler: 'A123' });
  });
});
