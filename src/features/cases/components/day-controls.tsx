import { caseStatuses, type CaseStatus } from '#shared/schemas/cases.ts';
import { Button } from '@/components/ui/button.tsx';
import { Input, Select } from '@/components/ui/field.tsx';
import { todayIso, useDayFilters } from '../hooks/use-day-filters.ts';
import { statusLabels } from './status-badge.tsx';

/** The day picker (previous, a date, next, back to today) and the state filter. */
export function DayControls() {
  const { date, status, isToday, setDate, setStatus, shift } = useDayFilters();
  return (
    <div className="flex flex-wrap items-end gap-3" role="group" aria-label="Choose the day">
      <Button onClick={() => shift(-1)} aria-label="Previous day">‹ Day before</Button>
      <label className="flex flex-col gap-1">
        <span className="text-sm font-bold">Day</span>
        <Input type="date" value={date} onChange={(e) => e.target.value && setDate(e.target.value)} className="w-auto" />
      </label>
      <Button onClick={() => shift(1)} aria-label="Next day">Day after ›</Button>
      <Button variant="quiet" disabled={isToday} onClick={() => setDate(todayIso())}>Today</Button>
      <label className="flex flex-col gap-1 sm:ml-auto">
        <span className="text-sm font-bold">Showing</span>
        <Select value={status ?? ''} onChange={(e) => setStatus((e.target.value || undefined) as CaseStatus | undefined)} className="w-auto">
          <option value="">All states</option>
          {caseStatuses.map((s) => <option key={s} value={s}>{statusLabels[s]}</option>)}
        </Select>
      </label>
    </div>
  );
}
