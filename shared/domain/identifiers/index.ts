import { identifierFromAis } from './gs1/fields.ts';
import { GS, splitBracketed, splitElementString } from './gs1/element-string.ts';
import { splitDigitalLink } from './gs1/digital-link.ts';
import { parseHibcc } from './hibcc/parse.ts';
import { fail, type DeviceIdentifier, type Result } from './types.ts';

export type { DeviceIdentifier, Result } from './types.ts';
export { isExpired } from './dates.ts';
export { gs1CheckDigit, normaliseGtin } from './gs1/check-digit.ts';
export { hibcCheckCharacter, HIBC_CHARACTERS } from './hibcc/check-character.ts';
export { combineHibcc } from './hibcc/parse.ts';
export { GS } from './gs1/element-string.ts';

export type ParseOptions = {
  /** The day the two-digit years are windowed against (GS1 §7.12); today when absent. */
  referenceDate?: Date;
};

/**
 * Symbology identifiers that say the data is a GS1 element string (ISO/IEC 15424; GS1 General
 * Specifications §5.1.2, from memory): GS1-128 ]C1, GS1 DataBar ]e0, GS1 DataMatrix ]d2, GS1 QR Code ]Q3.
 */
const GS1_SYMBOLOGIES = [']C1', ']e0', ']d2', ']Q3'];

/**
 * Reads whatever a scanner (or a person typing) gives for a device label: a GS1 element string (with or
 * without a symbology identifier, FNC1 sent as the GS character), its bracketed human-readable form, a
 * GS1 Digital Link URI, or an HIBC code. Never throws: the result says what is wrong in plain words.
 */
export function parseIdentifier(scanned: unknown, options: ParseOptions = {}): Result<DeviceIdentifier> {
  if (typeof scanned !== 'string') return fail('the scanned text must be a string');
  const reference = options.referenceDate && !Number.isNaN(options.referenceDate.getTime()) ? options.referenceDate : new Date();
  let text = scanned.replace(/^[\s]+/, '').replace(/[\r\n]+$/, '');
  if (text.length === 0) return fail('nothing was scanned');
  if (text.length > 2000) return fail('the scanned text is too long for a device label');
  let symbology: string | null = null;
  if (/^\][A-Za-z][0-9A-Za-z]/.test(text)) {
    symbology = text.slice(0, 3);
    text = text.slice(3);
  }
  if (symbology && GS1_SYMBOLOGIES.includes(symbology)) return fromElementString(text, reference);
  if (/^https?:\/\//i.test(text)) {
    const pairs = splitDigitalLink(text.trim());
    return pairs.ok ? identifierFromAis(pairs.value, 'digital_link', reference) : fail(`GS1 Digital Link: ${pairs.error}`);
  }
  if (text.startsWith('+') || text.startsWith('*+')) return parseHibcc(text, reference);
  if (text.trimStart().startsWith('(')) {
    const pairs = splitBracketed(text);
    return pairs.ok ? identifierFromAis(pairs.value, 'bracketed', reference) : fail(`GS1: ${pairs.error}`);
  }
  if (/^[\d\u001d]/.test(text)) return fromElementString(text, reference);
  return fail('not a device identifier Ledgerline reads: expected a GS1 code, a GS1 Digital Link URI or an HIBC code starting with "+"');
}

function fromElementString(text: string, reference: Date): Result<DeviceIdentifier> {
  const data = text.replace(/[\s]+$/, '');
  const pairs = splitElementString(data.startsWith(GS) ? data.slice(1) : data);
  return pairs.ok ? identifierFromAis(pairs.value, 'element_string', reference) : fail(`GS1: ${pairs.error}`);
}
