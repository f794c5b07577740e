import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ItemForm } from '@/features/catalogue/components/item-form.tsx';

describe('the catalogue item form', () => {
  it('catches a GTIN whose check digit fails before anything is sent, saying which digit it should be', async () => {
    const user = userEvent.setup();
    const onSubmit = vi.fn(async () => undefined);
    render(<ItemForm submitLabel="Add to the catalogue" onSubmit={onSubmit} />);
    await user.type(screen.getByLabelText(/Generic description/), 'Through-the-scope clip, rotatable');
    // GS1's example GTIN is 09506000134352 (GS1 General Specifications; from memory), so …53 fails.
    await user.type(screen.getByLabelText(/^GTIN/), '09506000134353');
    await user.click(screen.getByRole('button', { name: 'Add to the catalogue' }));
    expect(screen.getByText(/fails its check digit: the last digit should be 2, not 3/)).toBeInTheDocument();
    expect(screen.getByLabelText(/^GTIN/)).toHaveAttribute('aria-invalid', 'true');
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('sends a good item, with an HIBC code needing both of its halves', async () => {
    const user = userEvent.setup();
    const onSubmit = vi.fn(async () => undefined);
    render(<ItemForm submitLabel="Add to the catalogue" onSubmit={onSubmit} />);
    await user.type(screen.getByLabelText(/Generic description/), 'Detachable loop');
    await user.selectOptions(screen.getByLabelText(/^Type/), 'loop');
    await user.type(screen.getByLabelText(/HIBCC labeler code/), 'H629');
    await user.click(screen.getByRole('button', { name: 'Add to the catalogue' }));
    expect(screen.getByText('Give the HIBCC product code with the labeler code')).toBeInTheDocument();
    await user.type(screen.getByLabelText('HIBCC product code'), 'LOOP20');
    await user.click(screen.getByRole('button', { name: 'Add to the catalogue' }));
    expect(onSubmit).toHaveBeenCalledWith(expect.objectContaining({ description: 'Detachable loop', type: 'loop', hibccLabeler: 'H629', hibccProduct: 'LOOP20' }));
  });
});
