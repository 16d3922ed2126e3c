import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Workspace } from './workspace';
import { Study } from './study';
import { RespondentLink } from './respondent-link';

export const RESPONDENT_STATES = ['started', 'completed', 'imported'] as const;

export const Respondent = defineEntity({
  name: 'Respondent',
  tableName: 'respondent',
  indexes: [
    { properties: ['study', 'state'] },
    // The seat decision's reads (respondent/server/admission.ts): respondents still holding a seat.
    { name: 'respondent_holding_index', expression: `create index "respondent_holding_index" on "respondent" ("workspace_id", "last_seen_at") where "state" = 'started'` },
    { name: 'respondent_link_holding_index', expression: `create index "respondent_link_holding_index" on "respondent" ("link_id", "last_seen_at") where "state" = 'started'` },
    { name: 'respondent_workspace_reference_unique', expression: `create unique index "respondent_workspace_reference_unique" on "respondent" ("workspace_id", "reference_code") where "reference_code" is not null` },
  ],
  uniques: [{ name: 'respondent_study_pid_unique', properties: ['study', 'pid'] }],
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade').index(),
    study: p.manyToOne(Study).deleteRule('cascade'),
    link: p.manyToOne(RespondentLink).nullable().deleteRule('set null').index(),
    /** Panel id from ?pid= (duplicate protection only); null for anonymous respondents. */
    pid: p.string().length(120).nullable(),
    /** Random token kept in the respondent's cookie or URL to resume. */
    resumeToken: p.string().length(64).unique(),
    /** Label an imported respondent had in the uploaded file. */
    externalRef: p.string().length(120).nullable(),
    /** The code shown on the thank-you screen, by which an analyst deletes this respondent on request. */
    referenceCode: p.string().length(16).nullable(),
    seed: p.integer(),
    state: p.enum([...RESPONDENT_STATES]).default('started'),
    segmentAnswers: p.json<Record<string, string>>().default('{}'),
    attentionPassed: p.boolean().nullable(),
    /** The trial plan generated at start (or staircase state), see lib/server/trials.ts. */
    plan: p.json<Record<string, unknown>>().nullable(),
    answeredCount: p.integer().default(0),
    startedAt: p.datetime().onCreate(() => new Date()),
    lastSeenAt: p.datetime().onCreate(() => new Date()),
    completedAt: p.datetime().nullable(),
  }),
});
export type IRespondent = InferEntity<typeof Respondent>;
