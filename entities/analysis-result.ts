import { randomUUID } from 'node:crypto';
import { defineEntity, type InferEntity } from '@mikro-orm/core';
import { Study } from './study';

/** A cached computation (fit, planner) for one study data version and one set of options. */
export const AnalysisResult = defineEntity({
  name: 'AnalysisResult',
  tableName: 'analysis_result',
  uniques: [{ name: 'analysis_result_cache_unique', properties: ['study', 'kind', 'cacheKey'] }],
  properties: (p) => ({
    id: p.uuid().primary().onCreate(() => randomUUID()),
    study: p.manyToOne(Study).deleteRule('cascade'),
    kind: p.string().length(32),
    /** Hash of data version + options. */
    cacheKey: p.string().length(64),
    dataVersion: p.integer(),
    status: p.enum(['queued', 'running', 'done', 'failed']).default('queued'),
    result: p.json<Record<string, unknown>>().nullable().lazy(),
    error: p.text().nullable(),
    createdAt: p.datetime().onCreate(() => new Date()),
    updatedAt: p.datetime().onCreate(() => new Date()).onUpdate(() => new Date()),
  }),
});
export type IAnalysisResult = InferEntity<typeof AnalysisResult>;
