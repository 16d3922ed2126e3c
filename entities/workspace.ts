import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';

export const Workspace = defineEntity({
  name: 'Workspace',
  tableName: 'workspace',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    slug: p.string().length(64).unique(),
    name: p.string().length(120),
    /** Days a study's responses are kept after it closes (stated on the consent screen). */
    retentionDays: p.integer().default(365),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IWorkspace = InferEntity<typeof Workspace>;
