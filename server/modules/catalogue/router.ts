import { Router } from 'express';
import { z } from 'zod';
import { auditorFor } from '#server/http/audit.ts';
import type { ApiContext } from '#server/http/context.ts';
import { permit } from '#server/http/roles.ts';
import { actorOf } from '#server/http/session.ts';
import { parseBody, parseParams, parseQuery } from '#server/http/validate.ts';
import { uuidSchema } from '#shared/schemas/common.ts';
import { createCatalogueItemSchema, listCatalogueQuerySchema, replaceCatalogueItemSchema, setCatalogueItemActiveSchema } from '#shared/schemas/catalogue.ts';
import { catalogueList, createItem, replaceItem, setItemActive } from './service.ts';

const itemParams = z.object({ itemId: uuidSchema });

/** The device catalogue: every role of the unit reads it (scans are matched against it); only admins change it. */
export function catalogueRouter(ctx: ApiContext): Router {
  const router = Router();
  router.get('/catalogue', ctx.authenticate, permit('case.view'), async (req, res) => {
    const { includeInactive } = parseQuery(listCatalogueQuerySchema, req);
    res.json({ items: await catalogueList(ctx.db, actorOf(req).unitId, includeInactive) });
  });
  router.post('/catalogue', ctx.authenticate, permit('unit.manageCatalogue'), async (req, res) => {
    const input = parseBody(createCatalogueItemSchema, req);
    res.status(201).json(await createItem(ctx.db, actorOf(req), input, auditorFor(req)));
  });
  router.put('/catalogue/:itemId', ctx.authenticate, permit('unit.manageCatalogue'), async (req, res) => {
    const { itemId } = parseParams(itemParams, req);
    res.json(await replaceItem(ctx.db, actorOf(req), itemId, parseBody(replaceCatalogueItemSchema, req), auditorFor(req)));
  });
  router.patch('/catalogue/:itemId', ctx.authenticate, permit('unit.manageCatalogue'), async (req, res) => {
    const { itemId } = parseParams(itemParams, req);
    const { active } = parseBody(setCatalogueItemActiveSchema, req);
    res.json(await setItemActive(ctx.db, actorOf(req), itemId, active, auditorFor(req)));
  });
  return router;
}
