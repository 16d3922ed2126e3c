import { beforeAll, describe, expect, it } from 'vitest';
import { fitCacheKey, getFitState, getStudyFit, listFittableStudies, runFitJob } from '@/lib/server/analysis/study-fit';
import { authorise } from '@/lib/server/team/membership';
import { em } from '@/lib/server/db/orm';
import { chiSquareP } from '@/lib/psychometrics/chi2';
import { findStudy } from '@/lib/server/analysis/cells';
import { makeWorkspace, signInAs } from '../support/factories';
import { makeSimulatedStudy } from '../support/studies';

describe('getStudyFit: queued job, cached result, workspace scope', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let other: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    other = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug));
  });

  it('is pending first, ready after the job ran, and flags poor fits', async () => {
    signInAs(ws.owner);
    const ctx = await authorise(ws.owner, ws.slug, 'viewer');
    const first = await getStudyFit(ctx, studyId);
    expect(first.status).toBe('pending');
    const study = await findStudy(await em(), ctx.workspace.id, studyId);
    const { cacheKey } = fitCacheKey(study, {});
    await runFitJob({ studyId, kind: 'fit', cacheKey, dataVersion: study.dataVersion, segment: null, target: null });
    const state = await getFitState(ctx, studyId);
    expect(state.fit.status).toBe('ready');
    if (state.fit.status !== 'ready') return;
    expect(state.fit.report.bases).toHaveLength(5);
    expect(state.fit.basePrices).toEqual([3.49, 12.99, 39, 129, 449]);
    expect(state.fit.report.bootstrapSamples).toBe(1000);
    // The poor-fit flag follows its rule: a base judged a poor fit, or the preferred joint model's deviance p < 0.05.
    const preferred = state.fit.report.models[state.fit.report.preferredModel];
    // (its Monte-Carlo deviance p-value when the engine computed one, else the χ² tail)
    expect(preferred.devianceMonteCarloP).not.toBeUndefined();
    const jointP = preferred.devianceMonteCarloP ?? chiSquareP(preferred.deviance, preferred.devianceDf);
    expect(state.fit.poorFit).toBe(state.fit.report.bases.some((b) => b.verdict === 'poor fit') || (jointP !== null && jointP < 0.05));
    expect(state.counts!.respondents.before).toBe(40);
    expect(state.counts!.respondents.after).toBeLessThan(40);
  });

  it('a foreign study is a 404; fittable studies are listed per workspace', async () => {
    const ctxOther = await authorise(other.owner, other.slug, 'viewer');
    await expect(getStudyFit(ctxOther, studyId)).rejects.toMatchObject({ status: 404 });
    expect(await listFittableStudies(ctxOther)).toEqual([]);
    const ctx = await authorise(ws.owner, ws.slug, 'viewer');
    const list = await listFittableStudies(ctx);
    expect(list.map((s) => s.id)).toEqual([studyId]);
    expect(list[0].segmentQuestions[0].id).toBe('shop_often');
  });
});
