import { z } from 'zod';

/** The server's minimum (server/auth.ts minPasswordLength) and better-auth's default maximum. */
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 128;

export const newPasswordSchema = z
  .object({
    password: z.string().min(PASSWORD_MIN, `At least ${PASSWORD_MIN} characters`).max(PASSWORD_MAX, `At most ${PASSWORD_MAX} characters`),
    confirm: z.string().min(1, 'Type the password again'),
  })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });
export type NewPasswordInput = z.infer<typeof newPasswordSchema>;
