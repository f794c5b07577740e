import type { Request } from 'express';
import type { z } from 'zod';
import { badRequest, describeIssues, toIssues } from './errors.ts';

type Where = 'body' | 'query' | 'params';
const words: Record<Where, string> = { body: 'request body', query: 'query', params: 'path' };

/** Parse one part of the request with its zod schema; a 400 naming every field at fault otherwise. */
export function parse<S extends z.ZodType>(schema: S, req: Request, where: Where): z.output<S> {
  const result = schema.safeParse(where === 'body' ? (req.body ?? {}) : req[where]);
  if (result.success) return result.data;
  const issues = toIssues(result.error);
  throw badRequest(describeIssues(words[where], issues), issues);
}

export const parseBody = <S extends z.ZodType>(schema: S, req: Request) => parse(schema, req, 'body');
export const parseQuery = <S extends z.ZodType>(schema: S, req: Request) => parse(schema, req, 'query');
export const parseParams = <S extends z.ZodType>(schema: S, req: Request) => parse(schema, req, 'params');
