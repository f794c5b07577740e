import type { Request } from 'express';
import type { Tx } from '../db/client.ts';
import { insertAudit } from '../modules/audit/queries.ts';
import { actorOf } from './session.ts';

export interface AuditEntry {
  /** Dotted verb: `case.view`, `case.schedule`, `case.cancel`, `invitation.create`, … */
  action: string;
  entityType: string;
  entityId?: string | null;
  detail?: Record<string, unknown> | null;
  /** The unit whose log holds the entry: the actor's active unit unless the entity is another unit's. */
  unitId?: string;
}

/** Write one audit entry as the request's actor, from the request's address. */
export async function audit(db: Tx, req: Request, { unitId, ...entry }: AuditEntry): Promise<void> {
  const actor = actorOf(req);
  await insertAudit(db, { ...entry, userId: actor.userId, unitId: unitId ?? actor.unitId, ip: req.ip ?? null });
}

/** Writes audit entries for one request, inside whatever transaction the service passes. */
export type Auditor = (db: Tx, entry: AuditEntry) => Promise<void>;

export const auditorFor = (req: Request): Auditor => (db, entry) => audit(db, req, entry);
