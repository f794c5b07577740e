import { useMemo } from 'react';
import { useParams, type LoaderFunctionArgs } from 'react-router';
import { caseQueryOptions, useCase } from '@/features/cases/api/get-case.ts';
import { CaptureScreen } from '@/features/capture/components/capture-screen.tsx';
import { tabletEngine } from '@/features/capture/sync-engine.ts';
import { useCatalogue } from '@/features/catalogue/api/catalogue.ts';
import { captureItemControl, itemName } from '@/features/devices/components/item-control.tsx';
import { queryClient } from '@/lib/query-client.ts';
import { useMe } from '@/lib/session.ts';
import { SyncProvider } from '@/sync/react.ts';
import { requireCan } from '../guard.ts';
import type { RouteHandle } from '../theme-scope.ts';

/**
 * The recorder, full screen (outside the app's header: in the room every row of the screen is for the
 * pad). Signed-in only, for roles that record; opens in the dim-room theme.
 */
export const handle: RouteHandle = { themeScope: 'capture' };

export async function loader(args: LoaderFunctionArgs) {
  await requireCan(args, 'event.record');
  if (args.params.id) void queryClient.prefetchQuery(caseQueryOptions(args.params.id.toLowerCase()));
  return null;
}

export function Component() {
  // In lower case, as the server keeps ids: the tablet matches the events it hears by the case id.
  const id = (useParams().id ?? '').toLowerCase();
  const me = useMe();
  const summary = useCase(id).data ?? null;
  // The devices feature's scan field as the sheet's item control, one component identity per case.
  const ItemInput = useMemo(() => captureItemControl(id), [id]);
  const catalogue = useCatalogue().data;
  const itemLabel = useMemo(() => (itemId: string) => itemName(catalogue?.find((c) => c.id === itemId), itemId), [catalogue]);
  return (
    <SyncProvider engine={tabletEngine(me.user.id)}>
      <CaptureScreen key={id} caseId={id} summary={summary} ItemInput={ItemInput} itemLabel={itemLabel} />
    </SyncProvider>
  );
}
