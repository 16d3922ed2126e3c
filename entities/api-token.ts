import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { User } from './user';

/** Personal, read-only export token scoped to one workspace; only its hash is stored. */
export const ApiToken = defineEntity({
  name: 'ApiToken',
  tableName: 'api_token',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade').index(),
    user: p.manyToOne(User).deleteRule('cascade'),
    name: p.string().length(80),
    tokenHash: p.string().length(64).unique(),
    /** First characters of the token, shown so the owner can tell tokens apart. */
    prefix: p.string().length(16),
    createdAt: p.datetime().onCreate(() => new Date()),
    lastUsedAt: p.datetime().nullable(),
    revokedAt: p.datetime().nullable(),
  }),
});
export type IApiToken = InferEntity<typeof ApiToken>;
