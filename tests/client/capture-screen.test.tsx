import { cleanup, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { renderCapture } from './capture-harness.tsx';
import { eventually, newCaseId, newDbName, OFFLINE_URL, readOutboxRaw, startTablet, stopTablets } from './sync-helpers.ts';
import { startTestSyncServer, type TestSyncServer } from './sync-test-server.ts';

let server: TestSyncServer | undefined;
afterEach(async () => {
  cleanup();
  await stopTablets();
  await server?.close();
  server = undefined;
});

async function openTablet() {
  const s = await startTestSyncServer();
  server = s;
  const caseId = newCaseId();
  const dbName = newDbName();
  const engine = startTablet(s.url, { dbName });
  await engine.ready;
  renderCapture(engine, caseId);
  await waitFor(() => expect(screen.getByTestId('connection')).toHaveAttribute('data-state', 'online'));
  return { caseId, dbName, engine, server: s };
}

const tap = (key: string) => userEvent.pointer({ keys: '[MouseLeft>]', target: document.querySelector(`[data-tap="${key}"]`)! }).then(() => userEvent.pointer({ keys: '[/MouseLeft]' }));
const count = (id: string) => screen.getByTestId(`count-${id}`).textContent;

describe('the capture screen', () => {
  it('counts a tap at once, lists it, keeps it on the tablet and has the server store it', async () => {
    const { caseId, dbName, server } = await openTablet();
    await tap('clip-deployed');
    expect(count('clips-deployed')).toBe('1');
    const rows = within(screen.getByTestId('recent-events')).getAllByRole('listitem');
    expect(rows).toHaveLength(1);
    expect(rows[0]).toHaveTextContent('Clip deployed');
    await eventually(() => expect(server.log(caseId).map((e) => [e.kind, e.payload])).toEqual([['clip_fired', { outcome: 'deployed' }]]));
    expect(await readOutboxRaw(dbName)).toEqual([]); // accepted, so it left the outbox
  });

  it('records one event per tap, including a second tap on the same button', async () => {
    const { caseId, server } = await openTablet();
    await tap('bleed');
    await tap('bleed');
    expect(count('bleeds-open')).toBe('2');
    await eventually(() => expect(server.log(caseId).map((e) => e.kind)).toEqual(['bleed', 'bleed']));
  });

  it('gives each specimen out a specimen id of its own, for the specimen list to take it under', async () => {
    const { caseId, server } = await openTablet();
    await tap('specimen-retrieved');
    await tap('specimen-retrieved');
    await eventually(() => expect(server.log(caseId)).toHaveLength(2));
    const ids = server.log(caseId).map((e) => (e.payload as { specimenId?: string }).specimenId);
    // UUIDv7: version nibble 7, variant bits 10 (RFC 9562 §5.7).
    for (const id of ids) expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(new Set(ids).size).toBe(2);
  });

  it('ties a haemostasis tap to the open bleed, so the board shows it controlled', async () => {
    const { caseId, server } = await openTablet();
    await tap('bleed');
    expect(screen.getByTestId('open-bleed-elapsed')).toBeInTheDocument();
    await tap('haemostasis');
    expect(count('bleeds-open')).toBe('0');
    expect(count('bleeds-controlled')).toBe('1');
    await eventually(() => expect(server.log(caseId)).toHaveLength(2));
    const [bleed, haemostasis] = server.log(caseId);
    expect(haemostasis!.payload).toEqual({ achieved: true, bleedId: bleed!.id });
  });

  it('undoes the last tap with a void whose reason is "undo"', async () => {
    const { caseId, server } = await openTablet();
    await tap('loop');
    await tap('clip-deployed');
    await userEvent.click(await screen.findByRole('button', { name: /^Undo “Clip deployed”/ }));
    await waitFor(() => expect(count('clips-deployed')).toBe('0'));
    expect(count('loops-placed')).toBe('1');
    await eventually(() => expect(server.log(caseId)).toHaveLength(3));
    const [, clip, voided] = server.log(caseId);
    expect(voided!.kind).toBe('void');
    expect(voided!.payload).toEqual({ targetId: clip!.id, reason: 'undo' });
  });

  it('records a chip of the quick sheet at once as an amendment of the tapped event', async () => {
    const { caseId, server } = await openTablet();
    await tap('injection');
    const strip = await screen.findByTestId('quick-strip');
    await userEvent.click(within(strip).getByRole('button', { name: '5 ml' }));
    await waitFor(() => expect(count('injection-ml')).toBe('5'));
    await eventually(() => expect(server.log(caseId)).toHaveLength(2));
    const [injection, amend] = server.log(caseId);
    expect(injection!.payload).toEqual({});
    expect(amend!.payload).toEqual({ targetId: injection!.id, fields: { volumeMl: 5 } });
  });

  it('opens every field of the tapped event from the quick sheet, and saves them as one amendment', async () => {
    const { caseId, server } = await openTablet();
    await tap('clip-deployed');
    await userEvent.click(within(await screen.findByTestId('quick-strip')).getByRole('button', { name: 'More…' }));
    const panel = screen.getByTestId('detail-panel');
    await userEvent.click(within(panel).getByRole('button', { name: 'Closure' }));
    await userEvent.type(within(panel).getByRole('textbox', { name: 'Catalogue item (scan or type)' }), 'clip-11');
    await userEvent.click(within(panel).getByRole('button', { name: 'Save details' }));
    await eventually(() => expect(server.log(caseId)).toHaveLength(2));
    const [clip, amend] = server.log(caseId);
    expect(amend!.payload).toEqual({ targetId: clip!.id, fields: { purpose: 'closure', itemId: 'clip-11' } });
    await waitFor(() => expect(screen.queryByTestId('detail-panel')).toBeNull());
    // The amendment is recorded once the tap's own write has resolved, so the row may show it a redraw later.
    await waitFor(() => expect(within(screen.getByTestId('recent-events')).getAllByRole('listitem')[0]).toHaveTextContent('Closure · clip-11 (edited)'));
  });

  it('refuses a detail the event cannot hold, naming the field, and records nothing', async () => {
    const { caseId, server } = await openTablet();
    await tap('injection');
    await userEvent.click(within(await screen.findByTestId('quick-strip')).getByRole('button', { name: 'More…' }));
    const panel = screen.getByTestId('detail-panel');
    await userEvent.type(within(panel).getByRole('textbox', { name: 'Volume (ml)' }), '900');
    await userEvent.click(within(panel).getByRole('button', { name: 'Save details' }));
    // The injection schema allows at most 500 ml (shared/schemas/events.ts).
    expect(within(panel).getByRole('alert')).toHaveTextContent(/^Volume: /);
    await eventually(() => expect(server.log(caseId)).toHaveLength(1));
  });

  it('voids any event from the recent list with a reason', async () => {
    const { caseId, server } = await openTablet();
    await tap('marking');
    await tap('incision');
    const rows = within(screen.getByTestId('recent-events')).getAllByRole('button');
    await userEvent.click(rows[1]!); // the older one: Marking
    const panel = await screen.findByTestId('detail-panel');
    await userEvent.click(within(panel).getByRole('button', { name: 'Void…' }));
    await userEvent.click(within(panel).getByRole('button', { name: 'Wrong button' }));
    await userEvent.click(within(panel).getByRole('button', { name: 'Void with this reason' }));
    await eventually(() => expect(server.log(caseId)).toHaveLength(3));
    const [marking, , voided] = server.log(caseId);
    expect(voided!.payload).toEqual({ targetId: marking!.id, reason: 'Wrong button' });
    await waitFor(() => expect(document.querySelector(`[data-event-id="${marking!.id}"]`)).toHaveAttribute('data-voided', 'true'));
  });

  it('shows a skipped time-out with its reason until the end of the case', async () => {
    const { caseId, server } = await openTablet();
    expect(screen.getByTestId('time-out-status')).toHaveAttribute('data-status', 'missing');
    await userEvent.click(screen.getByTestId('time-out-status'));
    await userEvent.click(screen.getByRole('button', { name: 'Skip…' }));
    await userEvent.click(screen.getByRole('button', { name: 'Emergency: no time for the check' }));
    await userEvent.click(screen.getByRole('button', { name: 'Record as skipped' }));
    await waitFor(() => expect(screen.getByTestId('time-out-status')).toHaveAttribute('data-status', 'skipped'));
    expect(screen.getByTestId('time-out-status')).toHaveTextContent('Emergency: no time for the check');
    await eventually(() => expect(server.log(caseId)[0]?.payload).toMatchObject({ skipped: { reason: 'Emergency: no time for the check' } }));
  });

  it('records a full time-out with every answer', async () => {
    const { caseId, server } = await openTablet();
    await userEvent.click(screen.getByTestId('time-out-status'));
    for (const group of screen.getAllByRole('radiogroup')) await userEvent.click(within(group).getByRole('radio', { name: 'Yes' }));
    await userEvent.click(screen.getByRole('button', { name: 'Record time-out' }));
    await waitFor(() => expect(screen.getByTestId('time-out-status')).toHaveAttribute('data-status', 'present'));
    await eventually(() => expect(server.log(caseId)).toHaveLength(1));
    const items = (server.log(caseId)[0]!.payload as { items: { key: string; answer: string }[] }).items;
    // The eight items PRODUCT.md lists for the time-out (after the WHO Surgical Safety Checklist).
    expect(items.map((i) => i.key)).toEqual(['patient_identity', 'procedure_site', 'consent', 'allergies', 'anticoagulants_held', 'equipment_esu', 'co2_insufflation', 'specimen_plan']);
    expect(items.every((i) => i.answer === 'yes')).toBe(true);
  });

  it('keeps counting taps while offline and says how many wait', async () => {
    const caseId = newCaseId();
    const engine = startTablet(OFFLINE_URL, { dbName: newDbName() });
    await engine.ready;
    renderCapture(engine, caseId);
    expect(screen.getByTestId('connection')).toHaveAttribute('data-state', 'offline');
    await tap('clip-deployed');
    await tap('clip-misfired');
    expect(count('clips-deployed')).toBe('1');
    expect(count('clips-misfired')).toBe('1');
    await waitFor(() => expect(screen.getByTestId('waiting-count')).toHaveTextContent('2 waiting'));
  });
});
