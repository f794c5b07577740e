import type { Db } from '#server/db/client.ts';
import type { AuditPage, AuditQuery } from '#shared/schemas/api-audit.ts';
import { listAudit } from './queries.ts';

export async function auditPage(db: Db, unitId: string, q: AuditQuery): Promise<AuditPage> {
  const rows = await listAudit(db, unitId, q);
  const page = rows.slice(0, q.limit);
  return {
    entries: page.map((r) => ({
      id: r.id, at: r.at.toISOString(),
      user: r.userId ? { id: r.userId, name: r.userName ?? '(deleted user)' } : null,
      action: r.action, entityType: r.entityType, entityId: r.entityId, detail: r.detail, ip: r.ip,
    })),
    nextBefore: rows.length > q.limit ? (page.at(-1)?.id ?? null) : null,
  };
}
