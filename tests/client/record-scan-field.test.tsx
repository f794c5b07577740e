import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { CatalogueItem } from '#shared/schemas/catalogue.ts';
import { ScanField } from '@/features/devices/components/scan-field.tsx';
import { WedgeDetector } from '@/features/devices/wedge.ts';

// GS1's example GTIN (GS1 General Specifications, AI (01) examples; from memory): check digit 2.
const GTIN = '09506000134352';
const today = new Date('2026-06-15T10:00:00');

function buildItem(over: Partial<CatalogueItem> = {}): CatalogueItem {
  return {
    id: '3d2c1b0a-9f8e-4d7c-8b6a-5f4e3d2c1b0a', description: 'Through-the-scope clip, rotatable', type: 'clip', sizeLabel: '11 mm',
    gtin: GTIN, hibccLabeler: null, hibccProduct: null, active: true, createdAt: '2026-01-01T00:00:00.000Z', ...over,
  };
}

function renderField(catalogue: CatalogueItem[] = [buildItem()]) {
  const onConfirm = vi.fn();
  render(<ScanField catalogue={catalogue} onConfirm={onConfirm} today={today} />);
  return { onConfirm, field: screen.getByLabelText('Device label (scan or type)') };
}

describe('the scan field', () => {
  it('reads a typed GS1 code with "<GS>" as the separator and shows the item, lot and expiry before anything is recorded', async () => {
    const user = userEvent.setup();
    const { onConfirm, field } = renderField();
    await user.type(field, `01${GTIN}17271231` + '10LOT-42<GS>21SN7{Enter}');
    const reading = screen.getByTestId('scan-reading');
    expect(reading).toHaveTextContent('Through-the-scope clip, rotatable, 11 mm');
    expect(reading).toHaveTextContent('LOT-42');
    expect(reading).toHaveTextContent('SN7');
    // AI (17) 271231 is 31 December 2027 (GS1 General Specifications §7.12, two-digit year window).
    expect(reading).toHaveTextContent('2027-12-31');
    expect(onConfirm).not.toHaveBeenCalled();
    await user.click(screen.getByRole('button', { name: 'Record this device' }));
    expect(onConfirm).toHaveBeenCalledWith(expect.objectContaining({ raw: `01${GTIN}1727123110LOT-42\u001d21SN7`, item: expect.objectContaining({ gtin: GTIN }) }));
  });

  it('warns of an expired item before the nurse confirms, and asks to record it anyway', async () => {
    const user = userEvent.setup();
    const { onConfirm, field } = renderField();
    await user.type(field, `01${GTIN}17260531` + '10OLD1{Enter}');
    expect(screen.getByText('Expired item')).toBeInTheDocument();
    expect(screen.getByText(/Expired on 2026-05-31/)).toBeInTheDocument();
    expect(onConfirm).not.toHaveBeenCalled();
    expect(screen.getByRole('button', { name: 'Record it anyway' })).toBeInTheDocument();
  });

  it('says when a GTIN is not in the unit\'s catalogue', async () => {
    const user = userEvent.setup();
    const { field } = renderField([]);
    await user.type(field, `01${GTIN}10L1{Enter}`);
    expect(screen.getByText(`GTIN ${GTIN} is not in the unit's catalogue. It can still be recorded; an administrator can add it.`)).toBeInTheDocument();
  });

  it('refuses a code whose check digit fails, with no way to record it', async () => {
    const user = userEvent.setup();
    const { onConfirm, field } = renderField();
    // …53 instead of …52: the GS1 check digit of 0950600013435 is 2.
    await user.type(field, '0109506000134353{Enter}');
    expect(screen.getByText('The code fails its check: misread or damaged')).toBeInTheDocument();
    expect(screen.getByText(/should be 2, not 3/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Record/ })).toBeNull();
    expect(onConfirm).not.toHaveBeenCalled();
  });

  it('checks an HIBC code\'s mod-43 character', async () => {
    const user = userEvent.setup();
    // "+H629CLIP1101" sums to 154 in the HIBC table, 154 mod 43 = 25 = "P" (HIBC Supplier Labeling Standard); "Q" fails.
    const { field } = renderField([buildItem({ gtin: null, hibccLabeler: 'H629', hibccProduct: 'CLIP110' })]);
    await user.type(field, '+H629CLIP1101Q{Enter}');
    expect(screen.getByText(/should be "P", not "Q"/)).toBeInTheDocument();
    await user.clear(field);
    await user.type(field, '+H629CLIP1101P{Enter}');
    expect(screen.getByTestId('scan-reading')).toHaveTextContent('Through-the-scope clip, rotatable');
  });

  it('catches a hand-held scanner typing a whole code fast while nothing has focus', () => {
    renderField();
    const code = `01${GTIN}10WEDGE9`;
    for (const key of code) fireEvent.keyDown(document.body, { key });
    fireEvent.keyDown(document.body, { key: 'Enter' });
    expect(screen.getByTestId('scan-reading')).toHaveTextContent('WEDGE9');
    expect(screen.getByLabelText('Device label (scan or type)')).toHaveValue(code);
  });

  it('turns the separator chord Ctrl+] into "<GS>" in the field', () => {
    const { field } = renderField();
    fireEvent.change(field, { target: { value: `01${GTIN}10A` } });
    fireEvent.keyDown(field, { key: ']', ctrlKey: true });
    expect(field).toHaveValue(`01${GTIN}10A<GS>`);
  });

  it('shows no camera button where the browser has no camera API (jsdom has no navigator.mediaDevices)', () => {
    renderField();
    expect(screen.queryByRole('button', { name: 'Use the camera' })).toBeNull();
  });
});

describe('telling a scanner from a person', () => {
  it('takes a burst of keys a few milliseconds apart ending in Enter, and ignores the same keys typed slowly', () => {
    const fast = new WedgeDetector(40, 6);
    const keys = [...'0109506'];
    keys.forEach((key, i) => expect(fast.feed({ key }, i * 5)).toBeNull());
    expect(fast.feed({ key: 'Enter' }, keys.length * 5)).toBe('0109506');
    const slow = new WedgeDetector(40, 6);
    keys.forEach((key, i) => slow.feed({ key }, i * 150));
    expect(slow.feed({ key: 'Enter' }, keys.length * 150)).toBeNull();
  });

  it('keeps the group separator sent as the control character or as Ctrl+]', () => {
    const d = new WedgeDetector(40, 3);
    d.feed({ key: '1' }, 0); d.feed({ key: '0' }, 5); d.feed({ key: 'A' }, 10);
    d.feed({ key: ']', ctrlKey: true }, 15); d.feed({ key: '2' }, 20); d.feed({ key: '\u001d' }, 25); d.feed({ key: '9' }, 30);
    expect(d.feed({ key: 'Enter' }, 35)).toBe('10A\u001d2\u001d9');
  });
});
