import { Router } from 'express';
import { fromNodeHeaders } from 'better-auth/node';
import { auditorFor } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseBody, parseParams } from '#server/http/validate.ts';
import { acceptInvitationSchema, createInvitationSchema, invitationIdParamsSchema } from '#shared/schemas/api-invitations.ts';
import { acceptAsNewUser, inviteMember, publicInvitation, unitInvitations } from './service.ts';

export function invitationsRouter(ctx: ApiContext): Router {
  const router = Router();
  const { db, auth, authenticate } = ctx;

  router.post('/invitations', authenticate, permit('unit.manageUsers'), async (req, res) => {
    const input = parseBody(createInvitationSchema, req);
    res.status(201).json(await inviteMember(auth, actorOf(req), fromNodeHeaders(req.headers), input, auditorFor(req), db));
  });
  router.get('/invitations', authenticate, permit('unit.manageUsers'), async (req, res) => {
    res.json(await unitInvitations(db, actorOf(req).unitId));
  });
  // Public: the accept page shows whom the invitation is for before anyone is signed in. The id is a
  // random UUID sent only to the invitee's mailbox.
  router.get('/invitations/:id', async (req, res) => {
    const { id } = parseParams(invitationIdParamsSchema, req);
    res.json(await publicInvitation(db, id));
  });
  router.post('/invitations/:id/accept', async (req, res) => {
    const { id } = parseParams(invitationIdParamsSchema, req);
    const input = parseBody(acceptInvitationSchema, req);
    const { setCookies, body } = await acceptAsNewUser(auth, db, id, input, req.ip ?? null);
    res.setHeader('set-cookie', setCookies);
    res.status(201).json(body);
  });
  return router;
}
