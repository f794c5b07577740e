import { describe, expect, it } from 'vitest';
import { gs1CheckDigit, isExpired, normaliseGtin, parseIdentifier, type DeviceIdentifier } from '#shared/domain/identifiers/index.ts';

// Sources: GS1 General Specifications §7.9.1 (standard mod-10 check digit), §7.8.5 (predefined-length
// element strings and FNC1), §7.12 (century of two-digit years, as quoted by implementations that cite
// it), the AI table (AIs 01, 10, 11, 17, 21) and the GS1 Digital Link URI syntax. GS1's example GTIN
// 09506000134352 is the one GS1's Digital Link documents use (from memory); its check digit is worked by
// hand below.

const onDay = new Date('2026-03-01T00:00:00Z');
const read = (text: string, referenceDate = onDay) => parseIdentifier(text, { referenceDate });
const value = (text: string, referenceDate = onDay): DeviceIdentifier => {
  const r = read(text, referenceDate);
  if (!r.ok) throw new Error(`expected a reading of ${JSON.stringify(text)}, got: ${r.error}`);
  return r.value;
};
const error = (text: string, referenceDate = onDay): string => {
  const r = read(text, referenceDate);
  if (r.ok) throw new Error(`expected ${JSON.stringify(text)} to be refused`);
  return r.error;
};
const GS = '\u001d';

describe('the GS1 check digit (mod 10, weights 3 and 1 from the right)', () => {
  it.each([
    // GS1's worked example for a GTIN-13 (the "calculate a check digit manually" example): 629104150021 → 3.
    // By hand: 1·3 + 2·1 + 0·3 + 0·1 + 5·3 + 1·1 + 4·3 + 0·1 + 1·3 + 9·1 + 2·3 + 6·1 = 57 → 60 − 57 = 3.
    ['629104150021', 3],
    // GTIN-14 0950600013435|2: 5·3 + 3 + 4·3 + 3 + 1·3 + 0 + 0 + 0 + 6·3 + 0 + 5·3 + 9 + 0 = 78 → 2 (by hand).
    ['0950600013435', 2],
    // GTIN-8 2345678|5: 8·3 + 7 + 6·3 + 5 + 4·3 + 3 + 2·3 = 75 → 5 (by hand).
    ['2345678', 5],
    // GTIN-12 (UPC-A) 03600029145|2: 5·3 + 4 + 1·3 + 9 + 2·3 + 0 + 0 + 0 + 6·3 + 3 + 0 = 58 → 2 (by hand).
    ['03600029145', 2],
  ])('of %s is %d', (digits, check) => {
    expect(gs1CheckDigit(digits)).toBe(check);
  });

  it('normalises GTIN-8, -12 and -13 to 14 digits with leading zeros', () => {
    expect(normaliseGtin('23456785')).toEqual({ ok: true, value: '00000023456785' });
    expect(normaliseGtin('036000291452')).toEqual({ ok: true, value: '00036000291452' });
    expect(normaliseGtin('6291041500213')).toEqual({ ok: true, value: '06291041500213' });
  });

  it('refuses a GTIN whose last digit is wrong, saying which digit it should be', () => {
    const r = normaliseGtin('6291041500214');
    expect(r).toEqual({ ok: false, error: expect.stringContaining('should be 3') });
  });

  it('refuses a GTIN of a length GS1 does not define', () => {
    expect(normaliseGtin('12345')).toEqual({ ok: false, error: expect.stringContaining('8, 12, 13 or 14') });
  });
});

describe('a GS1 element string as a scanner sends it', () => {
  it('reads GTIN, expiry, lot and serial after the GS1 DataMatrix symbology identifier ]d2', () => {
    expect(value(`]d201095060001343521728123110ABC123${GS}21SN-0042`)).toMatchObject({
      scheme: 'gs1', form: 'element_string', gtin: '09506000134352', expiry: '2028-12-31', lot: 'ABC123', serial: 'SN-0042',
    });
  });

  it('reads the same data after ]C1 (GS1-128), ]Q3 (GS1 QR Code) and ]e0 (GS1 DataBar), or with none', () => {
    const data = `010950600013435211250301${GS}10L77`;
    for (const prefix of [']C1', ']Q3', ']e0', '']) {
      expect(value(prefix + data)).toMatchObject({ gtin: '09506000134352', productionDate: '2025-03-01', lot: 'L77' });
    }
  });

  it('ignores a leading FNC1 and steps over a GS after a predefined-length field', () => {
    expect(value(`${GS}0109506000134352${GS}17281231`)).toMatchObject({ gtin: '09506000134352', expiry: '2028-12-31' });
  });

  it('steps over other AIs of predefined length and says so in its notes', () => {
    // (3103) net weight in kg, 6 digits, no separator needed (GS1 General Specifications Figure 7.8.5-2).
    const v = value(`01095060001343523103000125${GS}10LOT9`);
    expect(v).toMatchObject({ gtin: '09506000134352', lot: 'LOT9' });
    expect(v.notes).toEqual([expect.stringContaining('AI (3103)')]);
  });

  it('refuses an unknown AI it cannot step over, saying where', () => {
    expect(error('01095060001343527777ABC')).toMatch(/unknown application identifier at character 17/);
  });

  it('refuses a wrong GTIN check digit', () => {
    expect(error('0109506000134353')).toMatch(/should be 2, not 3/);
  });

  it('refuses a lot longer than the 20 characters AI (10) allows', () => {
    expect(error(`0109506000134352${'10'}${'A'.repeat(21)}`)).toMatch(/AI \(10\).*1 to 20 characters/);
  });

  it('refuses a character outside GS1’s set 82 in a lot', () => {
    expect(error('010950600013435210AB#1')).toMatch(/AI \(10\).*character/);
  });

  it('refuses the same AI twice with different values', () => {
    expect(error(`0109506000134352${'10'}A${GS}10B`)).toMatch(/appears twice/);
  });

  it('refuses a fixed-length field cut short', () => {
    expect(error('01095060001343')).toMatch(/cut short/);
  });
});

describe('GS1 dates (YYMMDD)', () => {
  it('reads day 00 as the last day of the month', () => {
    expect(value('0109506000134352172602' + '00').expiry).toBe('2026-02-28');
    expect(value('0109506000134352172402' + '00').expiry).toBe('2024-02-29'); // 2024 is a leap year
  });

  it('refuses a date that is not on the calendar', () => {
    expect(error('010950600013435217230229')).toMatch(/not a calendar date/);
    expect(error('010950600013435217261301')).toMatch(/month 13/);
  });

  it.each([
    // §7.12 window with d = YY − (reference year mod 100): d ≥ 51 → previous century, d ≤ −50 → next.
    ['2025-06-01', '75', 2075], // d = 50: this century
    ['2025-06-01', '76', 1976], // d = 51: more than 50 years ahead → last century
    ['2075-06-01', '26', 2026], // d = −49: this century
    ['2075-06-01', '25', 2125], // d = −50: more than 49 years behind → next century
  ])('on %s reads year %s as %d', (on, yy, year) => {
    expect(value(`0109506000134352${'17'}${yy}0101`, new Date(`${on}T00:00:00Z`)).expiry).toBe(`${year}-01-01`);
  });
});

describe('the bracketed human-readable form', () => {
  it('reads "(01)…(17)…(10)…(21)…" with or without spaces', () => {
    expect(value('(01)09506000134352(17)281231(10)ABC123(21)7')).toMatchObject({ form: 'bracketed', gtin: '09506000134352', expiry: '2028-12-31', lot: 'ABC123', serial: '7' });
    expect(value('(01) 09506000134352 (11) 250301 (10) ABC123')).toMatchObject({ productionDate: '2025-03-01', lot: 'ABC123' });
  });

  it('notes an AI it does not know and keeps reading', () => {
    const v = value('(01)09506000134352(7777)X(10)A1');
    expect(v).toMatchObject({ gtin: '09506000134352', lot: 'A1' });
    expect(v.notes).toEqual([expect.stringContaining('(7777)')]);
  });
});

describe('GS1 Digital Link URIs', () => {
  it('reads the path key, its qualifiers and the query attributes on any host', () => {
    expect(value('https://example.org/01/09506000134352/10/ABC%2F1/21/12345?17=281231&linkType=gs1:pip')).toMatchObject({
      form: 'digital_link', gtin: '09506000134352', lot: 'ABC/1', serial: '12345', expiry: '2028-12-31',
    });
  });

  it('accepts a path prefix before /01/ and a GTIN-13, padded to 14 digits', () => {
    expect(value('https://labels.example.com/products/01/6291041500213?11=250301').gtin).toBe('06291041500213');
  });

  it('refuses qualifiers out of order and a missing GTIN', () => {
    expect(error('https://example.org/01/09506000134352/21/1/10/A')).toMatch(/22, 10, 21/);
    expect(error('https://example.org/10/ABC')).toMatch(/no GTIN/);
  });

  it('refuses a GTIN with a wrong check digit in the path', () => {
    expect(error('https://example.org/01/09506000134353')).toMatch(/check digit/);
  });
});

describe('expiry checks', () => {
  it('treats the expiry date itself as still in date and the next day as expired', () => {
    expect(isExpired('2028-12-31', '2028-12-31')).toBe(false);
    expect(isExpired('2028-12-31', '2029-01-01')).toBe(true);
    expect(isExpired('2028-12-31', new Date(2029, 0, 1, 9, 0))).toBe(true);
  });

  it('never calls an item without an expiry expired', () => {
    expect(isExpired(null, '2099-01-01')).toBe(false);
  });
});

describe('input that is not a device identifier', () => {
  it.each(['', 'hello', '   ', ']Z9??'])('refuses %j with a message', (text) => {
    expect(read(text).ok).toBe(false);
  });

  it('never throws, whatever it is given', () => {
    for (const x of [null, undefined, 42, {}, [], 'https://', '(01)', '+', '01', ']d2', '\u001d\u001d']) {
      expect(() => parseIdentifier(x)).not.toThrow();
    }
  });
});
