import { z } from 'zod';
import { roleSchema, uuidSchema } from './common.ts';

/** GET /api/me — who is signed in, their unit and their role there. 401 when not signed in. */
export const meSchema = z.object({
  user: z.object({ id: z.string(), name: z.string(), email: z.string() }),
  unit: z.object({ id: uuidSchema, name: z.string(), hospital: z.string() }),
  role: roleSchema,
});
export type Me = z.infer<typeof meSchema>;
