import { z } from 'zod';
import { roleSchema } from './common.ts';

/** GET /api/members?role= — the unit's members, optionally of one role (`role=` empty means all). */
export const listMembersQuerySchema = z.object({
  role: z.preprocess((v) => (v === '' ? undefined : v), roleSchema.optional()),
});
