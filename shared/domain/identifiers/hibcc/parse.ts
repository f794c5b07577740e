import { emptyIdentifier, fail, ok, type DeviceIdentifier, type Result } from '../types.ts';
import { firstForeignCharacter, hibcCheckCharacter } from './check-character.ts';
import { parseSecondary } from './secondary.ts';

/**
 * Reads an HIBC LIC code (ANSI/HIBC 2.x Supplier Labeling Standard): primary "+LLLLP…U C", secondary
 * "+S… L C" (L = the link, the primary's check character), or both concatenated "+LLLLP…U/S… C" with one
 * check character over all. The human-readable caption's asterisks are dropped, and its underscore stands
 * for a space check character (the standard's caption rule).
 */
export function parseHibcc(scanned: string, reference: Date): Result<DeviceIdentifier> {
  let text = scanned.replace(/^\s+/, '').replace(/[\r\n\t]+$/, '');
  if (text.startsWith('*') && text.endsWith('*') && text.length > 1) text = text.slice(1, -1);
  if (text.endsWith('_')) text = `${text.slice(0, -1)} `;
  if (!text.startsWith('+')) return fail('an HIBC code starts with "+"');
  if (text.length < 3) return fail('the HIBC code is too short');
  const foreign = firstForeignCharacter(text);
  if (foreign !== null) return fail(`the HIBC code has "${foreign}", which is not in HIBC's 43-character set (0-9 A-Z - . space $ / + %)`);
  const data = text.slice(0, -1);
  const given = text.at(-1)!;
  const expected = hibcCheckCharacter(data)!;
  if (given !== expected) return fail(`the HIBC code fails its mod-43 check: the last character should be "${expected}", not "${given}"`);
  const body = data.slice(1);
  if (/^[A-Z]/.test(body)) {
    const slash = body.indexOf('/');
    const primary = readPrimary(slash === -1 ? body : body.slice(0, slash));
    if (!primary.ok) return primary;
    if (slash === -1) {
      primary.value.linkCharacter = given;
      return primary;
    }
    const id = primary.value;
    id.form = 'hibcc_concatenated';
    const secondary = parseSecondary(body.slice(slash + 1), reference);
    if (!secondary.ok) return secondary;
    return ok({ ...id, ...secondary.value, notes: [...id.notes, ...secondary.value.notes] });
  }
  if (body.length < 2) return fail('the HIBC secondary code is too short');
  const id = emptyIdentifier('hibcc', 'hibcc_secondary');
  id.linkCharacter = body.at(-1)!;
  const secondary = parseSecondary(body.slice(0, -1), reference);
  if (!secondary.ok) return secondary;
  return ok({ ...id, ...secondary.value });
}

/** Primary data: LIC (a letter and three letters or digits), product number (1–18), unit of measure (a digit). */
function readPrimary(body: string): Result<DeviceIdentifier> {
  const m = /^([A-Z][A-Z0-9]{3})([A-Z0-9]{1,18})([0-9])$/.exec(body);
  if (!m) {
    return fail('the HIBC primary data must be a 4-character labeler code starting with a letter, a product number of 1 to 18 letters or digits, and a unit-of-measure digit');
  }
  const id = emptyIdentifier('hibcc', 'hibcc_primary');
  id.labeler = m[1]!;
  id.product = m[2]!;
  id.unitOfMeasure = Number(m[3]);
  return ok(id);
}

/**
 * Joins a primary and a secondary HIBC code scanned one after the other: the secondary's link character
 * must be the primary's check character (ANSI/HIBC 2.x, the link character).
 */
export function combineHibcc(primary: DeviceIdentifier, secondary: DeviceIdentifier): Result<DeviceIdentifier> {
  if (primary.form !== 'hibcc_primary' || secondary.form !== 'hibcc_secondary') return fail('combine an HIBC primary code with an HIBC secondary code');
  if (primary.linkCharacter !== secondary.linkCharacter) {
    return fail(`the HIBC secondary code belongs to another primary: its link is "${secondary.linkCharacter}", the primary's check character is "${primary.linkCharacter}"`);
  }
  return ok({
    ...primary, form: 'hibcc_concatenated', lot: secondary.lot, serial: secondary.serial, expiry: secondary.expiry,
    productionDate: secondary.productionDate, quantity: secondary.quantity, notes: [...primary.notes, ...secondary.notes],
  });
}
