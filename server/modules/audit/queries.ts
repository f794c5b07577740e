import { and, desc, eq, lt } from 'drizzle-orm';
import type { Tx } from '#server/db/client.ts';
import { auditLog, user } from '#server/db/schema/index.ts';
import type { AuditQuery } from '#shared/schemas/api-audit.ts';

export type NewAuditRow = typeof auditLog.$inferInsert;

export async function insertAudit(db: Tx, row: NewAuditRow): Promise<void> {
  await db.insert(auditLog).values(row);
}

/** One page of a unit's audit log, newest first (one row more than asked, to know if there is more). */
export async function listAudit(db: Tx, unitId: string, q: AuditQuery) {
  return db.select({
    id: auditLog.id, at: auditLog.at, userId: auditLog.userId, userName: user.name, action: auditLog.action,
    entityType: auditLog.entityType, entityId: auditLog.entityId, detail: auditLog.detail, ip: auditLog.ip,
  }).from(auditLog).leftJoin(user, eq(user.id, auditLog.userId))
    .where(and(
      eq(auditLog.unitId, unitId),
      q.before ? lt(auditLog.id, q.before) : undefined,
      q.entityType ? eq(auditLog.entityType, q.entityType) : undefined,
      q.entityId ? eq(auditLog.entityId, q.entityId) : undefined,
      q.userId ? eq(auditLog.userId, q.userId) : undefined,
      q.action ? eq(auditLog.action, q.action) : undefined,
    ))
    .orderBy(desc(auditLog.id)).limit(q.limit + 1);
}
