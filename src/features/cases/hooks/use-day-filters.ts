import { addDays, format, isValid, parseISO } from 'date-fns';
import { useSearchParams } from 'react-router';
import { caseStatusSchema, type CaseStatus } from '#shared/schemas/cases.ts';

export const todayIso = () => format(new Date(), 'yyyy-MM-dd');

/** The day and state shown on the case list, kept in the address (?date=&status=) so a reload keeps them. */
export function useDayFilters() {
  const [params, setParams] = useSearchParams();
  const raw = params.get('date');
  const date = raw && /^\d{4}-\d{2}-\d{2}$/.test(raw) && isValid(parseISO(raw)) ? raw : todayIso();
  const parsedStatus = caseStatusSchema.safeParse(params.get('status'));
  const status: CaseStatus | undefined = parsedStatus.success ? parsedStatus.data : undefined;

  const update = (next: { date?: string; status?: CaseStatus | undefined }) => {
    const p = new URLSearchParams(params);
    if (next.date !== undefined) (next.date === todayIso() ? p.delete('date') : p.set('date', next.date));
    if ('status' in next) (next.status ? p.set('status', next.status) : p.delete('status'));
    setParams(p, { replace: true });
  };
  const shift = (days: number) => update({ date: format(addDays(parseISO(date), days), 'yyyy-MM-dd') });
  return { date, status, isToday: date === todayIso(), setDate: (d: string) => update({ date: d }), setStatus: (s?: CaseStatus) => update({ status: s }), shift };
}
