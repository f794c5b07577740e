import { Link } from 'react-router';
import type { CaseSummary, Room } from '#shared/schemas/cases.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { buttonClass } from '@/components/ui/button.tsx';
import { Loading } from '@/components/ui/page.tsx';
import { errorMessage } from '@/lib/api.ts';
import { useCases } from '../api/get-cases.ts';
import { useRooms } from '../api/get-rooms.ts';
import { useDayFilters } from '../hooks/use-day-filters.ts';
import { CaseCard } from './case-card.tsx';
import { DayControls } from './day-controls.tsx';
import { dayTitle } from './format.ts';

type Group = { room: Room; cases: CaseSummary[] };

/** Every room of the unit, each with its cases in time order; a room with none still shows. */
export function groupByRoom(rooms: Room[], cases: CaseSummary[]): Group[] {
  const groups = new Map<string, Group>(rooms.map((room) => [room.id, { room, cases: [] }]));
  for (const c of cases) {
    const g = groups.get(c.room.id) ?? { room: c.room, cases: [] };
    g.cases.push(c);
    groups.set(c.room.id, g);
  }
  for (const g of groups.values()) g.cases.sort((a, b) => a.scheduledAt.localeCompare(b.scheduledAt));
  return [...groups.values()].sort((a, b) => a.room.name.localeCompare(b.room.name, 'en-GB', { numeric: true }));
}

export function DayView({ canSchedule }: { canSchedule: boolean }) {
  const { date, status, isToday } = useDayFilters();
  const cases = useCases({ date, status });
  const rooms = useRooms();

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-center justify-between gap-4">
        <h1 className="text-3xl font-bold">
          {isToday ? 'Today' : 'Cases'} <span className="block text-xl font-normal text-muted sm:inline">{dayTitle(date)}</span>
        </h1>
        {canSchedule && (
          <Link to={`/cases/new?date=${date}`} className={buttonClass('primary', 'lg')}>+ Schedule a case</Link>
        )}
      </div>
      <DayControls />
      {(cases.isPending || rooms.isPending) && <Loading label="Loading the day" />}
      {(cases.error || rooms.error) && (
        <Banner tone="danger" title="The day's cases could not be loaded">{errorMessage(cases.error ?? rooms.error)}</Banner>
      )}
      {cases.data && rooms.data && (
        <div className="grid gap-5 md:grid-cols-2 lg:grid-cols-3">
          {groupByRoom(rooms.data, cases.data).map(({ room, cases: list }) => (
            <section key={room.id} aria-labelledby={`room-${room.id}`} className="flex flex-col gap-3 rounded-card bg-sunken p-3">
              <h2 id={`room-${room.id}`} className="flex items-baseline justify-between px-1 text-xl font-bold">
                {room.name}
                <span className="text-base font-normal text-muted">{list.length === 1 ? '1 case' : `${list.length} cases`}</span>
              </h2>
              {list.length === 0 ? (
                <p className="rounded-card border-2 border-dashed border-line px-4 py-6 text-center text-muted">Nothing booked</p>
              ) : (
                <ul className="flex flex-col gap-3">{list.map((c) => <CaseCard key={c.id} c={c} />)}</ul>
              )}
            </section>
          ))}
        </div>
      )}
    </div>
  );
}
