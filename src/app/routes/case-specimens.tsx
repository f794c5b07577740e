import { Link, useParams, type LoaderFunctionArgs } from 'react-router';
import { can } from '#shared/domain/permissions.ts';
import { buttonClass } from '@/components/ui/button.tsx';
import { Page } from '@/components/ui/page.tsx';
import { SpecimenList } from '@/features/specimens/components/specimen-list.tsx';
import { specimensQueryOptions } from '@/features/specimens/api/specimens.ts';
import { useRecord } from '@/features/record/api/get-record.ts';
import { queryClient } from '@/lib/query-client.ts';
import { useMe } from '@/lib/session.ts';
import { requireCan } from '../guard.ts';

export async function loader(args: LoaderFunctionArgs) {
  await requireCan(args, 'case.view');
  if (args.params.id) void queryClient.prefetchQuery(specimensQueryOptions(args.params.id));
  return null;
}

/** The specimen list of a case; written by nurses and endoscopists while the record is open. */
export function Component() {
  const { id = '' } = useParams();
  const me = useMe();
  const record = useRecord(id).data;
  const open = record ? record.case.status === 'scheduled' || record.case.status === 'recording' : false;
  const patient = record ? `${record.patient.familyName.toUpperCase()}, ${record.patient.givenName} · ${record.patient.hospitalNumber}` : null;
  return (
    <Page title="Specimens" wide actions={<Link to={`/cases/${id}/record`} className={buttonClass('secondary', 'md')}>The record</Link>}>
      {patient && <p className="mb-4 text-lg font-bold" data-testid="specimens-patient">{patient}</p>}
      {record && !open && <p role="status" className="mb-4 rounded-control border-2 border-line-strong bg-sunken p-3 font-bold">The record is {record.case.status}: the list can be read and labels printed, not changed.</p>}
      <SpecimenList caseId={id} canWrite={open && can(me.role, 'event.record')} tapped={record?.specimens.filter((s) => s.id === null)} timeZone={record?.timeZone} />
    </Page>
  );
}
