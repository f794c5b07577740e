import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import { MemoryRouter, useLocation } from 'react-router';
import { CaptureScreen } from '@/features/capture/components/capture-screen.tsx';
import type { ItemControl } from '@/features/capture/components/detail-fields.tsx';
import { ToastProvider } from '@/components/ui/toast.tsx';
import { SyncProvider } from '@/sync/react.ts';
import type { SyncEngine } from '@/sync/index.ts';
import { buildCase } from './shell-factories.ts';

/** Where the router is now, for a test to read (`data-testid="location"`). */
function LocationProbe() {
  const { pathname, search } = useLocation();
  return <output data-testid="location" hidden>{pathname + search}</output>;
}

/**
 * The capture screen of `caseId` on one "tablet" (a real sync engine over fake IndexedDB), with the
 * route's item control when one is given.
 */
export function renderCapture(engine: SyncEngine, caseId: string, ItemInput?: ItemControl) {
  const summary = buildCase({ id: caseId, status: 'recording' });
  // The unit's member list is answered from here: the test has no HTTP server.
  const queries = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  queries.setQueryData(['members', 'all'], [
    { userId: summary.nurse.id, name: summary.nurse.name, email: 'sofia.marin@kestrelbay.example', role: 'nurse' },
    { userId: summary.endoscopist.id, name: summary.endoscopist.name, email: 'amara.osei@kestrelbay.example', role: 'endoscopist' },
  ]);
  return render(
    <QueryClientProvider client={queries}>
      <MemoryRouter initialEntries={[`/cases/${caseId}/capture`]}>
        <ToastProvider>
          <SyncProvider engine={engine}>
            <CaptureScreen caseId={caseId} summary={summary} ItemInput={ItemInput} />
          </SyncProvider>
          <LocationProbe />
        </ToastProvider>
      </MemoryRouter>
    </QueryClientProvider>,
  );
}
