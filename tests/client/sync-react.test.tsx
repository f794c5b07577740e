import { cleanup, render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { SyncProvider, useCaseEvents, useRecordTap, useSyncStatus } from '@/sync/react.ts';
import { newCaseId, newDbName, startTablet, stopTablets } from './sync-helpers.ts';
import { startTestSyncServer, type TestSyncServer } from './sync-test-server.ts';

let server: TestSyncServer;
afterEach(async () => {
  cleanup();
  await stopTablets();
  await server?.close();
});

function Board({ caseId }: { caseId: string }) {
  const snap = useCaseEvents(caseId);
  const status = useSyncStatus();
  const recordTap = useRecordTap();
  return (
    <div>
      <button type="button" onClick={() => void recordTap({ caseId, kind: 'clip_fired', payload: { outcome: 'deployed' } })}>Clip</button>
      <p data-testid="status">{status.state}</p>
      <ul>{snap.items.map((i) => <li key={i.id}>{i.event.kind}:{i.state}</li>)}</ul>
    </div>
  );
}

describe('the React bridge of the sync engine', () => {
  it('shows a tap at once and then as accepted by the server', async () => {
    server = await startTestSyncServer();
    const caseId = newCaseId();
    const engine = startTablet(server.url, { dbName: newDbName() });
    await engine.ready;
    render(<SyncProvider engine={engine}><Board caseId={caseId} /></SyncProvider>);
    await waitFor(() => expect(screen.getByTestId('status')).toHaveTextContent('online'));

    await userEvent.click(screen.getByRole('button', { name: 'Clip' }));
    expect(screen.getByRole('listitem')).toHaveTextContent(/^clip_fired:(saving|queued|sent|accepted)$/);
    await waitFor(() => expect(screen.getByRole('listitem')).toHaveTextContent('clip_fired:accepted'));
    expect(server.log(caseId)).toHaveLength(1);
  });

  it('says clearly when a screen uses the hooks without a provider', () => {
    expect(() => render(<Board caseId={newCaseId()} />)).toThrow(/SyncProvider/);
  });
});
