import { Router } from 'express';
import { z } from 'zod';
import { audit } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { forbidden, notFound } from '#server/http/errors.ts';
import { actorOf } from '#server/http/session.ts';
import { parseBody, parseParams, parseQuery } from '#server/http/validate.ts';
import { EVENTS_PAGE_SIZE, eventsPushSchema, MAX_SEQ } from '#shared/contracts/sync.ts';
import { uuidSchema } from '#shared/schemas/common.ts';
import { caseAccess, isDenied, recordDenial, type AccessDenied } from './access.ts';
import { announceRecorded } from './recorded.ts';
import { eventsPage, recordEvents } from './service.ts';

const caseParams = z.object({ id: uuidSchema });
/** GET query: `after` the last sequence held (0 for all), `limit` the page size. */
const pageQuery = z.object({
  after: z.coerce.number().int().min(0).max(MAX_SEQ).default(0),
  limit: z.coerce.number().int().min(1).max(EVENTS_PAGE_SIZE).default(EVENTS_PAGE_SIZE),
});
/** POST body: a batch, as on the socket (`events.push`) but with the case in the path. */
const pushBody = z.strictObject({ events: eventsPushSchema.shape.events });

const httpError = (d: AccessDenied) => (d.code === 'forbidden' ? forbidden(d.message) : notFound(d.message));

/**
 * The event log over HTTP, for a tablet without a socket and for tools: the same reads and the same
 * per-event answers as the socket, and the same broadcast to the case's room after commit.
 */
export function eventsRouter(ctx: ApiContext): Router {
  const router = Router();
  const { db, authenticate } = ctx;

  router.get('/cases/:id/events', authenticate, async (req, res) => {
    const { id } = parseParams(caseParams, req);
    const { after, limit } = parseQuery(pageQuery, req);
    const access = await caseAccess(db, actorOf(req).userId, id);
    if (isDenied(access)) throw httpError(access);
    const page = await eventsPage(db, id, after, limit);
    // Every read that shows events is a reading of the record, in the case's unit (which need not be the
    // reader's active one); so is a read from the start that finds none.
    if (after === 0 || page.events.length) {
      await audit(db, req, { action: 'record.view', entityType: 'case', entityId: id, unitId: access.unitId, detail: { via: 'events', after, events: page.events.length } });
    }
    res.json(page);
  });

  router.post('/cases/:id/events', authenticate, async (req, res) => {
    const { id } = parseParams(caseParams, req);
    // Each event is checked, and refused, alone (intake.ts), as on the socket.
    const { events } = parseBody(pushBody, req, { skip: ['events'] });
    const access = await caseAccess(db, actorOf(req).userId, id);
    if (isDenied(access)) throw httpError(access);
    const denial = recordDenial(access);
    if (denial) throw httpError(denial);
    const { results, stored } = await recordEvents(db, { caseId: id, access: Promise.resolve(access) }, events);
    announceRecorded(db, id, stored);
    res.json({ results });
  });

  return router;
}
