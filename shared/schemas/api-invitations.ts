import { z } from 'zod';
import { isoDateTimeSchema, roleSchema, uuidSchema } from './common.ts';

/** POST /api/invitations (admin) — invite a person to the admin's unit by e-mail. */
export const createInvitationSchema = z.object({
  email: z.email('Enter an e-mail address').max(254).transform((e) => e.toLowerCase()),
  role: roleSchema,
});
export type CreateInvitationInput = z.infer<typeof createInvitationSchema>;

export const invitationStatuses = ['pending', 'accepted', 'rejected', 'canceled', 'expired'] as const;

/** An invitation as the admin sees it (POST answer, GET /api/invitations). */
export const invitationSchema = z.object({
  id: uuidSchema,
  email: z.string(),
  role: roleSchema,
  status: z.enum(invitationStatuses),
  expiresAt: isoDateTimeSchema,
});
export type Invitation = z.infer<typeof invitationSchema>;

/** GET /api/invitations/:id (public) — what the accept page shows. */
export const invitationPublicSchema = invitationSchema.extend({
  unit: z.object({ id: uuidSchema, name: z.string(), hospital: z.string() }),
});
export type InvitationPublic = z.infer<typeof invitationPublicSchema>;

export const invitationIdParamsSchema = z.object({ id: uuidSchema });

/**
 * POST /api/invitations/:id/accept (public) — the invitee chooses a name and a password; the account is
 * made for the invited e-mail, joins the unit with the invited role, and is signed in (session cookie).
 */
export const acceptInvitationSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name').max(120),
  password: z.string().min(10, 'At least 10 characters').max(128, 'At most 128 characters'),
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationSchema>;
