import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { Study } from './study';

export const RespondentLink = defineEntity({
  name: 'RespondentLink',
  tableName: 'respondent_link',
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade'),
    study: p.manyToOne(Study).deleteRule('cascade').index(),
    /** Random, at least 128 bits, URL-safe. */
    token: p.string().length(64).unique(),
    source: p.string().length(80),
    quota: p.integer().nullable(),
    /** Accept a panel's respondent id as ?pid= (kept only to prevent duplicates). */
    acceptsPid: p.boolean().default(false),
    /** When set, a panel id must come signed with it (?pid=…&sig=…, see respondent/server/panel-ids.ts). */
    pidSecret: p.string().length(64).nullable(),
    closedAt: p.datetime().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
  }),
});
export type IRespondentLink = InferEntity<typeof RespondentLink>;
