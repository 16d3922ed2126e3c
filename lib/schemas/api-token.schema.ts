import { z } from 'zod';

export const apiTokenCreateSchema = z.object({
  name: z.string().trim().min(2, 'Name the token (at least 2 characters), e.g. "pricing notebook".').max(80, 'At most 80 characters.'),
});
export type ApiTokenCreate = z.infer<typeof apiTokenCreateSchema>;
