import express, { type Express, type Router } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { toNodeHandler } from 'better-auth/node';
import { compileTrustProxy, setClientAddressHeader } from './http/client-address.ts';
import { clientRouter } from './http/client.ts';
import type { ApiContext, AppDeps } from './http/context.ts';
import { apiNotFound, errorHandler } from './http/errors.ts';
import { signInLimiter } from './http/rate-limit.ts';
import { authenticate } from './http/session.ts';
import { auditRouter } from './modules/audit/router.ts';
import { casesRouter } from './modules/cases/router.ts';
import { catalogueRouter } from './modules/catalogue/router.ts';
import { deviceUsagesRouter } from './modules/device-usages/router.ts';
import { eventsRouter } from './modules/events/router.ts';
import { invitationsRouter } from './modules/invitations/router.ts';
import { membersRouter } from './modules/members/router.ts';
import { patientsRouter } from './modules/patients/router.ts';
import { recordRouter } from './modules/record/router.ts';
import { roomsRouter } from './modules/rooms/router.ts';
import { specimensRouter } from './modules/specimens/router.ts';

export type { AppDeps, ApiContext } from './http/context.ts';

/** Every module's REST router, mounted under /api. A new module adds its line here. */
const moduleRouters: ((ctx: ApiContext) => Router)[] = [
  membersRouter, roomsRouter, casesRouter, patientsRouter, invitationsRouter, auditRouter, eventsRouter,
  catalogueRouter, deviceUsagesRouter, specimensRouter, recordRouter,
];

/** JSON bodies above this are refused with 413 (an event is at most 16 KiB; a batch of them fits). */
const JSON_LIMIT = '1mb';

/** The Express app, without listening (tests use it through supertest; startServer listens). */
export function createApp(deps: AppDeps): Express {
  const { config, auth, logger } = deps;
  const app = express();
  // req.ip (the audit log's address, the sign-in limiter's key) believes only the proxies named.
  app.set('trust proxy', compileTrustProxy(config.TRUST_PROXY));
  const s3 = new URL(config.S3_ENDPOINT).origin;
  const https = config.BETTER_AUTH_URL.startsWith('https:');
  app.use(helmet({
    contentSecurityPolicy: {
      directives: {
        // Presigned uploads and downloads go straight to object storage.
        'img-src': ["'self'", 'data:', 'blob:', s3],
        'media-src': ["'self'", 'blob:', s3],
        'connect-src': ["'self'", s3],
        'worker-src': ["'self'"],
        // On plain http (the local set-up) upgrading would send the tablet to a port that speaks no TLS.
        'upgrade-insecure-requests': https ? [] : null,
      },
    },
    strictTransportSecurity: https,
  }));
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => !req.url?.startsWith('/api/') } }));

  // better-auth reads the raw body itself: mounted before express.json() (STACK.md).
  app.use('/api/auth', setClientAddressHeader);
  app.post('/api/auth/sign-in/email', signInLimiter(deps.db, deps.signInLimit ?? { windowMs: 15 * 60_000, limit: 10 }));
  app.all('/api/auth/*splat', toNodeHandler(auth));

  app.use(express.json({ limit: JSON_LIMIT }));
  const ctx: ApiContext = { ...deps, authenticate: authenticate(deps) };
  for (const router of moduleRouters) app.use('/api', router(ctx));
  app.use('/api', apiNotFound);

  const client = clientRouter(config.CLIENT_DIST);
  if (client) app.use(client);
  app.use(errorHandler(logger));
  return app;
}
