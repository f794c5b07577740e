import type { Tx } from '#server/db/client.ts';
import { can } from '#shared/domain/permissions.ts';
import { roleSchema, type Role } from '#shared/schemas/common.ts';
import type { CaseStatus } from '#shared/schemas/cases.ts';
import type { SyncErrorCode } from '#shared/contracts/sync.ts';
import { findCaseWithRole } from './queries.ts';

/** A user's standing in one case: the case's unit and status, and the user's role in that unit. */
export type CaseAccess = { caseId: string; unitId: string; status: CaseStatus; lastSeq: number; role: Role };

export type AccessDenied = { code: Extract<SyncErrorCode, 'not_found' | 'forbidden'>; message: string };

/**
 * The role is the one the user holds in the case's own unit (a user may belong to several units).
 * A case of a unit the user is not a member of is "not found", the same as no case at all, so that
 * another unit's case ids reveal nothing.
 */
export async function caseAccess(db: Tx, userId: string, caseId: string): Promise<CaseAccess | AccessDenied> {
  const row = await findCaseWithRole(db, caseId, userId);
  const role = row ? roleSchema.safeParse(row.role) : null;
  if (!row || !role?.success) return { code: 'not_found', message: 'No such case in your unit' };
  return { caseId: row.id, unitId: row.unitId, status: row.status as CaseStatus, lastSeq: row.lastSeq, role: role.data };
}

/** Only nurses and endoscopists record (shared/domain/permissions.ts, `event.record`). */
export function recordDenial(a: CaseAccess): AccessDenied | null {
  if (!can(a.role, 'event.record')) return { code: 'forbidden', message: `A ${a.role} may read this record but not record events in it` };
  return null;
}

/** Every member of the unit may read the record (PRODUCT.md, Roles); anyone else is denied. */
export function isDenied(a: CaseAccess | AccessDenied): a is AccessDenied {
  return 'code' in a;
}
