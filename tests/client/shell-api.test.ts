import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { meSchema } from '#shared/schemas/session.ts';
import { api, ApiError, NetworkError, toApiError } from '@/lib/api.ts';
import { loadMe, saveMe } from '@/lib/session-cache.ts';
import { getMe } from '@/lib/session.ts';
import { buildMe } from './shell-factories.ts';
import { fakeNetwork, json } from './shell-fake-network.ts';

// The error body is the one contract every route shares: shared/schemas/common.ts apiErrorSchema.
describe('reading error answers', () => {
  it('keeps the message and the field issues of a 400 answer', async () => {
    const err = await toApiError(json(400, {
      error: 'Invalid request body',
      issues: [
        { path: 'patient.familyName', message: 'Family name is required' },
        { path: 'patient.familyName', message: 'A second message for the same field' },
        { path: 'lesion.sizeMm', message: 'At least 1 mm' },
      ],
    }));
    expect(err).toBeInstanceOf(ApiError);
    expect(err.status).toBe(400);
    expect(err.message).toBe('Invalid request body');
    expect(err.fieldErrors()).toEqual({ 'patient.familyName': 'Family name is required', 'lesion.sizeMm': 'At least 1 mm' });
  });

  it('takes the message of an answer from the auth library, which says `message` rather than `error`', async () => {
    const err = await toApiError(json(401, { code: 'INVALID_EMAIL_OR_PASSWORD', message: 'Invalid email or password' }));
    expect(err.isUnauthorised).toBe(true);
    expect(err.message).toBe('Invalid email or password');
    expect(err.issues).toEqual([]);
  });

  it('says what the status means when the body is not JSON (a proxy page, say)', async () => {
    const err = await toApiError(new Response('<html>Bad gateway</html>', { status: 502 }));
    expect(err.status).toBe(502);
    expect(err.message).toBe('The server answered 502');
    const forbidden = await toApiError(new Response('', { status: 403 }));
    expect(forbidden.isForbidden).toBe(true);
    expect(forbidden.message).toBe('You do not have access to this');
  });
});

describe('calling the API', () => {
  let net: ReturnType<typeof fakeNetwork>;
  beforeEach(() => { net = fakeNetwork(); });
  afterEach(() => net.restore());

  it('sends the session cookie, leaves empty query values out and sends JSON bodies', async () => {
    net.on('POST', '/api/cases', () => json(201, { ok: true }));
    await api('/api/cases', { method: 'POST', query: { date: '2025-03-14', roomId: undefined, status: '' }, body: { a: 1 } });
    expect(net.sent).toEqual([{ method: 'POST', url: '/api/cases?date=2025-03-14', body: { a: 1 }, credentials: 'include' }]);
  });

  it('throws an ApiError carrying the field issues of a refused request', async () => {
    net.on('POST', '/api/cases', () => json(400, { error: 'Invalid request body', issues: [{ path: 'roomId', message: 'Invalid UUID' }] }));
    const err = await api('/api/cases', { method: 'POST', body: {} }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).fieldErrors()).toEqual({ roomId: 'Invalid UUID' });
  });

  it('throws a NetworkError when no answer comes', async () => {
    await expect(api('/api/rooms')).rejects.toBeInstanceOf(NetworkError);
  });

  it('refuses an answer that breaks the contract', async () => {
    net.on('GET', '/api/me', () => json(200, { user: { id: 'u1' } }));
    await expect(api('/api/me', { schema: meSchema })).rejects.toThrow();
  });
});

describe('who is signed in, with and without network', () => {
  let net: ReturnType<typeof fakeNetwork>;
  beforeEach(() => { localStorage.clear(); net = fakeNetwork(); });
  afterEach(() => net.restore());

  it('keeps the last /api/me answer on the tablet', async () => {
    const me = buildMe();
    net.on('GET', '/api/me', () => json(200, me));
    await expect(getMe()).resolves.toEqual(me);
    expect(loadMe()).toEqual(me);
  });

  it('shows the kept user when the network is gone', async () => {
    const me = buildMe({ role: 'endoscopist' });
    saveMe(me);
    await expect(getMe()).resolves.toEqual(me);
  });

  it('forgets the kept user when the server says the session has ended', async () => {
    saveMe(buildMe());
    net.on('GET', '/api/me', () => json(401, { error: 'Not signed in' }));
    await expect(getMe()).rejects.toMatchObject({ status: 401 });
    expect(loadMe()).toBeNull();
  });

  it('has nothing to show offline when no one signed in on this tablet', async () => {
    await expect(getMe()).rejects.toBeInstanceOf(NetworkError);
  });
});
