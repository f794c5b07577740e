import { can } from '#shared/domain/permissions.ts';
import { Caution } from '@/components/ui/caution.tsx';
import { DayView } from '@/features/cases/components/day-view.tsx';
import { useMe } from '@/lib/session.ts';

export function Component() {
  const me = useMe();
  return (
    <div className="mx-auto flex w-full max-w-6xl flex-col gap-6 px-4 py-6 sm:px-6">
      <DayView canSchedule={can(me.role, 'case.schedule')} />
      <Caution compact />
    </div>
  );
}
