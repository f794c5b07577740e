import type { RequestHandler } from 'express';
import { can, type Action } from '#shared/domain/permissions.ts';
import { forbidden } from './errors.ts';
import { actorOf } from './session.ts';

/**
 * 403 unless the actor's role may do `action` (PRODUCT.md, Roles; shared/domain/permissions.ts).
 * Grants limited to the actor's own cases pass here; the service checks the case itself.
 */
export function permit(action: Action): RequestHandler {
  return (req, _res, next) => {
    const actor = actorOf(req);
    if (!can(actor.role, action)) throw forbidden(`A ${actor.role} may not do this (${action})`);
    next();
  };
}
