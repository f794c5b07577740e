import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  catalogueItemSchema, catalogueListSchema, type CatalogueItem, type CreateCatalogueItemInput,
} from '#shared/schemas/catalogue.ts';
import { api } from '@/lib/api.ts';

/** GET /api/catalogue — the unit's items (readable by every role; the service worker keeps the last answer for offline scans). */
export const getCatalogue = (includeInactive: boolean, signal?: AbortSignal) =>
  api('/api/catalogue', { query: { includeInactive: includeInactive || undefined }, schema: catalogueListSchema, signal }).then((r) => r.items);

export const catalogueQueryOptions = (includeInactive = false) => queryOptions({
  queryKey: ['catalogue', { includeInactive }],
  queryFn: ({ signal }) => getCatalogue(includeInactive, signal),
  staleTime: 5 * 60_000,
});

export function useCatalogue(includeInactive = false) {
  return useQuery(catalogueQueryOptions(includeInactive));
}

const invalidate = (qc: ReturnType<typeof useQueryClient>) => qc.invalidateQueries({ queryKey: ['catalogue'] });

/** POST /api/catalogue (admin). */
export function useCreateItem() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateCatalogueItemInput) => api('/api/catalogue', { method: 'POST', body: input, schema: catalogueItemSchema }),
    onSuccess: () => invalidate(qc),
  });
}

/** PUT /api/catalogue/:id (admin): the edit form sends every field. */
export function useReplaceItem() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: CreateCatalogueItemInput }) =>
      api(`/api/catalogue/${encodeURIComponent(id)}`, { method: 'PUT', body: input, schema: catalogueItemSchema }),
    onSuccess: () => invalidate(qc),
  });
}

/** PATCH /api/catalogue/:id {active} (admin): take out of use, or back. */
export function useSetItemActive() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, active }: { id: string; active: boolean }) =>
      api(`/api/catalogue/${encodeURIComponent(id)}`, { method: 'PATCH', body: { active }, schema: catalogueItemSchema }),
    onSuccess: () => invalidate(qc),
  });
}

export type { CatalogueItem };
