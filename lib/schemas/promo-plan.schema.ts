import { z } from 'zod';
import { PRICE_ENDINGS } from './study.schema';
import { FLOOR_BASES, type FloorBasis } from '@/lib/promo/floor-basis';

// The promotion plan form and the route handler that creates plans parse this same schema.

export const PLAN_MODEL_CHOICES = ['preferred', 'free', 'weber', 'power'] as const;
export type PlanModelChoice = (typeof PLAN_MODEL_CHOICES)[number];

/** Offered in the form; the API takes any rate strictly between 0 and 1, or the mid-point. */
export const TARGET_CHOICES = ['mid-point', '0.5', '0.6', '0.7', '0.75', '0.8', '0.9'] as const;
export const TARGET_CHOICE_LABELS: Record<(typeof TARGET_CHOICES)[number], string> = {
  'mid-point': 'Mid-point of the curve (the study’s notice threshold)',
  '0.5': '50 % notice the saving',
  '0.6': '60 %',
  '0.7': '70 %',
  '0.75': '75 %',
  '0.8': '80 %',
  '0.9': '90 %',
};

const targetSchema = z.union([
  z.literal('mid-point'),
  z.coerce
    .number({ error: 'Choose a notice rate.' })
    .gt(0, 'The notice rate must be above 0 %.')
    .lt(1, 'The notice rate must be below 100 %.'),
], { error: 'Choose a notice rate or the mid-point.' });

export const promoPlanCreateSchema = z.object({
  name: z.string().trim().min(2, 'Name the plan (at least 2 characters).').max(160, 'At most 160 characters.'),
  priceListId: z.uuid('Choose a price list.'),
  studyId: z.uuid('Choose a fitted study.'),
  /** Further studies to fit together with studyId (a pooled fit; lib/server/analysis/pooled-fit.ts); empty = the study's own fit. */
  pooledStudyIds: z.array(z.uuid('Choose studies from the list.')).max(5, 'Pool at most 6 studies.').default([]),
  segment: z
    .object({ questionId: z.string().min(1).max(32), answer: z.string().min(1).max(80) })
    .nullable()
    .default(null),
  model: z.enum(PLAN_MODEL_CHOICES).default('preferred'),
  target: targetSchema.default('mid-point'),
  ending: z.enum(PRICE_ENDINGS, { error: 'Choose a price ending.' }),
  /** Where the floor sits: the point estimate, the cautious end of the 95 % interval, or the discount a share of shoppers notices. */
  basis: z.enum(FLOOR_BASES, { error: 'Choose where the floor sits.' }).default('point'),
  /** For basis 'share': the share of shoppers who should notice (one the study's mixed model reports, e.g. 0.75). */
  share: z.coerce.number({ error: 'Choose a share of shoppers.' }).gt(0, 'Above 0 %.').lt(1, 'Below 100 %.').nullable().default(null),
  /** Percentage points the ending may deepen the discount beyond the floor; beyond that the exact floor price is kept. */
  tolerancePoints: z.coerce.number({ error: 'Enter percentage points.' }).min(0, 'At least 0 points.').max(50, 'At most 50 points.').default(2),
}).refine((v) => v.basis !== 'share' || v.share !== null, { message: 'Choose the share of shoppers who should notice.', path: ['share'] });
export type PromoPlanCreateInput = z.input<typeof promoPlanCreateSchema>;
export type PromoPlanCreate = z.output<typeof promoPlanCreateSchema>;

/** What a stored plan's settings hold (PromoPlan.settings). */
export interface PromoPlanSettings {
  model: 'free' | 'weber' | 'power';
  modelChoice: PlanModelChoice;
  /** null = the curve's mid-point. */
  target: number | null;
  ending: (typeof PRICE_ENDINGS)[number];
  segment: { questionId: string; answer: string } | null;
  /** Absent in plans made before it existed: read as 'point'. */
  basis?: FloorBasis;
  share?: number | null;
  /** Fraction (0.02 = 2 points); absent or null in older plans: no limit, as they were made. */
  tolerance?: number | null;
}
