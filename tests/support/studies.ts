// Test studies with simulated responses, inserted straight into the tables.
import { randomUUID } from 'node:crypto';
import { em } from '@/lib/server/db/orm';
import { DEMO_DESIGN, DEMO_SIM } from '@/scripts/seed/demo-study';
import { insertRespondents, simulateRespondents, type SimParams } from '@/scripts/seed/simulate-responses';

export async function makeSimulatedStudy(workspaceSlug: string, opts: { state?: string; sim?: Partial<SimParams>; name?: string; withLinks?: boolean } = {}) {
  const db = await em();
  const [ws] = await db.execute<{ id: string }[]>('select id from workspace where slug = ?', [workspaceSlug]);
  const studyId = randomUUID();
  const sim: SimParams = { ...DEMO_SIM, respondents: 40, seed: `test-${studyId}`, ...opts.sim };
  const knex = db.getKnex();
  const linkId = randomUUID();
  await knex.transaction(async (trx) => {
    await trx('study').insert({
      id: studyId, workspace_id: ws.id, name: opts.name ?? 'Simulated study', state: opts.state ?? 'closed',
      design: JSON.stringify({ ...DEMO_DESIGN, name: opts.name ?? 'Simulated study' }), exclusion_rules: null, data_version: 1,
      created_at: new Date(), updated_at: new Date(),
    });
    if (opts.withLinks !== false) {
      await trx('respondent_link').insert({ id: linkId, workspace_id: ws.id, study_id: studyId, token: randomUUID().replace(/-/g, ''), source: 'Panel B', accepts_pid: false, created_at: new Date() });
    }
    await insertRespondents(db, trx, { workspaceId: ws.id, studyId, respondents: simulateRespondents(sim), linkIds: opts.withLinks === false ? [] : [linkId] });
  });
  return { studyId, workspaceId: ws.id };
}

/** Runs the fit job for the study's current data version and rules (what the worker would do). */
export async function fitNow(studyId: string, opts: { segment?: { questionId: string; answer: string } | null } = {}) {
  const { fitCacheKey, runFitJob } = await import('@/lib/server/analysis/study-fit');
  const { Study } = await import('@/entities/study');
  const { toStudyInfo } = await import('@/lib/server/analysis/cells');
  const db = await em();
  const s = toStudyInfo(await db.findOneOrFail(Study, { id: studyId }, { refresh: true }));
  const { cacheKey } = fitCacheKey(s, opts);
  const { requestComputation } = await import('@/lib/server/analysis/cache');
  await requestComputation(db, { studyId, kind: 'fit', cacheKey, dataVersion: s.dataVersion, queue: 'analysis', payload: { segment: opts.segment ?? null, target: null } });
  await runFitJob({ studyId, kind: 'fit', cacheKey, dataVersion: s.dataVersion, segment: opts.segment ?? null, target: null });
}

/** A multipart body with one file field, as a browser sends it. */
export async function multipart(text: string | Uint8Array, fields: Record<string, string> = {}) {
  const fd = new FormData();
  fd.set('file', new Blob([text as BlobPart], { type: 'text/csv' }), 'responses.csv');
  for (const [k, v] of Object.entries(fields)) fd.set(k, v);
  const r = new Response(fd);
  return { rawBody: new Uint8Array(await r.arrayBuffer()), headers: { 'content-type': r.headers.get('content-type')! } };
}
