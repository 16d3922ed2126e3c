import { z } from 'zod';

// A respondent link as the analyst creates and closes it (form, route handler, data layer).

export const respondentLinkSchema = z.object({
  source: z.string().trim().min(1, 'Name the source, e.g. “newsletter” or “store QR”.').max(80, 'At most 80 characters.'),
  /** Completes this link accepts; empty for no quota. */
  quota: z
    .union([z.literal('').transform(() => null), z.null(), z.coerce.number({ error: 'Enter a whole number.' }).int('Enter a whole number.').min(1, 'At least 1.').max(100_000, 'At most 100,000.')])
    .optional()
    .transform((v) => v ?? null),
  acceptsPid: z.boolean().default(false),
  /** The panel signs each id (&sig=): nobody else can use a panelist's id first (respondent/server/panel-ids.ts). */
  signsPid: z.boolean().default(false),
});
export type RespondentLinkInput = z.input<typeof respondentLinkSchema>;

export const respondentLinkPatchSchema = z.object({ closed: z.literal(true, { error: 'Only closing a link is supported: send {"closed": true}.' }) });
