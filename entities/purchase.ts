import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { User } from './user';

export const Purchase = defineEntity({
  name: 'Purchase',
  tableName: 'purchase',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade').index(),
    buyer: p.manyToOne(User).nullable().deleteRule('set null'),
    bundle: p.string().length(40),
    seats: p.integer(),
    amountCents: p.integer(),
    currency: p.string().length(3),
    checkoutSessionId: p.string().length(255).unique(),
    status: p.enum(['pending', 'paid', 'canceled']).default('pending'),
    createdAt: p.datetime().onCreate(() => new Date()),
    paidAt: p.datetime().nullable(),
  }),
});
export type IPurchase = InferEntity<typeof Purchase>;
