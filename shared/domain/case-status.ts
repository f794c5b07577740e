import type { CaseStatus } from '../schemas/cases.ts';

/**
 * A case's status after one more accepted event: the first event makes a scheduled case recording, a
 * sign_out closes a scheduled or recording case, and nothing else moves it. The server applies it as it
 * stores events; the tablet as it takes in the server's events (where the status may not be known yet:
 * null, which only a sign_out settles).
 */
export function statusAfterEvent(status: CaseStatus, kind: string): CaseStatus;
export function statusAfterEvent(status: CaseStatus | null, kind: string): CaseStatus | null;
export function statusAfterEvent(status: CaseStatus | null, kind: string): CaseStatus | null {
  if (kind === 'sign_out' && (status === null || status === 'scheduled' || status === 'recording')) return 'closed';
  return status === 'scheduled' ? 'recording' : status;
}
