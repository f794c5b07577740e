import { existsSync } from 'node:fs';
import { isAbsolute, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import express, { type Router } from 'express';

const root = fileURLToPath(new URL('../..', import.meta.url));

/**
 * The built client (vite build) and the single-page fallback: any GET outside /api and /socket.io that
 * is not a file gets index.html, so deep links (/invite/<id>, /cases/<id>) load the app. Hashed assets
 * are cached for good; the page and the service worker are revalidated so an update reaches the tablets.
 * Null when the folder is missing (the dev server serves the client then).
 */
export function clientRouter(clientDist: string): Router | null {
  const dir = isAbsolute(clientDist) ? clientDist : resolve(root, clientDist);
  const index = join(dir, 'index.html');
  if (!existsSync(index)) return null;
  const router = express.Router();
  router.use(express.static(dir, {
    index: false,
    setHeaders: (res, path) => {
      const fresh = path.endsWith('.html') || path.endsWith('sw.js') || path.endsWith('.webmanifest');
      res.setHeader('Cache-Control', fresh ? 'no-cache' : path.includes(`${join(dir, 'assets')}`) ? 'public, max-age=31536000, immutable' : 'public, max-age=3600');
    },
  }));
  router.use((req, res, next) => {
    if ((req.method !== 'GET' && req.method !== 'HEAD') || req.path.startsWith('/api/') || req.path.startsWith('/socket.io/')) return next();
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(index);
  });
  return router;
}
