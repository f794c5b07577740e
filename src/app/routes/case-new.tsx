import type { LoaderFunctionArgs } from 'react-router';
import { Page } from '@/components/ui/page.tsx';
import { ScheduleScreen } from '@/features/cases/components/schedule-screen.tsx';
import { requireCan } from '../guard.ts';

export const loader = (args: LoaderFunctionArgs) => requireCan(args, 'case.schedule');

export function Component() {
  return (
    <Page title="Schedule a case" wide>
      <ScheduleScreen />
    </Page>
  );
}
