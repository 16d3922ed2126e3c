import { z } from 'zod';

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .min(1, 'Enter your e-mail address.')
  .max(254, 'That address is too long.')
  .pipe(z.email('Enter a valid e-mail address, like name@example.com.'));

export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password.').max(200),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const signUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(120, 'At most 120 characters.'),
  email: emailSchema,
  password: passwordSchema,
  workspaceName: z.string().trim().min(2, 'Name your workspace (at least 2 characters).').max(120, 'At most 120 characters.'),
});
export type SignUpInput = z.infer<typeof signUpSchema>;
