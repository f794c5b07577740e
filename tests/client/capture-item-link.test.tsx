import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { captureItemControl } from '@/features/devices/components/item-control.tsx';
import { pendingUsages } from '@/features/devices/api/usage-outbox.ts';
import { renderCapture } from './capture-harness.tsx';
import { fakeNetwork, json } from './shell-fake-network.ts';
import { eventually, newCaseId, newDbName, startTablet, stopTablets } from './sync-helpers.ts';
import { startTestSyncServer, type TestSyncServer } from './sync-test-server.ts';

// GS1's example GTIN (GS1 General Specifications, AI (01) examples; from memory).
const item = {
  id: '3d2c1b0a-9f8e-4d7c-8b6a-5f4e3d2c1b0a', description: 'Through-the-scope clip', type: 'clip', sizeLabel: '11 mm',
  gtin: '09506000134352', hibccLabeler: null, hibccProduct: null, active: true, createdAt: '2026-01-01T00:00:00.000Z',
};

let server: TestSyncServer | undefined;
let net: ReturnType<typeof fakeNetwork> | undefined;
afterEach(async () => {
  cleanup();
  await stopTablets();
  await server?.close();
  net?.restore();
  server = undefined;
});

/**
 * The HTTP side of the server as the device-usages route behaves (server/modules/device-usages/service.ts):
 * a usage naming an event the server has not stored yet is answered 409 on `eventId`; otherwise stored.
 */
function deviceUsageRoute(s: TestSyncServer, caseId: string) {
  net = fakeNetwork()
    .on('GET', '/api/catalogue', () => json(200, { items: [item] }))
    .on('POST', `/api/cases/${caseId}/device-usages`, () => {
      const body = net!.sent.at(-1)!.body as { id: string; eventId: string | null; itemId: string | null; rawScan: string };
      if (body.eventId && !s.log(caseId).some((e) => e.id === body.eventId)) {
        return json(409, { error: 'That event has not reached the server yet', issues: [{ path: 'eventId', message: 'Not yet stored' }] });
      }
      return json(201, {
        id: body.id, caseId, eventId: body.eventId, itemId: body.itemId, scheme: 'gs1', gtin: item.gtin, lot: body.rawScan.slice(18), serial: null,
        expiry: null, productionDate: null, rawScan: body.rawScan, createdAt: new Date().toISOString(), warnings: [],
      });
    });
  return net;
}

/** jsdom on a busy two-core machine: the outbox write and the answer can take over a second. */
const wait = { timeout: 5_000 };
const tap = (key: string) => userEvent.pointer({ keys: '[MouseLeft>]', target: document.querySelector(`[data-tap="${key}"]`)! }).then(() => userEvent.pointer({ keys: '[/MouseLeft]' }));
const usagePosts = () => net!.sent.filter((s) => s.method === 'POST').map((s) => s.body as { id: string; eventId: string | null });

async function scanInSheet(lot: string) {
  await userEvent.click(within(await screen.findByTestId('quick-strip')).getByRole('button', { name: 'More…' }));
  const panel = screen.getByTestId('detail-panel');
  await waitFor(() => expect(net!.sent.some((s) => s.url.startsWith('/api/catalogue'))).toBe(true));
  await userEvent.type(within(panel).getByLabelText('Device label (scan or type)'), `01${item.gtin}10${lot}{Enter}`);
  await userEvent.click(await within(panel).findByRole('button', { name: 'Record this device' }));
  return panel;
}

describe('the capture screen links a scanned label to the tap it details', () => {
  it('sends the tapped event\'s id with the device usage', { timeout: 20_000 }, async () => {
    server = await startTestSyncServer();
    const caseId = newCaseId();
    const net = deviceUsageRoute(server, caseId);
    const engine = startTablet(server.url, { dbName: newDbName() });
    await engine.ready;
    renderCapture(engine, caseId, captureItemControl(caseId));
    await waitFor(() => expect(screen.getByTestId('connection')).toHaveAttribute('data-state', 'online'));

    await tap('clip-deployed');
    await eventually(() => expect(server!.log(caseId)).toHaveLength(1));
    const panel = await scanInSheet('LINK1');
    expect(await within(panel).findByText('Label recorded: lot LINK1.', {}, wait)).toBeInTheDocument();
    const [clip] = server.log(caseId);
    expect(clip!.kind).toBe('clip_fired');
    expect(usagePosts()).toEqual([expect.objectContaining({ eventId: clip!.id, itemId: item.id, rawScan: `01${item.gtin}10LINK1` })]);
    expect(net.sent.filter((s) => s.method === 'POST')).toHaveLength(1);
  });

  it('keeps a scan of a tap made offline as waiting, and links it once the tap has synced', { timeout: 30_000 }, async () => {
    const s = await startTestSyncServer();
    server = s;
    // The server refuses the tablet's connection until the network "comes back" (a handshake refusal is not retried by Socket.IO).
    let offline = true;
    s.io.use((_socket, next) => (offline ? next(new Error('offline')) : next()));
    const caseId = newCaseId();
    deviceUsageRoute(s, caseId);
    const engine = startTablet(s.url, { dbName: newDbName() });
    await engine.ready;
    renderCapture(engine, caseId, captureItemControl(caseId));

    await tap('clip-deployed');
    expect(screen.getByTestId('count-clips-deployed')).toHaveTextContent('1');
    const panel = await scanInSheet('LATE1');
    // The tap was never held back by the scan: it counts, and waits in the tablet's outbox.
    await waitFor(() => expect(screen.getByTestId('waiting-count')).toHaveTextContent('1 waiting'));
    // The tap is on the tablet only: the server answers 409 on eventId, and the scan waits for it.
    expect(await within(panel).findByText('Label kept on this tablet for this tap; it is sent when the server can take it.', {}, wait)).toBeInTheDocument();
    const [first] = usagePosts();
    expect(first!.eventId).toMatch(/^[0-9a-f-]{36}$/);
    expect((await pendingUsages()).map((p) => p.body.id)).toEqual([first!.id]);

    // The network is back: the browser says so ('online'), and the tablet connects again.
    offline = false;
    window.dispatchEvent(new Event('online'));
    engine.reconnect();
    await eventually(() => expect(s.log(caseId).map((e) => e.id)).toContain(first!.eventId));
    expect(await within(panel).findByText('Label recorded: lot LATE1.', {}, wait)).toBeInTheDocument();
    // Every try carried the same usage id and the same tap: it is stored once, linked.
    const posts = usagePosts();
    expect(posts.length).toBeGreaterThan(1);
    expect(new Set(posts.map((p) => `${p.id} ${p.eventId}`))).toEqual(new Set([`${first!.id} ${first!.eventId}`]));
    expect(await pendingUsages()).toEqual([]);
  });
});
