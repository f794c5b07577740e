import { describe, expect, it, vi } from 'vitest';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { captureItemControl } from '@/features/devices/components/item-control.tsx';
import { pendingUsages } from '@/features/devices/api/usage-outbox.ts';
import { fakeNetwork, json } from './shell-fake-network.ts';

const caseId = '5a4b3c2d-1e0f-4a9b-8c7d-6e5f4a3b2c1d';
// GS1's example GTIN (GS1 General Specifications, AI (01) examples; from memory).
const item = {
  id: '3d2c1b0a-9f8e-4d7c-8b6a-5f4e3d2c1b0a', description: 'Through-the-scope clip', type: 'clip', sizeLabel: '11 mm',
  gtin: '09506000134352', hibccLabeler: null, hibccProduct: null, active: true, createdAt: '2026-01-01T00:00:00.000Z',
};

function renderControl(onChange = vi.fn()) {
  const Control = captureItemControl(caseId);
  const queries = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(<QueryClientProvider client={queries}><Control value="" onChange={onChange} label="Catalogue item (scan or type)" /></QueryClientProvider>);
  return onChange;
}

describe('the capture screen\'s item control', () => {
  it('names the item on the event at once and sends the label as a device usage with an id made here', async () => {
    const usage = { id: '0192a3b4-5c6d-7e8f-9a0b-1c2d3e4f5a6b', caseId, eventId: null, itemId: item.id, scheme: 'gs1', gtin: item.gtin, lot: 'L9', serial: null, expiry: null, productionDate: null, rawScan: '', createdAt: '2026-06-01T10:00:00.000Z', warnings: [] };
    const net = fakeNetwork()
      .on('GET', '/api/catalogue', () => json(200, { items: [item] }))
      .on('POST', `/api/cases/${caseId}/device-usages`, () => json(201, usage));
    const user = userEvent.setup();
    const onChange = renderControl();
    const field = await screen.findByLabelText('Device label (scan or type)');
    await waitFor(() => expect(net.sent.some((s) => s.url.startsWith('/api/catalogue'))).toBe(true));
    await user.type(field, `01${item.gtin}10L9{Enter}`);
    await user.click(await screen.findByRole('button', { name: 'Record this device' }));
    expect(onChange).toHaveBeenCalledWith(item.id);
    expect(await screen.findByText('Label recorded: lot L9.')).toBeInTheDocument();
    const post = net.sent.find((s) => s.method === 'POST')!;
    // Only the raw scan goes to the server, which reads it itself.
    expect(post.body).toEqual({ id: expect.stringMatching(/^[0-9a-f-]{36}$/), eventId: null, itemId: item.id, rawScan: `01${item.gtin}10L9` });
    expect(await pendingUsages()).toEqual([]);
    net.restore();
  });

  it('keeps the label on the tablet when the network is down, to send later', async () => {
    const net = fakeNetwork().on('GET', '/api/catalogue', () => json(200, { items: [item] }))
      .on('POST', `/api/cases/${caseId}/device-usages`, () => { throw new TypeError('Failed to fetch'); });
    const user = userEvent.setup();
    renderControl();
    const field = await screen.findByLabelText('Device label (scan or type)');
    await waitFor(() => expect(net.sent.length).toBeGreaterThan(0));
    await user.type(field, `01${item.gtin}10OFF1{Enter}`);
    await user.click(await screen.findByRole('button', { name: 'Record this device' }));
    expect(await screen.findByText(/kept on this tablet/)).toBeInTheDocument();
    const waiting = await pendingUsages();
    expect(waiting.map((p) => p.body.rawScan)).toEqual([`01${item.gtin}10OFF1`]);
    net.restore();
  });
});
