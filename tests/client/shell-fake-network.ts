import { vi } from 'vitest';

/**
 * The network seen by client code under jsdom: a replacement for `fetch` that answers from a table of
 * routes and keeps every request, so a test can say what was sent (or that nothing was). Only the
 * network boundary is replaced; the code under test runs as it does in the browser.
 */
export type Sent = { method: string; url: string; body: unknown; credentials: RequestCredentials | undefined };
type Route = { method: string; path: string; answer: () => Response | Promise<Response> };

export function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
}

export function fakeNetwork() {
  const routes: Route[] = [];
  const sent: Sent[] = [];
  const fetchImpl = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const method = (init.method ?? 'GET').toUpperCase();
    sent.push({ method, url, body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined, credentials: init.credentials });
    const path = url.replace(/^https?:\/\/[^/]+/, '').split('?')[0];
    const route = routes.find((r) => r.method === method && r.path === path);
    if (!route) throw new TypeError(`fake network: no route for ${method} ${path}`);
    return route.answer();
  });
  vi.stubGlobal('fetch', fetchImpl);
  return {
    sent,
    on(method: string, path: string, answer: () => Response | Promise<Response>) {
      routes.push({ method, path, answer });
      return this;
    },
    restore: () => vi.unstubAllGlobals(),
  };
}
