/**
 * The GS1 Application Identifiers Ledgerline knows (GS1 General Specifications §3.2, the AI table, from
 * memory of its formats), and the predefined-length table that lets a parser step over an AI without a
 * separator (§7.8.5, Figure 7.8.5-2: element strings whose length is fixed by their first two digits; the
 * same table as the GS1 Syntax Engine's `fixedAIprefixLengths`).
 */
export type AiSpec = {
  ai: string;
  title: string;
  /** Value length limits in characters. */
  min: number;
  max: number;
  /** N (digits only) or X (GS1 AI encodable character set 82). */
  numeric: boolean;
};

/** The AIs the reader turns into fields. */
export const readAis = ['01', '10', '11', '17', '21'] as const;

const spec = (ai: string, title: string, numeric: boolean, min: number, max = min): AiSpec => ({ ai, title, numeric, min, max });

const table: AiSpec[] = [
  spec('00', 'SSCC', true, 18), spec('01', 'GTIN', true, 14), spec('02', 'GTIN of contained items', true, 14),
  spec('10', 'batch or lot', false, 1, 20), spec('11', 'production date', true, 6), spec('12', 'due date', true, 6),
  spec('13', 'packaging date', true, 6), spec('15', 'best before date', true, 6), spec('16', 'sell by date', true, 6),
  spec('17', 'expiry date', true, 6), spec('20', 'variant', true, 2), spec('21', 'serial number', false, 1, 20),
  spec('22', 'consumer product variant', false, 1, 20), spec('235', 'third-party serial', false, 1, 28),
  spec('240', 'additional product id', false, 1, 30), spec('241', 'customer part number', false, 1, 30),
  spec('242', 'made-to-order variant', true, 1, 6), spec('243', 'packaging component number', false, 1, 20),
  spec('250', 'secondary serial', false, 1, 30), spec('251', 'reference to source', false, 1, 30),
  spec('254', 'GLN extension', false, 1, 20), spec('30', 'variable count', true, 1, 8), spec('37', 'count of items', true, 1, 8),
  spec('400', 'order number', false, 1, 30), spec('401', 'consignment number', false, 1, 30), spec('422', 'country of origin', true, 3),
  spec('7003', 'expiry date and time', true, 10), spec('7240', 'protocol id', false, 1, 20), spec('8003', 'GRAI', false, 14, 30),
  spec('8004', 'GIAI', false, 1, 30), spec('8006', 'ITIP', true, 18), spec('8020', 'payment slip reference', false, 1, 25),
  spec('90', 'internal (mutually agreed)', false, 1, 30),
  ...['91', '92', '93', '94', '95', '96', '97', '98', '99'].map((ai) => spec(ai, 'company internal', false, 1, 90)),
];
const byAi = new Map(table.map((s) => [s.ai, s]));

/** Figure 7.8.5-2: first two digits → [AI length, value length] of a predefined-length element string. */
const predefined: Record<string, [number, number]> = {
  '00': [2, 18], '01': [2, 14], '02': [2, 14], '03': [2, 14], '04': [2, 16],
  '11': [2, 6], '12': [2, 6], '13': [2, 6], '14': [2, 6], '15': [2, 6], '16': [2, 6], '17': [2, 6], '18': [2, 6], '19': [2, 6],
  '20': [2, 2], '31': [4, 6], '32': [4, 6], '33': [4, 6], '34': [4, 6], '35': [4, 6], '36': [4, 6], '41': [3, 13],
};

/** Whether an AI's element string has a predefined length (so needs no separator after it). */
export function isPredefinedLength(ai: string): boolean {
  const p = predefined[ai.slice(0, 2)];
  return p !== undefined && p[0] === ai.length;
}

/** The spec of an AI written out in full (bracketed form, Digital Link), or null when unknown. */
export function specOf(ai: string): AiSpec | null {
  const known = byAi.get(ai);
  if (known) return known;
  const p = predefined[ai.slice(0, 2)];
  if (p && p[0] === ai.length && /^\d+$/.test(ai)) return spec(ai, p[0] === 4 ? 'trade measure' : p[0] === 3 ? 'party GLN' : 'unlisted AI of predefined length', true, p[1]);
  return null;
}

/**
 * Finds the AI at the start of `data` (an unbracketed element string): the known AI whose digits begin it,
 * else an AI of predefined length by its first two digits. Null when neither fits.
 */
export function aiAt(data: string): { ai: string; spec: AiSpec; known: boolean } | null {
  for (const length of [2, 3, 4]) {
    const ai = data.slice(0, length);
    const known = byAi.get(ai);
    if (known) return { ai, spec: known, known: true };
  }
  const p = predefined[data.slice(0, 2)];
  if (!p) return null;
  const ai = data.slice(0, p[0]);
  if (ai.length < p[0] || !/^\d+$/.test(ai)) return null;
  return { ai, spec: specOf(ai)!, known: false };
}

/** GS1 AI encodable character set 82 (GS1 General Specifications Figure 7.11-1). */
export const cset82 = /^[!"%-?A-Z_a-z]+$/;

/** Checks a value against its AI's length and character rules; returns a message or null. */
export function valueProblem(s: AiSpec, value: string): string | null {
  if (value.length < s.min || value.length > s.max) {
    const size = s.min === s.max ? `${s.min}` : `${s.min} to ${s.max}`;
    return `AI (${s.ai}) ${s.title} must be ${size} characters long, got ${value.length}`;
  }
  if (s.numeric ? !/^\d+$/.test(value) : !cset82.test(value)) {
    return `AI (${s.ai}) ${s.title} "${value}" has a character that AI does not allow`;
  }
  return null;
}
