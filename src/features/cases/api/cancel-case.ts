import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CancelCaseInput } from '#shared/schemas/api-cases.ts';
import { api } from '@/lib/api.ts';

/** POST /api/cases/:id/cancel — only a case not yet started; the reason is kept with it. */
export const cancelCase = ({ id, ...input }: CancelCaseInput & { id: string }) =>
  api(`/api/cases/${encodeURIComponent(id)}/cancel`, { method: 'POST', body: input });

export function useCancelCase() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: cancelCase, onSuccess: () => qc.invalidateQueries({ queryKey: ['cases'] }) });
}
