import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { specimenListSchema, specimenSchema, type CreateSpecimenInput, type UpdateSpecimenInput } from '#shared/schemas/specimens.ts';
import { api } from '@/lib/api.ts';

const base = (caseId: string) => `/api/cases/${encodeURIComponent(caseId)}/specimens`;

/** GET …/specimens — the case's specimen list (the view is audited). */
export const specimensQueryOptions = (caseId: string) => queryOptions({
  queryKey: ['cases', 'specimens', caseId],
  queryFn: ({ signal }) => api(base(caseId), { schema: specimenListSchema, signal }).then((r) => r.specimens),
});

export const useSpecimens = (caseId: string) => useQuery(specimensQueryOptions(caseId));

function useRefresh(caseId: string) {
  const qc = useQueryClient();
  return () => Promise.all([
    qc.invalidateQueries({ queryKey: ['cases', 'specimens', caseId] }),
    qc.invalidateQueries({ queryKey: ['cases', 'record', caseId] }),
  ]);
}

export function useAddSpecimen(caseId: string) {
  const refresh = useRefresh(caseId);
  return useMutation({
    mutationFn: (input: CreateSpecimenInput) => api(base(caseId), { method: 'POST', body: input, schema: specimenSchema }),
    onSuccess: refresh,
  });
}

export function useChangeSpecimen(caseId: string) {
  const refresh = useRefresh(caseId);
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: UpdateSpecimenInput }) =>
      api(`${base(caseId)}/${encodeURIComponent(id)}`, { method: 'PATCH', body: input, schema: specimenSchema }),
    onSuccess: refresh,
  });
}

/** The printable container label (a PDF sized to the label, with a DataMatrix of the specimen id). */
export const labelPdfUrl = (caseId: string, specimenId: string, symbology: 'datamatrix' | 'code128' = 'datamatrix') =>
  `${base(caseId)}/${encodeURIComponent(specimenId)}/label.pdf?symbology=${symbology}`;
