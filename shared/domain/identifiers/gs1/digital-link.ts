import { fail, ok, type Result } from '../types.ts';
import type { AiValue } from './fields.ts';

/**
 * Splits a GS1 Digital Link URI (GS1 Digital Link Standard: URI syntax, §4 of release 1.1; from memory):
 * any scheme-and-host with an optional path prefix, then the primary key /01/<GTIN> and its optional key
 * qualifiers /22/…, /10/…, /21/… in that order, then data attributes as query parameters whose names are
 * AIs (?17=YYMMDD&11=…). Non-numeric query parameters (such as linkType) are not AI data and are ignored.
 * Values are percent-decoded. A GTIN-8/12/13 in the path is allowed and padded later.
 */
export function splitDigitalLink(uri: string): Result<AiValue[]> {
  let url: URL;
  try {
    url = new URL(uri);
  } catch {
    return fail('not a valid URI');
  }
  if (url.protocol !== 'https:' && url.protocol !== 'http:') return fail(`a GS1 Digital Link URI is http or https, not ${url.protocol.replace(':', '')}`);
  const segments = url.pathname.split('/').filter((s) => s.length > 0);
  const keyAt = segments.findIndex((s, i) => s === '01' && /^\d{8,14}$/.test(segments[i + 1] ?? ''));
  if (keyAt === -1) return fail('no GTIN in the Digital Link path: expected /01/ followed by 8 to 14 digits');
  const pairs: AiValue[] = [];
  const qualifiers = ['22', '10', '21'];
  let nextQualifier = 0;
  for (let i = keyAt; i < segments.length; i += 2) {
    const ai = segments[i]!;
    const raw = segments[i + 1];
    if (raw === undefined) return fail(`Digital Link path ends after AI ${ai} without a value`);
    if (i > keyAt) {
      const order = qualifiers.indexOf(ai, nextQualifier);
      if (order === -1) return fail(`Digital Link path has /${ai}/ where only the qualifiers 22, 10, 21 (in that order) may follow the GTIN`);
      nextQualifier = order + 1;
    }
    const value = decode(raw);
    if (value === null) return fail(`Digital Link value for AI ${ai} has broken percent-encoding`);
    pairs.push({ ai, value });
  }
  for (const [name, raw] of url.searchParams) {
    if (!/^\d{2,4}$/.test(name)) continue;
    pairs.push({ ai: name, value: raw });
  }
  return ok(pairs);
}

function decode(s: string): string | null {
  try {
    return decodeURIComponent(s);
  } catch {
    return null;
  }
}
