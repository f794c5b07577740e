import { Link, useParams, type LoaderFunctionArgs } from 'react-router';
import { can } from '#shared/domain/permissions.ts';
import { caseQueryOptions } from '@/features/cases/api/get-case.ts';
import { CaseOverview } from '@/features/cases/components/case-overview.tsx';
import { buttonClass } from '@/components/ui/button.tsx';
import { queryClient } from '@/lib/query-client.ts';
import { useMe } from '@/lib/session.ts';

// Starts the request while the screen's code loads; the screen shows its own loading and error states.
export const loader = ({ params }: LoaderFunctionArgs) => {
  if (params.id) void queryClient.prefetchQuery(caseQueryOptions(params.id));
  return null;
};

export function Component() {
  const { id = '' } = useParams();
  const me = useMe();
  return (
    <div className="mx-auto w-full max-w-5xl px-4 py-6 sm:px-6">
      <CaseOverview caseId={id} canRecord={can(me.role, 'event.record')} />
      <nav aria-label="The case's record" className="mt-5 flex flex-wrap gap-3">
        <Link to={`/cases/${id}/record`} className={buttonClass('secondary', 'lg')}>The record</Link>
        <Link to={`/cases/${id}/specimens`} className={buttonClass('secondary', 'lg')}>Specimens</Link>
      </nav>
    </div>
  );
}
