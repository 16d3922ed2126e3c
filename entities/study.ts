import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import type { StudyDesign } from '../lib/schemas/study.schema';
import { STUDY_STATES } from '../lib/study-states';
import { Workspace } from './workspace';
import { User } from './user';

export const Study = defineEntity({
  name: 'Study',
  tableName: 'study',
  indexes: [{ properties: ['workspace', 'state'] }],
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    workspace: p.manyToOne(Workspace).deleteRule('cascade'),
    name: p.string().length(160),
    state: p.enum([...STUDY_STATES]).default('draft'),
    /**
     * The design as saved through the builder's schema (or an import's); frozen once the study
     * goes live. Read it with `readDesign` (lib/schemas/study.schema.ts), which validates it and
     * fills the defaults of fields added since it was stored.
     */
    design: p.json<StudyDesign>(),
    /** Exclusion rules in force for results and exports. */
    exclusionRules: p.json<Record<string, unknown>>().nullable(),
    /** Bumped whenever the data behind results change (answers, imports, rules); keys cached fits. */
    dataVersion: p.integer().default(0),
    copiedFrom: p.uuid().nullable(),
    createdBy: p.manyToOne(User).nullable().deleteRule('set null'),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
    launchedAt: p.datetime().nullable(),
    /** Days respondents' data is kept after closing, frozen at launch (what the consent screen told them). */
    retentionDays: p.integer().nullable(),
    /** When the daily purge deleted the respondents of this closed study (lib/server/studies/retention.ts). */
    purgedAt: p.datetime().nullable(),
    closedAt: p.datetime().nullable(),
  }),
});
export type IStudy = InferEntity<typeof Study>;
