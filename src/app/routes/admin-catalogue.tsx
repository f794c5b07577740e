import type { LoaderFunctionArgs } from 'react-router';
import { can } from '#shared/domain/permissions.ts';
import { CatalogueScreen } from '@/features/catalogue/components/catalogue-screen.tsx';
import { useMe } from '@/lib/session.ts';
import { requireCan } from '../guard.ts';

/** The device catalogue: every role of the unit reads it; the administrator changes it. */
export const loader = (args: LoaderFunctionArgs) => requireCan(args, 'case.view');

export function Component() {
  const me = useMe();
  return <CatalogueScreen canManage={can(me.role, 'unit.manageCatalogue')} />;
}
