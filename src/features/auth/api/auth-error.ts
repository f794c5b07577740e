import { ApiError } from '@/lib/api.ts';

/** better-auth's client answers `{ data, error }` instead of throwing; this makes the error an ApiError. */
export function throwAuthError(error: { status?: number; message?: string; statusText?: string } | null): void {
  if (!error) return;
  const status = error.status ?? 0;
  const message = error.message || error.statusText || (status === 0 ? 'No connection to the server' : 'The request was refused');
  throw new ApiError(status, message);
}
