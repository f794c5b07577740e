import { queryOptions, useQuery } from '@tanstack/react-query';
import { caseDetailSchema } from '#shared/schemas/api-cases.ts';
import { api } from '@/lib/api.ts';

/** GET /api/cases/:id — one case with its lifecycle (the server writes the view to the audit log). */
export const getCase = (id: string, signal?: AbortSignal) => api(`/api/cases/${encodeURIComponent(id)}`, { schema: caseDetailSchema, signal });

export const caseQueryOptions = (id: string) => queryOptions({ queryKey: ['cases', 'detail', id], queryFn: ({ signal }) => getCase(id, signal) });

export function useCase(id: string) {
  return useQuery(caseQueryOptions(id));
}
