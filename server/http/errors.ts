import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { Logger } from 'pino';
import { z } from 'zod';
import type { ApiError } from '#shared/schemas/common.ts';

export type Issue = { path: string; message: string };

/** An error with an HTTP answer: thrown by validation, guards and services, turned into JSON below. */
export class HttpError extends Error {
  constructor(readonly status: number, message: string, readonly issues?: Issue[]) {
    super(message);
    this.name = 'HttpError';
  }
}

export const badRequest = (message: string, issues?: Issue[]) => new HttpError(400, message, issues);
export const unauthorized = (message = 'Sign in first') => new HttpError(401, message);
export const forbidden = (message: string) => new HttpError(403, message);
export const notFound = (message = 'Not found') => new HttpError(404, message);
export const conflict = (message: string, issues?: Issue[]) => new HttpError(409, message, issues);

/** zod issues as `{ path, message }`, the path dotted ("patient.hospitalNumber"). */
export function toIssues(error: z.ZodError): Issue[] {
  return error.issues.map((i) => ({ path: i.path.map(String).join('.'), message: i.message }));
}

/** One line naming the first field at fault, for clients that show only `error`. */
export function describeIssues(where: string, issues: Issue[]): string {
  const first = issues[0];
  if (!first) return `Invalid ${where}`;
  const more = issues.length > 1 ? ` (and ${issues.length - 1} more)` : '';
  return `Invalid ${where}: ${first.path || '(root)'}: ${first.message}${more}`;
}

/** Unknown /api paths answer JSON, never the SPA page. */
export const apiNotFound: RequestHandler = (req, _res, next) => next(notFound(`No route ${req.method} ${req.originalUrl.split('?')[0]}`));

/** Body-parser errors carry `type`; they are the client's fault, never a 500. */
function clientError(err: unknown): HttpError | null {
  if (err instanceof HttpError) return err;
  if (err instanceof z.ZodError) { const issues = toIssues(err); return badRequest(describeIssues('request', issues), issues); }
  const e = err as { type?: string; status?: number; expose?: boolean; message?: string };
  if (e?.type === 'entity.parse.failed') return badRequest('The request body is not valid JSON');
  if (e?.type === 'entity.too.large') return new HttpError(413, 'The request body is too large');
  if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500 && e.expose) return new HttpError(e.status, e.message ?? 'Bad request');
  return null;
}

/** The last middleware: client errors answer their status; anything else is a real fault, logged, 500. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, next) => {
    if (res.headersSent) return next(err);
    const known = clientError(err);
    if (known) {
      const body: ApiError = { error: known.message, ...(known.issues ? { issues: known.issues } : {}) };
      res.status(known.status).json(body);
      return;
    }
    logger.error({ err, method: req.method, url: req.originalUrl }, 'request failed');
    res.status(500).json({ error: 'Something went wrong on the server; it has been logged' } satisfies ApiError);
  };
}
