import { useSearchParams } from 'react-router';
import { Banner } from '@/components/ui/banner.tsx';
import { Caution } from '@/components/ui/caution.tsx';
import { Loading } from '@/components/ui/page.tsx';
import { errorMessage } from '@/lib/api.ts';
import { useMembers } from '../api/get-members.ts';
import { useRooms } from '../api/get-rooms.ts';
import { blankSchedule } from './schedule-form/model.ts';
import { ScheduleForm } from './schedule-form/schedule-form.tsx';

/** Loads the rooms and the team to choose from, then shows the form for the day asked (?date=). */
export function ScheduleScreen() {
  const [params] = useSearchParams();
  const rooms = useRooms();
  const endoscopists = useMembers('endoscopist');
  const nurses = useMembers('nurse');
  const error = rooms.error ?? endoscopists.error ?? nurses.error;
  if (error) return <Banner tone="danger" title="The form could not be prepared">{errorMessage(error)}</Banner>;
  if (!rooms.data || !endoscopists.data || !nurses.data) return <Loading label="Preparing the form" />;
  return (
    <div className="flex flex-col gap-6">
      <Caution compact />
      <ScheduleForm defaults={blankSchedule(params.get('date'))} rooms={rooms.data} endoscopists={endoscopists.data} nurses={nurses.data} />
    </div>
  );
}
