import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { buildEvent } from '../factories/events.ts';
import { renderCapture } from './capture-harness.tsx';
import { eventually, newCaseId, newDbName, startTablet, stopTablets } from './sync-helpers.ts';
import { startTestSyncServer, type TestServerOptions, type TestSyncServer } from './sync-test-server.ts';

let server: TestSyncServer | undefined;
afterEach(async () => {
  cleanup();
  await stopTablets();
  await server?.close();
  server = undefined;
});

async function openTablet(options: TestServerOptions = {}) {
  const s = await startTestSyncServer(options);
  server = s;
  const caseId = newCaseId();
  const engine = startTablet(s.url, { dbName: newDbName() });
  await engine.ready;
  renderCapture(engine, caseId);
  await waitFor(() => expect(screen.getByTestId('connection')).toHaveAttribute('data-state', 'online'));
  return { caseId, engine, server: s };
}

const tap = async (key: string) => {
  await userEvent.pointer({ keys: '[MouseLeft>]', target: document.querySelector(`[data-tap="${key}"]`)! });
  await userEvent.pointer({ keys: '[/MouseLeft]' });
};
const now = () => new Date().toISOString();

describe('sign-out on the capture screen', () => {
  it('shows opened = deployed + misfired + wasted per item, flags the one that does not add up, and closes the record', async () => {
    const { caseId, server } = await openTablet();
    const other = { caseId, device: 'tablet-other', deviceTime: now() };
    server.storeFromElsewhere(caseId, [
      buildEvent('device_opened', { ...other, payload: { itemId: 'clip-11', quantity: 3 } }),
      buildEvent('clip_fired', { ...other, payload: { itemId: 'clip-11', outcome: 'deployed' } }),
      buildEvent('clip_fired', { ...other, payload: { itemId: 'clip-11', outcome: 'misfired' } }),
      buildEvent('device_opened', { ...other, payload: { itemId: 'loop-30', quantity: 1 } }),
      buildEvent('loop_placed', { ...other, payload: { itemId: 'loop-30' } }),
    ]);
    await waitFor(() => expect(screen.getByTestId('count-clips-deployed')).toHaveTextContent('1'));
    await userEvent.click(screen.getByTestId('sign-out-status'));
    const table = screen.getByTestId('reconciliation');
    // 3 opened − 1 deployed − 1 misfired = 1 unaccounted (the reconciliation rule of PRODUCT.md).
    const clip = table.querySelector('[data-item="clip-11"]')!;
    expect(clip).toHaveAttribute('data-flagged', 'true');
    expect(within(clip as HTMLElement).getAllByRole('cell').map((c) => c.textContent)).toEqual(['clip-11', '3', '1', '1', '0', '1', '! 1']);
    expect(table.querySelector('[data-item="loop-30"]')).not.toHaveAttribute('data-flagged');
    expect(screen.getByText('1 item does not reconcile')).toBeInTheDocument();
    expect(screen.queryByText('The scope is still in')).toBeNull();

    for (const group of screen.getAllByRole('radiogroup')) await userEvent.click(within(group).getByRole('radio', { name: 'Yes' }));
    await userEvent.click(screen.getByRole('button', { name: 'Sign out and close the record' }));
    await waitFor(() => expect(screen.getByTestId('sign-out-status')).toHaveAttribute('data-status', 'present'));
    expect(document.querySelector('[data-tap="clip-deployed"]')).toBeDisabled();
    await eventually(() => expect(server.log(caseId).at(-1)?.kind).toBe('sign_out'));
  });

  it('warns that the scope is still in before the record is closed, since a scope out is refused after', async () => {
    const { caseId, server } = await openTablet();
    server.storeFromElsewhere(caseId, [buildEvent('scope_in', { caseId, device: 'tablet-other', deviceTime: now(), payload: {} })]);
    await waitFor(() => expect(screen.getByTestId('recent-events').querySelectorAll('li')).toHaveLength(1));
    await userEvent.click(screen.getByTestId('sign-out-status'));
    expect(screen.getByText('The scope is still in')).toBeInTheDocument();
    expect(screen.getByText(/a scope out tapped later is\s+refused/)).toBeInTheDocument();
  });
});

describe('near-duplicate taps from two tablets', () => {
  it('asks a person, and "keep both" keeps both events', async () => {
    const { caseId, server } = await openTablet();
    await tap('clip-deployed');
    server.storeFromElsewhere(caseId, [buildEvent('clip_fired', { caseId, device: 'tablet-other', author: 'user-endo-1', deviceTime: now(), payload: { outcome: 'deployed' } })]);
    const notice = await screen.findByTestId('near-duplicate');
    expect(notice).toHaveTextContent('“Clip deployed” was recorded on two tablets');
    expect(notice).toHaveTextContent("Amara Osei's tablet");
    await userEvent.click(within(notice).getByRole('button', { name: 'Two events: keep both' }));
    expect(screen.queryByTestId('near-duplicate')).toBeNull();
    expect(screen.getByTestId('count-clips-deployed')).toHaveTextContent('2');
  });

  it('voids the one a person picks, with the reason given', async () => {
    const { caseId, server } = await openTablet();
    await tap('bleed');
    const [theirs] = server.storeFromElsewhere(caseId, [buildEvent('bleed', { caseId, device: 'tablet-other', author: 'user-endo-1', deviceTime: now() })]);
    const notice = await screen.findByTestId('near-duplicate');
    await userEvent.click(within(notice).getByRole('button', { name: "Same: void the one from Amara Osei's tablet" }));
    await eventually(() => expect(server.log(caseId).at(-1)?.payload).toEqual({ targetId: theirs!.id, reason: 'Same event recorded on two tablets' }));
    await waitFor(() => expect(screen.queryByTestId('near-duplicate')).toBeNull());
    expect(screen.getByTestId('count-bleeds-open')).toHaveTextContent('1');
  });
});

describe('events the server refuses', () => {
  it('lists them with the reason, outside the counts, and a person can discard one, which is recorded', async () => {
    const { caseId, server } = await openTablet({ refuse: (e) => (e.kind === 'clip_fired' ? 'Invented refusal for the test' : null) });
    await tap('clip-deployed');
    const open = await screen.findByTestId('refused-open');
    expect(open).toHaveTextContent('1 refused');
    // The board redraws in a yielding, coalesced update after the status strip: wait for that frame.
    await waitFor(() => expect(screen.getByTestId('count-clips-deployed')).toHaveTextContent('0'));
    await userEvent.click(open);
    expect(screen.getByText('Invented refusal for the test')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Discard…' }));
    await userEvent.type(screen.getByRole('textbox', { name: 'Why discard it' }), 'Tapped by mistake');
    await userEvent.click(screen.getByRole('button', { name: 'Discard, recording why' }));
    await waitFor(() => expect(screen.queryByTestId('refused-open')).toBeNull());
    await eventually(() => expect(server.log(caseId).map((e) => e.kind)).toEqual(['remark']));
    expect((server.log(caseId)[0]!.payload as { text: string }).text).toContain('Tapped by mistake');
  });
});

describe('a session that ended elsewhere', () => {
  it('shows "Signed out" with the taps kept here, not "Offline", and offers to sign in again', async () => {
    const s = await startTestSyncServer();
    server = s;
    // As the server does once a session has ended: a push over the socket is answered 'unauthorized'.
    s.io.on('connection', (socket) => socket.prependListener('events.push', (_msg: unknown, ack: (a: unknown) => void) => {
      ack({ error: 'Your session has ended; sign in again', code: 'unauthorized' });
    }));
    const caseId = newCaseId();
    const engine = startTablet(s.url, { dbName: newDbName() });
    await engine.ready;
    renderCapture(engine, caseId);
    await waitFor(() => expect(screen.getByTestId('connection')).toHaveAttribute('data-state', 'online'));
    await tap('clip-deployed');
    await waitFor(() => expect(screen.getByTestId('connection')).toHaveAttribute('data-state', 'signed-out'));
    expect(screen.getByRole('status')).toHaveTextContent('Signed out· 1 waiting');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in again' }));
    expect(screen.getByTestId('location').textContent).toMatch(/^\/sign-in\?next=/);
  });
});

