import { useParams, type LoaderFunctionArgs } from 'react-router';
import { RecordPage } from '@/features/record/components/record-page.tsx';
import { recordQueryOptions } from '@/features/record/api/get-record.ts';
import { queryClient } from '@/lib/query-client.ts';
import { requireCan } from '../guard.ts';

/** The record of a case (every role of the unit; each view is audited by the server). */
export async function loader(args: LoaderFunctionArgs) {
  await requireCan(args, 'case.view');
  if (args.params.id) void queryClient.prefetchQuery(recordQueryOptions(args.params.id));
  return null;
}

export function Component() {
  const { id = '' } = useParams();
  return (
    <div className="mx-auto w-full max-w-6xl px-4 py-6 sm:px-6">
      <RecordPage caseId={id} />
    </div>
  );
}
