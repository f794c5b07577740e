import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { roomSchema } from '#shared/schemas/cases.ts';
import { api } from '@/lib/api.ts';

/** GET /api/rooms — the unit's procedure rooms. */
export const getRooms = (signal?: AbortSignal) => api('/api/rooms', { schema: z.array(roomSchema), signal });

export const roomsQueryOptions = () => queryOptions({ queryKey: ['rooms'], queryFn: ({ signal }) => getRooms(signal), staleTime: 10 * 60_000 });

export function useRooms() {
  return useQuery(roomsQueryOptions());
}
