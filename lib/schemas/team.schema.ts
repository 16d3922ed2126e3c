import { z } from 'zod';
import { ROLES } from '@/lib/roles';
import { emailSchema, passwordSchema } from './auth.schema';

const roleSchema = z.enum(ROLES, 'Choose a role: owner, analyst or viewer.');

export const inviteSchema = z.object({ email: emailSchema, role: roleSchema });
export type InviteInput = z.infer<typeof inviteSchema>;

export const changeRoleSchema = z.object({ role: roleSchema });
export type ChangeRoleInput = z.infer<typeof changeRoleSchema>;

/** Signing up through an invitation: the e-mail address is the invited one, fixed. */
export const inviteSignUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'At most 120 characters.'),
  password: passwordSchema,
});
export type InviteSignUpInput = z.infer<typeof inviteSignUpSchema>;

export const resetRequestSchema = z.object({ email: emailSchema });
export type ResetRequestInput = z.infer<typeof resetRequestSchema>;

export const newPasswordSchema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ.' });
export type NewPasswordInput = z.infer<typeof newPasswordSchema>;
