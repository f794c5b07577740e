import { queryOptions, useQuery } from '@tanstack/react-query';
import { recordViewSchema } from '#shared/schemas/record.ts';
import { api } from '@/lib/api.ts';

/** GET /api/cases/:id/record — the record the server builds with buildRecord (each view is audited). */
export const getRecord = (caseId: string, signal?: AbortSignal) =>
  api(`/api/cases/${encodeURIComponent(caseId)}/record`, { schema: recordViewSchema, signal });

export const recordQueryOptions = (caseId: string) => queryOptions({
  queryKey: ['cases', 'record', caseId],
  queryFn: ({ signal }) => getRecord(caseId, signal),
});

export function useRecord(caseId: string) {
  return useQuery(recordQueryOptions(caseId));
}

/** The PDF of the same record (opened in the browser's own viewer). */
export const recordPdfUrl = (caseId: string) => `/api/cases/${encodeURIComponent(caseId)}/record.pdf`;
