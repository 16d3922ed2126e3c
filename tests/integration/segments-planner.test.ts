import { beforeAll, describe, expect, it } from 'vitest';
import { GET as segmentsGet } from '@/app/api/w/[workspace]/studies/[study]/results/segments/route';
import { GET as plannerGet } from '@/app/api/w/[workspace]/studies/[study]/planner/route';
import { chiSquareP } from '@/lib/psychometrics/chi2';
import { em } from '@/lib/server/db/orm';
import { handleJob } from '@/lib/server/platform/job-handlers';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { fitNow, makeSimulatedStudy } from '../support/studies';

/** Runs whatever the route queued for this study (the worker's part). */
async function runQueued(studyId: string, kind: string) {
  const rows = await (await em()).execute<{ cache_key: string; data_version: number }[]>(
    "select cache_key, data_version from analysis_result where study_id = ? and kind = ? and status = 'queued'", [studyId, kind]);
  return rows;
}

describe('segment comparison and sample-size planner jobs', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug, { sim: { respondents: 60 } }));
    await fitNow(studyId);
  });

  it('segments: pending, then thresholds and Weber slope per answer group with the LR test', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    const params = { workspace: ws.slug, study: studyId };
    const url = 'http://127.0.0.1/x?question=shop_often';
    expect((await (await callRoute(segmentsGet, { params, url })).json()).status).toBe('pending');
    const [row] = await runQueued(studyId, 'segments');
    await handleJob({ studyId, kind: 'segments', cacheKey: row.cache_key, dataVersion: row.data_version, questionId: 'shop_often' }, true);
    const done = await (await callRoute(segmentsGet, { params, url })).json();
    expect(done.status).toBe('ready');
    expect(done.result.groups.map((g: { label: string }) => g.label)).toEqual(['Every month', 'A few times a year', 'Rarely']);
    expect(done.result.groups[0].thresholds).toHaveLength(5);
    // The route returns the engine's likelihood-ratio test: p is the χ² tail of its statistic.
    expect(done.result.test.df).toBeGreaterThan(0);
    // Every respondent carries an id, so p comes from permuting whole shoppers between the
    // answer groups (200 permutations: p is a whole number of 201sts), not from the χ² tail.
    expect(done.result.test.method).toMatch(/permutation test over shoppers \(200 random reassignments/);
    expect(Math.abs(done.result.test.p * 201 - Math.round(done.result.test.p * 201))).toBeLessThan(1e-9);
    expect(done.result.test.p).toBeGreaterThan(0);
    expect(done.result.test.p).toBeLessThanOrEqual(1);
    expect(done.result.test.chi2).toBeGreaterThanOrEqual(0);
    expect(chiSquareP(done.result.test.chi2, done.result.test.df)).not.toBeNull();
    const bad = await callRoute(segmentsGet, { params, url: 'http://127.0.0.1/x?question=nope' });
    expect(bad.status).toBe(422);
  });

  it('planner: completes needed per base price for a chosen interval width', async () => {
    signInAs(ws.owner);
    const params = { workspace: ws.slug, study: studyId };
    expect((await callRoute(plannerGet, { params, url: 'http://127.0.0.1/x?width=0' })).status).toBe(422);
    const url = 'http://127.0.0.1/x?width=3';
    expect((await (await callRoute(plannerGet, { params, url })).json()).status).toBe('pending');
    const rows = await (await em()).execute<{ cache_key: string; data_version: number }[]>(
      "select cache_key, data_version from analysis_result where study_id = ? and kind = 'planner'", [studyId]);
    const job = await (await em()).execute<{ data: Record<string, unknown> }[]>(
      "select data from pgboss.job where name = 'planner' and data->>'studyId' = ? order by created_on desc limit 1", [studyId]);
    await handleJob({ ...(job[0].data as object), studyId, kind: 'planner', cacheKey: rows[0].cache_key, dataVersion: rows[0].data_version } as never, true);
    const done = await (await callRoute(plannerGet, { params, url })).json();
    expect(done.status).toBe('ready');
    expect(done.result.bases).toHaveLength(5);
    for (const b of done.result.bases) {
      expect(b.respondents === null || b.respondents >= 1).toBe(true);
      if (b.respondents !== null) expect(b.more).toBe(Math.max(0, b.respondents - done.result.currentCompletes));
    }
    // Cheap items have wider intervals in points, so they need at least as many completes as dear ones.
    const first = done.result.bases[0].respondents ?? Infinity, last = done.result.bases[4].respondents ?? Infinity;
    expect(first).toBeGreaterThanOrEqual(last);
  });
});
