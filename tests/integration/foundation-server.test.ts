import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { loadConfig } from '#server/config.ts';
import { startServer } from '#server/server.ts';
import pino from 'pino';
import { createTestContext, type TestContext } from './helpers/app.ts';
import { migratedDatabase } from './helpers/db.ts';

const dist = mkdtempSync(join(tmpdir(), 'ledgerline-dist-'));
let t: TestContext;

beforeAll(async () => {
  mkdirSync(join(dist, 'assets'));
  writeFileSync(join(dist, 'index.html'), '<!doctype html><title>Ledgerline test page</title>');
  writeFileSync(join(dist, 'assets', 'app-abc123.js'), 'console.log("asset")');
  t = await createTestContext({ env: { CLIENT_DIST: dist } });
});
afterAll(async () => {
  await t.close();
  rmSync(dist, { recursive: true, force: true });
});

describe('the built client', () => {
  it('serves index.html for a deep link into the app (single-page fallback)', async () => {
    const res = await request(t.app).get('/invite/0190a0a0-0000-7000-8000-000000000000');
    expect(res.status).toBe(200);
    expect(res.text).toContain('Ledgerline test page');
    expect(res.headers['cache-control']).toBe('no-cache');
  });

  it('serves hashed assets to be cached for good', async () => {
    const res = await request(t.app).get('/assets/app-abc123.js');
    expect(res.status).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('never answers an API path with the page', async () => {
    const res = await request(t.app).get('/api/not-a-route');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/application\/json/);
  });

  it('sends security headers (helmet) without upgrading plain-http requests', async () => {
    const res = await request(t.app).get('/');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['content-security-policy']).not.toContain('upgrade-insecure-requests');
  });
});

describe('startServer', () => {
  it('listens on the configured host with HTTP and Socket.IO, and closes cleanly', async () => {
    const url = await migratedDatabase();
    const config = { ...loadConfig({ NODE_ENV: 'test', DATABASE_URL: url, LOG_LEVEL: 'silent' }), PORT: 0, CLIENT_DIST: join(dist, 'none') };
    const server = await startServer(config, { logger: pino({ level: 'silent' }) });
    try {
      expect(server.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+$/);
      const me = await fetch(`${server.url}/api/me`);
      expect(me.status).toBe(401);
      // Engine.IO's polling handshake: the Socket.IO server is attached to the same HTTP server.
      const handshake = await fetch(`${server.url}/socket.io/?EIO=4&transport=polling`);
      expect(handshake.status).toBe(200);
      expect(await handshake.text()).toMatch(/^0\{"sid":/);
    } finally {
      await server.close();
    }
    await expect(fetch(`${server.url}/api/me`)).rejects.toThrow();
  });
});
