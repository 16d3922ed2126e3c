import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Study } from './study';
import { Respondent } from './respondent';

export const TRIAL_KINDS = ['practice', 'test', 'catch', 'attention'] as const;

/** One answered trial. Rows are written as answers arrive; (respondent, idx) is unique. */
export const Trial = defineEntity({
  name: 'Trial',
  tableName: 'trial',
  uniques: [
    { name: 'trial_respondent_idx_unique', properties: ['respondent', 'idx'] },
    { name: 'trial_respondent_client_unique', properties: ['respondent', 'clientId'] },
  ],
  indexes: [{ name: 'trial_study_cell_index', properties: ['study', 'basePrice', 'discount'] }],
  properties: (p) => ({
    id: p.bigint('number').primary().autoincrement(),
    study: p.manyToOne(Study).deleteRule('cascade'),
    respondent: p.manyToOne(Respondent).deleteRule('cascade'),
    idx: p.integer(),
    kind: p.enum([...TRIAL_KINDS]),
    basePrice: p.double().$type<number>(),
    /** Fraction of the base price; 0 on catch trials. */
    discount: p.double().$type<number>(),
    /** Task-specific facts of the screen: left/right side, shelf position, view time. */
    shown: p.json<Record<string, unknown>>().nullable(),
    /** 1 = noticed / lower one chosen / go; 0 otherwise. */
    answer: p.smallint(),
    responseMs: p.integer(),
    clientId: p.uuid(),
    answeredAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type ITrial = InferEntity<typeof Trial>;
