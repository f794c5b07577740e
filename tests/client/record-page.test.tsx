import type { ReactNode } from 'react';
import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { MemoryRouter } from 'react-router';
import { toRecordInput } from '#shared/domain/record/index.ts';
import { recordViewSchema, RECORD_CAUTION, type RecordView } from '#shared/schemas/record.ts';
import type { EventKind, PayloadOf } from '#shared/schemas/events.ts';
import { buildRecordView, type RecordCase } from '#server/modules/record/view.ts';
import { RecordBody, RecordPage } from '@/features/record/components/record-page.tsx';
import { buildEvent } from '../factories/events.ts';
import { fakeNetwork, json } from './shell-fake-network.ts';

// Invented case; the view is built by the server's own view builder from an event log, as GET …/record answers.
const caseId = '5a4b3c2d-1e0f-4a9b-8c7d-6e5f4a3b2c1d';
const nurse = '7f6e5d4c-3b2a-4190-8f7e-6d5c4b3a2910';
const clipItem = '3d2c1b0a-9f8e-4d7c-8b6a-5f4e3d2c1b0a';
const base = Date.parse('2025-03-14T09:00:00.000Z');

const e = <K extends EventKind>(kind: K, minute: number, payload?: PayloadOf<K>) =>
  buildEvent(kind, { caseId, author: nurse, deviceTime: new Date(base + minute * 60_000).toISOString(), ...(payload ? { payload } : {}) } as never);

function buildView(): RecordView {
  const clip = e('clip_fired', 21, { outcome: 'deployed', purpose: 'haemostasis', itemId: clipItem });
  const bleed = e('bleed', 20, { severity: 'ooze' });
  const events = [
    e('scope_in', 5), e('incision', 10), bleed, clip, e('clip_fired', 22, { outcome: 'misfired', itemId: clipItem }),
    e('haemostasis', 23, { achieved: true, bleedId: bleed.id, method: 'clip' }), e('loop_placed', 30, { sizeMm: 20 }), e('scope_out', 40),
  ].map((x, i) => toRecordInput({ ...x, seq: i + 1, receivedAt: x.deviceTime }));
  const caseRow: RecordCase = {
    id: caseId, status: 'recording', procedureType: 'emr', scheduledAt: new Date(base), closedAt: null, roomName: 'Room A',
    indication: 'Invented', lesionSite: 'ascending colon', lesionSizeMm: 25, lesionParis: '0-IIa', sedation: 'moderate',
    hospitalNumber: 'KB-000123', familyName: 'Testwood', givenName: 'Zoë', birthDate: '1961-05-02', sex: 'female',
    endoscopistId: 'user-endo', endoscopistName: 'Amara Osei', nurseId: nurse, nurseName: 'Sofia Marin',
  };
  const usage = {
    id: '0192a3b4-5c6d-7e8f-9a0b-1c2d3e4f5a6b', caseId, eventId: clip.id, itemId: clipItem, scheme: 'gs1', gtin: '09506000134352',
    lot: 'LOT-88', serial: null, expiry: '2027-12-31', productionDate: null, rawScan: '0109506000134352', createdAt: new Date(base + 21 * 60_000),
  };
  const item = { id: clipItem, unitId: 'u', description: 'Rotatable clip', type: 'clip', sizeLabel: '11 mm', gtin: '09506000134352', hibccLabeler: null, hibccProduct: null, active: true, createdAt: new Date(base) };
  return recordViewSchema.parse(buildRecordView({
    caseRow, events, usages: [usage], specimens: [], items: new Map([[clipItem, item]]), people: new Map([[nurse, 'Sofia Marin']]), timeZone: 'UTC', now: new Date(base + 3600_000),
  }));
}

const wrap = (ui: ReactNode) => <MemoryRouter>{ui}</MemoryRouter>;

describe('the record page', () => {
  it('shows the counts, the lot and the bleed episode from the record view', () => {
    render(wrap(<RecordBody view={buildView()} />));
    expect(screen.getByTestId('record-patient')).toHaveTextContent('TESTWOOD, Zoë');
    expect(screen.getByTestId('count-clips-deployed')).toHaveTextContent('1');
    expect(screen.getByTestId('count-clips-misfired')).toHaveTextContent('1');
    expect(screen.getByTestId('count-loops')).toHaveTextContent('1');
    expect(screen.getByTestId('device-lots')).toHaveTextContent('LOT-88 (2027-12-31)');
    // Bleed at minute 20, haemostasis at 23: 180 s, written "3 min 00 s".
    expect(screen.getByTestId('bleed-time')).toHaveTextContent('3 min 00 s');
    const timeline = screen.getByRole('region', { name: 'Timeline by phase' });
    expect(within(timeline).getByText('Clip misfired')).toBeInTheDocument();
  });

  it('links to the PDF of the same record and carries the caution', () => {
    render(wrap(<RecordBody view={buildView()} />));
    expect(screen.getByRole('link', { name: 'Open the PDF' })).toHaveAttribute('href', `/api/cases/${caseId}/record.pdf`);
    expect(screen.getByRole('note', { name: 'Caution' })).toHaveTextContent(RECORD_CAUTION);
  });

  it('says so when the case is not the unit\'s', async () => {
    const net = fakeNetwork().on('GET', `/api/cases/${caseId}/record`, () => json(404, { error: 'No such case in your unit' }));
    const queries = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(<QueryClientProvider client={queries}>{wrap(<RecordPage caseId={caseId} />)}</QueryClientProvider>);
    expect(await screen.findByText('No such case in your unit')).toBeInTheDocument();
    net.restore();
  });

  it('loads the record from the API and shows it', async () => {
    const view = buildView();
    const net = fakeNetwork().on('GET', `/api/cases/${caseId}/record`, () => json(200, view));
    const queries = new QueryClient({ defaultOptions: { queries: { retry: false } } });
    render(<QueryClientProvider client={queries}>{wrap(<RecordPage caseId={caseId} />)}</QueryClientProvider>);
    expect(await screen.findByTestId('count-clips-deployed')).toHaveTextContent('1');
    expect(net.sent.map((s) => s.url)).toEqual([`/api/cases/${caseId}/record`]);
    net.restore();
  });
});
