import { z } from 'zod';

/** Query of the results and export routes. */
export const resultsQuerySchema = z.object({
  segmentQuestion: z.string().regex(/^[a-z0-9_]{1,32}$/).optional(),
  segmentAnswer: z.string().max(80).optional(),
});

/**
 * The interval widths the planner computes, in percentage points. A fixed set, so one
 * workspace cannot queue a simulation per typed value (each width is a job on the shared
 * queue); every width a plan needs is within a step of one of these.
 */
export const PLANNER_WIDTHS = [0.5, 1, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10, 15, 20, 30, 50] as const;

export const plannerInputSchema = z.object({
  /** Target width of each threshold's 95 % interval, in percentage points of the base price. */
  widthPoints: z.coerce
    .number({ error: 'Enter a width.' })
    .refine((w) => (PLANNER_WIDTHS as readonly number[]).includes(w), `Choose one of ${PLANNER_WIDTHS.join(', ')} points.`),
});
export type PlannerInput = z.infer<typeof plannerInputSchema>;
