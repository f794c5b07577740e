import type { LoaderFunctionArgs } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { InviteForm } from '@/features/admin/components/invite-form.tsx';
import { requireCan } from '../guard.ts';

export const loader = (args: LoaderFunctionArgs) => requireCan(args, 'unit.manageUsers');

export function Component() {
  return (
    <Page title="Invite a colleague">
      <p className="mb-6 text-muted">They get an e-mail with a link to choose their password and join the unit.</p>
      <InviteForm />
    </Page>
  );
}
