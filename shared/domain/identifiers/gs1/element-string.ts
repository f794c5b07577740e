import { fail, ok, type Result } from '../types.ts';
import { aiAt, isPredefinedLength } from './ai-table.ts';
import type { AiValue } from './fields.ts';

/** FNC1 as scanners transmit it in a variable-length field's end: the ASCII group separator. */
export const GS = '\u001d';

/**
 * Splits an unbracketed GS1 element string (GS1 General Specifications §7.8.5: concatenation,
 * predefined length versus FNC1 required): each AI is
 * followed by its value; a value of predefined length ends by its length, any other at the next GS or at
 * the end. A GS right after a predefined-length value is tolerated (some printers put one there).
 */
export function splitElementString(data: string): Result<AiValue[]> {
  const pairs: AiValue[] = [];
  let at = 0;
  while (at < data.length) {
    if (data[at] === GS) { at++; continue; }
    const found = aiAt(data.slice(at, at + 4));
    if (!found) {
      return fail(`unknown application identifier at character ${at + 1} ("${data.slice(at, at + 4)}…"): the rest of the code cannot be split`);
    }
    const start = at + found.ai.length;
    let end: number;
    if (isPredefinedLength(found.ai)) {
      end = start + found.spec.max;
      if (end > data.length) return fail(`AI (${found.ai}) ${found.spec.title} is cut short: it needs ${found.spec.max} digits`);
    } else {
      const gs = data.indexOf(GS, start);
      end = gs === -1 ? data.length : gs;
    }
    const value = data.slice(start, end);
    if (value.length === 0) return fail(`AI (${found.ai}) ${found.spec.title} has no value`);
    pairs.push({ ai: found.ai, value });
    at = end;
  }
  if (pairs.length === 0) return fail('the code is empty');
  return ok(pairs);
}

/**
 * Splits the human-readable bracketed form "(01)09506000134352(17)211200(10)ABC" (GS1 General
 * Specifications, human readable interpretation rules: each AI in parentheses before its value). Spaces between fields are
 * dropped; a value's own characters are kept.
 */
export function splitBracketed(text: string): Result<AiValue[]> {
  const pattern = /\((\d{2,4})\)/g;
  const marks = [...text.matchAll(pattern)];
  if (marks.length === 0 || marks[0]!.index !== text.search(/\S/)) return fail('a bracketed GS1 code must start with an AI in parentheses, like "(01)"');
  const pairs: AiValue[] = [];
  for (let i = 0; i < marks.length; i++) {
    const m = marks[i]!;
    const start = m.index + m[0].length;
    const end = i + 1 < marks.length ? marks[i + 1]!.index : text.length;
    const value = text.slice(start, end).trim();
    if (value.length === 0) return fail(`AI (${m[1]}) has no value`);
    pairs.push({ ai: m[1]!, value });
  }
  return ok(pairs);
}
