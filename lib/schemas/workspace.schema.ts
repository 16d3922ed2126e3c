import { z } from 'zod';

export const workspaceSettingsSchema = z.object({
  name: z.string().trim().min(2, 'At least 2 characters.').max(120, 'At most 120 characters.'),
  retentionDays: z.coerce.number().int('Whole days.').min(30, 'At least 30 days.').max(3650, 'At most 10 years (3650 days).'),
});
export type WorkspaceSettingsInput = z.infer<typeof workspaceSettingsSchema>;
