import { z } from 'zod';

/** Query of the results and export routes. */
export const resultsQuerySchema = z.object({
  segmentQuestion: z.string().regex(/^[a-z0-9_]{1,32}$/).optional(),
  segmentAnswer: z.string().max(80).optional(),
});

export const plannerInputSchema = z.object({
  /** Target width of each threshold's 95 % interval, in percentage points of the base price. */
  widthPoints: z.coerce.number({ error: 'Enter a width.' }).min(0.1, 'At least 0.1 points.').max(50, 'At most 50 points.'),
});
export type PlannerInput = z.infer<typeof plannerInputSchema>;
