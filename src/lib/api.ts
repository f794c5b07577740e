import type { z } from 'zod';
import { apiErrorSchema } from '#shared/schemas/common.ts';

/** One field at fault in a 400 answer; `path` is dot-separated, e.g. `patient.familyName`. */
export type FieldIssue = { path: string; message: string };

/** An answer from our API that was not 2xx, with the server's message and the fields at fault. */
export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    readonly status: number,
    message: string,
    readonly issues: FieldIssue[] = [],
  ) {
    super(message);
  }

  get isUnauthorised() { return this.status === 401; }
  get isForbidden() { return this.status === 403; }
  get isNotFound() { return this.status === 404; }

  /** The first message for each field path. */
  fieldErrors(): Record<string, string> {
    const out: Record<string, string> = {};
    for (const issue of this.issues) if (issue.path && !(issue.path in out)) out[issue.path] = issue.message;
    return out;
  }
}

/** The request never got an answer (offline, server down, connection cut). */
export class NetworkError extends Error {
  override readonly name = 'NetworkError';
}

const statusWords: Record<number, string> = {
  400: 'The request was not valid',
  401: 'You are signed out',
  403: 'You do not have access to this',
  404: 'Not found',
  409: 'This changed in the meantime',
  429: 'Too many attempts; wait a moment',
};

/** Turns a non-2xx response into an ApiError, whatever its body holds. */
export async function toApiError(res: Response): Promise<ApiError> {
  const fallback = statusWords[res.status] ?? `The server answered ${res.status}`;
  let body: unknown;
  try {
    body = await res.json();
  } catch {
    return new ApiError(res.status, fallback);
  }
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) return new ApiError(res.status, parsed.data.error || fallback, parsed.data.issues ?? []);
  // better-auth answers { message, code } rather than our { error }.
  const message = body && typeof body === 'object' && 'message' in body && typeof body.message === 'string' ? body.message : fallback;
  return new ApiError(res.status, message);
}

type Query = Record<string, string | number | boolean | undefined | null>;
type RequestOptions<S extends z.ZodType | undefined> = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  query?: Query;
  body?: unknown;
  signal?: AbortSignal;
  /** Validates the answer; a mismatch is a bug in one side of the contract and throws. */
  schema?: S;
};

export function withQuery(path: string, query?: Query): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const qs = params.toString();
  return qs ? `${path}?${qs}` : path;
}

/** Calls our JSON API with the session cookie; throws ApiError or NetworkError. */
export async function api<S extends z.ZodType | undefined = undefined>(
  path: string,
  options: RequestOptions<S> = {},
): Promise<S extends z.ZodType ? z.infer<S> : unknown> {
  const { method = 'GET', query, body, signal, schema } = options;
  let res: Response;
  try {
    res = await fetch(withQuery(path, query), {
      method,
      signal,
      credentials: 'include',
      headers: { Accept: 'application/json', ...(body === undefined ? {} : { 'Content-Type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch (err) {
    if (signal?.aborted) throw err;
    throw new NetworkError(err instanceof Error ? err.message : 'No connection');
  }
  if (!res.ok) throw await toApiError(res);
  if (res.status === 204) return undefined as never;
  const data: unknown = await res.json();
  return (schema ? schema.parse(data) : data) as never;
}

/** A short sentence for any error, for toasts and banners. */
export function errorMessage(err: unknown): string {
  if (err instanceof ApiError) return err.message;
  if (err instanceof NetworkError) return 'No connection to the server. Try again when the network is back.';
  if (err instanceof Error) return err.message;
  return 'Something went wrong';
}
