// Test studies with simulated responses, written through the same bulk writer as the demo seed.
import { randomUUID } from 'node:crypto';
import { RespondentLink } from '@/entities/respondent-link';
import { Study } from '@/entities/study';
import { Workspace } from '@/entities/workspace';
import type { StudyStateName } from '@/lib/study-states';
import type { StudyDesign } from '@/lib/schemas/study.schema';
import { em } from '@/lib/server/db/orm';
import { DEMO_DESIGN, DEMO_SIM } from '@/scripts/seed/demo-study';
import { insertRespondents, simulateRespondents, type SimParams } from '@/scripts/seed/simulate-responses';

export async function makeSimulatedStudy(workspaceSlug: string, opts: { state?: StudyStateName; sim?: Partial<SimParams>; name?: string; withLinks?: boolean; design?: Partial<StudyDesign>; closedAt?: Date } = {}) {
  const db = await em();
  const ws = await db.findOneOrFail(Workspace, { slug: workspaceSlug });
  const name = opts.name ?? 'Simulated study';
  return db.transactional(async (tx) => {
    const study = tx.create(Study, { workspace: ws.id, name, state: opts.state ?? 'closed', design: { ...DEMO_DESIGN, ...opts.design, name }, exclusionRules: null, dataVersion: 1, closedAt: opts.closedAt ?? null });
    const link = opts.withLinks === false ? null : tx.create(RespondentLink, { workspace: ws.id, study, token: randomUUID().replace(/-/g, ''), source: 'Panel B', acceptsPid: false });
    await tx.flush();
    const sim: SimParams = { ...DEMO_SIM, respondents: 40, seed: `test-${study.id}`, ...opts.sim };
    await insertRespondents(tx, { workspaceId: ws.id, studyId: study.id, respondents: simulateRespondents(sim), linkIds: link ? [link.id] : [] });
    return { studyId: study.id, workspaceId: ws.id };
  });
}

/** Runs the fit job for the study's current data version and rules (what the worker would do). */
export async function fitNow(studyId: string, opts: { segment?: { questionId: string; answer: string } | null } = {}) {
  const { fitCacheKey, runFitJob } = await import('@/lib/server/analysis/study-fit');
  const { toDetail } = await import('@/lib/server/studies/studies');
  const db = await em();
  const s = toDetail(await db.findOneOrFail(Study, { id: studyId }, { refresh: true }));
  const { cacheKey } = fitCacheKey(s, opts);
  const { requestComputation } = await import('@/lib/server/analysis/cache');
  await requestComputation({ studyId, kind: 'fit', cacheKey, dataVersion: s.dataVersion, queue: 'analysis', payload: { segment: opts.segment ?? null, target: null } });
  await runFitJob({ studyId, kind: 'fit', cacheKey, dataVersion: s.dataVersion, segment: opts.segment ?? null, target: null });
  // The test app's own worker watches the same queue and may have claimed the job first; then
  // the fit finishes there. Either way the cached row ends 'done' (or 'failed'): wait for that.
  const { readCache } = await import('@/lib/server/analysis/cache');
  for (let i = 0; i < 600; i++) {
    const row = await readCache(studyId, 'fit', cacheKey);
    if (row && (row.status === 'done' || row.status === 'failed')) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`the fit of study ${studyId} did not finish within 60 s`);
}

/** A multipart body with one file field, as a browser sends it. */
export async function multipart(text: string | Uint8Array, fields: Record<string, string> = {}) {
  const fd = new FormData();
  fd.set('file', new Blob([text as BlobPart], { type: 'text/csv' }), 'responses.csv');
  for (const [k, v] of Object.entries(fields)) fd.set(k, v);
  const r = new Response(fd);
  return { rawBody: new Uint8Array(await r.arrayBuffer()), headers: { 'content-type': r.headers.get('content-type')! } };
}
