import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';

/** An uploaded item picture, stored in PostgreSQL. */
export const StudyAsset = defineEntity({
  name: 'StudyAsset',
  tableName: 'study_asset',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade').index(),
    contentType: p.string().length(64),
    byteSize: p.integer(),
    bytes: p.blob().lazy(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IStudyAsset = InferEntity<typeof StudyAsset>;
