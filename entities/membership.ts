import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { User } from './user';
import { ROLES } from '../lib/roles';

export const Membership = defineEntity({
  name: 'Membership',
  tableName: 'membership',
  uniques: [{ properties: ['workspace', 'user'] }],
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade'),
    user: p.manyToOne(User).deleteRule('cascade').index(),
    role: p.enum([...ROLES]),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IMembership = InferEntity<typeof Membership>;
