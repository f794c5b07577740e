import { emptyIdentifier, fail, ok, type DeviceIdentifier, type Result } from '../types.ts';
import { readAis, specOf, valueProblem } from './ai-table.ts';
import { normaliseGtin } from './check-digit.ts';
import { parseGs1Date } from './dates.ts';

/** One application identifier and its value, as split from the scanned text. */
export type AiValue = { ai: string; value: string };

/**
 * Turns AI/value pairs into the identifier's fields: AI (01) checked and normalised, (11) and (17) read as
 * dates, (10) and (21) as text; other AIs noted. A repeated AI with a different value is refused (GS1
 * General Specifications, rules on repeated AIs: one AI may not carry two different values; from memory).
 */
export function identifierFromAis(pairs: AiValue[], form: DeviceIdentifier['form'], reference: Date): Result<DeviceIdentifier> {
  const id = emptyIdentifier('gs1', form);
  const seen = new Map<string, string>();
  for (const { ai, value } of pairs) {
    const before = seen.get(ai);
    if (before !== undefined && before !== value) return fail(`AI (${ai}) appears twice with different values ("${before}", "${value}")`);
    seen.set(ai, value);
    const s = specOf(ai);
    if (!s) { id.notes.push(`AI (${ai}) is not one Ledgerline knows; skipped`); continue; }
    // AI (01) is checked by normaliseGtin, which also takes the shorter GTINs a Digital Link may carry.
    const problem = ai === '01' ? null : valueProblem(s, value);
    if (problem) return fail(problem);
    if (!(readAis as readonly string[]).includes(ai)) { id.notes.push(`AI (${ai}) ${s.title} "${value}" not used`); continue; }
    if (ai === '01') {
      const gtin = normaliseGtin(value);
      if (!gtin.ok) return gtin;
      id.gtin = gtin.value;
    } else if (ai === '10') id.lot = value;
    else if (ai === '21') id.serial = value;
    else {
      const date = parseGs1Date(value, reference, ai === '17' ? 'AI (17) expiry date' : 'AI (11) production date');
      if (!date.ok) return date;
      if (ai === '17') id.expiry = date.value;
      else id.productionDate = date.value;
    }
  }
  if (!id.gtin && !id.lot && !id.serial && !id.expiry && !id.productionDate) {
    return fail('no GS1 field Ledgerline reads was found (AIs 01, 10, 11, 17, 21)');
  }
  return ok(id);
}
