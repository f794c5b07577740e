import type { FieldPath, FieldValues, UseFormSetError } from 'react-hook-form';
import { ApiError } from './api.ts';

/**
 * Puts the field issues of a 400 answer onto the form's fields (the server names them by the same
 * dot paths as the shared schema). Returns the messages that belong to no known field, for a banner.
 */
export function applyServerErrors<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>, knownPaths: readonly string[]): string[] {
  if (!(err instanceof ApiError) || err.issues.length === 0) return [];
  const known = new Set(knownPaths);
  const leftover: string[] = [];
  let first = true;
  for (const [path, message] of Object.entries(err.fieldErrors())) {
    if (known.has(path)) {
      setError(path as FieldPath<T>, { type: 'server', message }, { shouldFocus: first });
      first = false;
    } else {
      leftover.push(path ? `${path}: ${message}` : message);
    }
  }
  return leftover;
}
