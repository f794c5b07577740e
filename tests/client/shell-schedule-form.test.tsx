import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { createMemoryRouter, RouterProvider, useParams } from 'react-router';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { ToastProvider } from '@/components/ui/toast.tsx';
import { blankSchedule } from '@/features/cases/components/schedule-form/model.ts';
import { ScheduleForm } from '@/features/cases/components/schedule-form/schedule-form.tsx';
import { buildCase, buildMember, buildRoom } from './shell-factories.ts';
import { fakeNetwork, json } from './shell-fake-network.ts';

const room = buildRoom();
const endoscopist = buildMember({ userId: 'user-endo-1', name: 'Amara Osei', role: 'endoscopist' });
const nurse = buildMember();

function CasePage() {
  return <p>Case page {useParams().id}</p>;
}

function renderForm() {
  const router = createMemoryRouter(
    [
      { path: '/cases/new', element: <ScheduleForm defaults={blankSchedule('2025-03-14')} rooms={[room]} endoscopists={[endoscopist]} nurses={[nurse]} /> },
      { path: '/cases/:id', element: <CasePage /> },
    ],
    { initialEntries: ['/cases/new'] },
  );
  const client = new QueryClient({ defaultOptions: { queries: { retry: false }, mutations: { retry: false } } });
  render(
    <QueryClientProvider client={client}>
      <ToastProvider><RouterProvider router={router} /></ToastProvider>
    </QueryClientProvider>,
  );
  return userEvent.setup();
}

/** The error shown for the field labelled `label` (Field ties it to the control by aria-describedby). */
function errorOf(label: string | RegExp): string | null {
  const control = screen.getByLabelText(label);
  const ids = (control.getAttribute('aria-describedby') ?? '').split(' ').filter((id) => id.endsWith('-error'));
  return ids.length ? document.getElementById(ids[0]!)?.textContent ?? null : null;
}

async function fillValid(user: ReturnType<typeof userEvent.setup>) {
  await user.type(screen.getByLabelText(/hospital number/i), 'KB-000123');
  await user.type(screen.getByLabelText(/family name/i), 'Testwood');
  await user.type(screen.getByLabelText(/given name/i), 'Alex');
  fireEvent.change(screen.getByLabelText(/date of birth/i), { target: { value: '1961-05-02' } });
  await user.selectOptions(screen.getByLabelText(/^sex/i), 'female');
  await user.selectOptions(screen.getByLabelText(/^procedure/i), 'esd');
  await user.type(screen.getByLabelText(/indication/i), 'Invented indication for a test');
  await user.type(screen.getByLabelText(/lesion site/i), 'gastric antrum');
  await user.type(screen.getByLabelText(/size \(mm\)/i), '32');
  await user.selectOptions(screen.getByLabelText(/paris type/i), '0-IIa');
  await user.selectOptions(screen.getByLabelText(/^room/i), room.id);
  fireEvent.change(screen.getByLabelText(/planned start/i), { target: { value: '2025-03-14T09:30' } });
  await user.selectOptions(screen.getByLabelText(/^sedation/i), 'deep');
  await user.selectOptions(screen.getByLabelText(/^endoscopist/i), endoscopist.userId);
  await user.selectOptions(screen.getByLabelText(/assisting nurse/i), nurse.userId);
}

describe('the schedule form', () => {
  let net: ReturnType<typeof fakeNetwork>;
  beforeEach(() => { net = fakeNetwork(); });
  afterEach(() => { cleanup(); net.restore(); });

  it('shows the shared schema’s messages beside the fields at fault and sends nothing', async () => {
    const user = renderForm();
    await user.type(screen.getByLabelText(/family name/i), '   ');
    fireEvent.change(screen.getByLabelText(/date of birth/i), { target: { value: '2999-01-01' } });
    await user.type(screen.getByLabelText(/size \(mm\)/i), '0');
    await user.click(screen.getByRole('button', { name: /schedule the case/i }));

    // Messages written in shared/schemas/cases.ts (scheduleCaseSchema and its parts).
    expect(await screen.findByText('Check the marked fields')).toBeInTheDocument();
    expect(errorOf(/hospital number/i)).toBe('Hospital number is required');
    expect(errorOf(/family name/i)).toBe('Family name is required');
    expect(errorOf(/date of birth/i)).toBe('Date of birth is in the future');
    expect(errorOf(/size \(mm\)/i)).toBe('At least 1 mm');
    expect(errorOf(/^endoscopist/i)).toBe('Choose the endoscopist');
    expect(errorOf(/assisting nurse/i)).toBe('Choose the nurse');
    // Where the schema has no words of its own (an empty choice), the form's plain words.
    expect(errorOf(/^room/i)).toBe('Choose the room');
    expect(errorOf(/paris type/i)).toBe('Choose the Paris type, or “not applicable”');
    expect(screen.getByLabelText(/family name/i)).toHaveAttribute('aria-invalid', 'true');
    expect(net.sent).toEqual([]);
  });

  it('clears a message once the field is fixed', async () => {
    const user = renderForm();
    await fillValid(user);
    await user.clear(screen.getByLabelText(/size \(mm\)/i));
    await user.type(screen.getByLabelText(/size \(mm\)/i), '2.5');
    await user.click(screen.getByRole('button', { name: /schedule the case/i }));
    expect(errorOf(/size \(mm\)/i)).toBe('Whole millimetres');

    net.on('POST', '/api/cases', () => json(201, buildCase()));
    await user.clear(screen.getByLabelText(/size \(mm\)/i));
    await user.type(screen.getByLabelText(/size \(mm\)/i), '32');
    expect(errorOf(/size \(mm\)/i)).toBeNull();
  });

  it('sends what the schema accepts, with the planned start as an ISO instant, and opens the new case', async () => {
    const user = renderForm();
    await fillValid(user);
    const created = buildCase();
    net.on('POST', '/api/cases', () => json(201, created));
    await user.click(screen.getByRole('button', { name: /schedule the case/i }));

    expect(await screen.findByText(`Case page ${created.id}`)).toBeInTheDocument();
    expect(net.sent).toHaveLength(1);
    expect(net.sent[0]).toMatchObject({
      method: 'POST',
      url: '/api/cases',
      body: {
        patient: { hospitalNumber: 'KB-000123', familyName: 'Testwood', givenName: 'Alex', birthDate: '1961-05-02', sex: 'female' },
        procedureType: 'esd',
        lesion: { site: 'gastric antrum', sizeMm: 32, paris: '0-IIa' },
        roomId: room.id,
        // The tablet's local 09:30 as an instant (ECMA-262: a date-time without offset is local time).
        scheduledAt: new Date('2025-03-14T09:30').toISOString(),
        sedation: 'deep',
        endoscopistId: endoscopist.userId,
        nurseId: nurse.userId,
      },
    });
  });

  it('sends one case id for the life of the form, so a retry after a lost answer makes no second case', async () => {
    const user = renderForm();
    await fillValid(user);
    // The first send's answer is lost; the second is answered with the case the first made.
    const created = buildCase();
    let answers = 0;
    net.on('POST', '/api/cases', () => (answers++ === 0 ? Promise.reject(new TypeError('Failed to fetch')) : json(200, created)));
    await user.click(screen.getByRole('button', { name: /schedule the case/i }));
    expect(await screen.findByText('The case was not scheduled')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: /schedule the case/i }));
    expect(await screen.findByText(`Case page ${created.id}`)).toBeInTheDocument();
    expect(net.sent).toHaveLength(2);
    const [first, second] = net.sent.map((r) => (r.body as { id?: string }).id);
    expect(first).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(second).toBe(first);
  });

  it('puts the field issues of a refused request on the same fields', async () => {
    const user = renderForm();
    await fillValid(user);
    net.on('POST', '/api/cases', () => json(400, {
      error: 'Invalid request body',
      issues: [
        { path: 'patient.hospitalNumber', message: 'This hospital number belongs to another patient' },
        { path: 'nurseId', message: 'Not a nurse of this unit' },
      ],
    }));
    await user.click(screen.getByRole('button', { name: /schedule the case/i }));

    expect(await screen.findByText('This hospital number belongs to another patient')).toBeInTheDocument();
    expect(errorOf(/hospital number/i)).toBe('This hospital number belongs to another patient');
    expect(errorOf(/assisting nurse/i)).toBe('Not a nurse of this unit');
    expect(screen.getByLabelText(/hospital number/i)).toHaveFocus();
    expect(within(screen.getByRole('form', { name: /schedule a case/i })).queryByText('The case was not scheduled')).toBeNull();
  });

  it('says so when the refusal names no field of the form', async () => {
    const user = renderForm();
    await fillValid(user);
    net.on('POST', '/api/cases', () => json(403, { error: 'Your role may not schedule cases' }));
    await user.click(screen.getByRole('button', { name: /schedule the case/i }));
    expect(await screen.findByText('The case was not scheduled')).toBeInTheDocument();
    expect(screen.getByText('Your role may not schedule cases')).toBeInTheDocument();
  });
});
