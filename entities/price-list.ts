import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { User } from './user';

export const PriceList = defineEntity({
  name: 'PriceList',
  tableName: 'price_list',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade').index(),
    name: p.string().length(160),
    currency: p.string().length(3),
    itemCount: p.integer(),
    createdBy: p.manyToOne(User).nullable().deleteRule('set null'),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IPriceList = InferEntity<typeof PriceList>;
