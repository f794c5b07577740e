import { queryOptions, useQuery } from '@tanstack/react-query';
import { caseSummarySchema } from '#shared/schemas/cases.ts';
import { api } from '@/lib/api.ts';

/**
 * GET /api/cases/:id — who and what the case is, for the capture screen's header. The same key as the
 * case page's query, so opening the recorder from the case page shows the header at once; offline, the
 * service worker answers with the last copy.
 */
export const captureCaseQueryOptions = (id: string) =>
  queryOptions({
    queryKey: ['cases', 'detail', id],
    queryFn: ({ signal }) => api(`/api/cases/${encodeURIComponent(id)}`, { schema: caseSummarySchema, signal }),
    staleTime: 60_000,
  });

export function useCaptureCase(id: string) {
  return useQuery(captureCaseQueryOptions(id));
}
