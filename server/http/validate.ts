import type { Request } from 'express';
import type { z } from 'zod';
import { badRequest, describeIssues, toIssues } from './errors.ts';
import { unstorableIn } from './storable.ts';

type Where = 'body' | 'query' | 'params';
const words: Record<Where, string> = { body: 'request body', query: 'query', params: 'path' };

/**
 * Parse one part of the request with its zod schema; a 400 naming every field at fault otherwise. Text
 * the database could not store exactly as sent (server/http/storable.ts) is refused first, naming the
 * field; `skip` names root keys whose items are checked one by one later (a push's events).
 */
export function parse<S extends z.ZodType>(schema: S, req: Request, where: Where, options: { skip?: readonly string[] } = {}): z.output<S> {
  const input: unknown = where === 'body' ? (req.body ?? {}) : req[where];
  const unstorable = unstorableIn(input, options);
  if (unstorable) throw badRequest(describeIssues(words[where], [unstorable]), [unstorable]);
  const result = schema.safeParse(input);
  if (result.success) return result.data;
  const issues = toIssues(result.error);
  throw badRequest(describeIssues(words[where], issues), issues);
}

export const parseBody = <S extends z.ZodType>(schema: S, req: Request, options: { skip?: readonly string[] } = {}) => parse(schema, req, 'body', options);
export const parseQuery = <S extends z.ZodType>(schema: S, req: Request) => parse(schema, req, 'query');
export const parseParams = <S extends z.ZodType>(schema: S, req: Request) => parse(schema, req, 'params');
