import type { Db } from '#server/db/client.ts';
import { roleSchema, type Role } from '#shared/schemas/common.ts';
import type { Member } from '#shared/schemas/cases.ts';
import { listMembers } from './queries.ts';

/** The unit's members with one of Ledgerline's roles (a plugin default such as `member` is left out). */
export async function unitMembers(db: Db, unitId: string, role?: Role): Promise<Member[]> {
  const rows = await listMembers(db, unitId, role);
  return rows.flatMap((r) => {
    const parsed = roleSchema.safeParse(r.role);
    return parsed.success ? [{ userId: r.userId, name: r.name, email: r.email, role: parsed.data }] : [];
  });
}
