import { useMutation, useQueryClient } from '@tanstack/react-query';
import { caseSummarySchema, type ScheduleCaseInput } from '#shared/schemas/cases.ts';
import { api } from '@/lib/api.ts';

/** POST /api/cases — schedule a case; the body is checked by the same scheduleCaseSchema on the server. */
export const scheduleCase = (input: ScheduleCaseInput) => api('/api/cases', { method: 'POST', body: input, schema: caseSummarySchema });

export function useScheduleCase() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: scheduleCase,
    onSuccess: () => qc.invalidateQueries({ queryKey: ['cases', 'list'] }),
  });
}
