import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { caseSummarySchema, type CaseStatus } from '#shared/schemas/cases.ts';
import { api } from '@/lib/api.ts';

export type CaseFilters = { date: string; roomId?: string; status?: CaseStatus };

/** GET /api/cases?date&roomId&status — one day's cases in the unit. */
export const getCases = (filters: CaseFilters, signal?: AbortSignal) =>
  api('/api/cases', { query: filters, schema: z.array(caseSummarySchema), signal });

export const casesQueryOptions = (filters: CaseFilters) =>
  queryOptions({ queryKey: ['cases', 'list', filters], queryFn: ({ signal }) => getCases(filters, signal) });

export function useCases(filters: CaseFilters) {
  return useQuery(casesQueryOptions(filters));
}
