import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { User } from './user';
import { PriceList } from './price-list';
import { Study } from './study';

/** A promotion plan: the settings and the fit it was built from, enough to reproduce it. */
export const PromoPlan = defineEntity({
  name: 'PromoPlan',
  tableName: 'promo_plan',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade').index(),
    priceList: p.manyToOne(PriceList).deleteRule('cascade'),
    study: p.manyToOne(Study).deleteRule('cascade'),
    name: p.string().length(160),
    /** model, target notice rate, price ending, segment. */
    settings: p.json<Record<string, unknown>>(),
    /** Study data version and exclusion rules of the fit used. */
    fitVersion: p.integer(),
    exclusionRules: p.json<Record<string, unknown>>().nullable(),
    /** The fitted parameters the floors come from. */
    fit: p.json<Record<string, unknown>>(),
    poorFit: p.boolean().default(false),
    createdBy: p.manyToOne(User).nullable().deleteRule('set null'),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IPromoPlan = InferEntity<typeof PromoPlan>;
