import type { Request, RequestHandler } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { roleSchema, type Role } from '#shared/schemas/common.ts';
import type { Auth } from '../auth.ts';
import type { Db } from '../db/client.ts';
import { findMembership, firstMembership } from '../modules/members/queries.ts';
import { forbidden, unauthorized } from './errors.ts';

/** The signed-in member a request acts as: the user, their unit and their role there. */
export interface Actor {
  userId: string;
  name: string;
  email: string;
  sessionId: string;
  unitId: string;
  unitName: string;
  hospital: string;
  timeZone: string;
  role: Role;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      actor?: Actor;
    }
  }
}

/**
 * Resolve the session cookie to an actor. The unit is the session's active organization when the user
 * is still a member there, else the unit they joined first. A role outside Ledgerline's four (say the
 * plugin's default `member`) gets no access rather than a guess.
 */
export function authenticate({ auth, db }: { auth: Auth; db: Db }): RequestHandler {
  return async (req, _res, next) => {
    const session = await auth.api.getSession({ headers: fromNodeHeaders(req.headers) });
    if (!session) throw unauthorized();
    const { user } = session;
    const active = session.session.activeOrganizationId;
    let membership = active ? await findMembership(db, user.id, active) : null;
    if (!membership) {
      const first = await firstMembership(db, user.id);
      membership = first ? await findMembership(db, user.id, first.organizationId) : null;
    }
    if (!membership) throw forbidden('Your account is not a member of any unit; ask your unit administrator');
    const role = roleSchema.safeParse(membership.role);
    if (!role.success) throw forbidden(`Your role "${membership.role}" has no access in Ledgerline`);
    req.actor = {
      userId: user.id, name: user.name, email: user.email, sessionId: session.session.id,
      unitId: membership.unitId, unitName: membership.unitName, hospital: membership.hospital,
      timeZone: membership.timeZone ?? 'UTC', role: role.data,
    };
    next();
  };
}

/** The actor of a request that passed `authenticate` (a route without it is a programming error). */
export function actorOf(req: Request): Actor {
  if (!req.actor) throw new Error(`${req.method} ${req.path} reached a handler without authenticate`);
  return req.actor;
}
