import { z } from 'zod';

// Deleting one respondent on request, by the reference code their thank-you screen showed
// (form, route handler; lib/server/studies/retention.ts normalises and looks it up).
export const respondentDeletionSchema = z.object({
  code: z.string().trim().min(1, 'Enter the reference code the respondent quoted.').max(40, 'At most 40 characters.'),
});
export type RespondentDeletionInput = z.input<typeof respondentDeletionSchema>;
