// The results route's Weber verdict support: with two respondents the verdict is undecided, the
// route queues the planner's count of completes that would tell, and the worker's job fills it;
// a study with enough shoppers queues nothing. (The sentence itself: tests/unit/results-text.test.ts.)
import { beforeAll, describe, expect, it } from 'vitest';
import { GET as resultsGet } from '@/app/api/w/[workspace]/studies/[study]/results/route';
import { Study } from '@/entities/study';
import { em } from '@/lib/server/db/orm';
import { readCache } from '@/lib/server/analysis/cache';
import { handleJob } from '@/lib/server/platform/job-handlers';
import { MIN_SHOPPERS_TO_TELL, weberVerdict } from '@/lib/results-text';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';
import { fitNow, makeSimulatedStudy } from '../support/studies';

const RULES_OFF = { falseAlarms: { enabled: false, maxRate: 0.5 }, attention: { enabled: false }, speeders: { enabled: false, minMedianMs: 400 }, straightLining: { enabled: false } };

async function study(slug: string, respondents: number) {
  const { studyId } = await makeSimulatedStudy(slug, { sim: { respondents }, name: `Verdict ${respondents}` });
  const db = await em();
  await db.nativeUpdate(Study, { id: studyId }, { exclusionRules: RULES_OFF });
  await fitNow(studyId);
  return studyId;
}

describe('results route: how many completes would tell the Weber verdict', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  beforeAll(async () => { ws = await makeWorkspace(); });

  it('two respondents: undecided, the planner job is queued and then gives a count', async () => {
    const studyId = await study(ws.slug, 2);
    signInAs(ws.owner);
    const params = { workspace: ws.slug, study: studyId };
    const first = await (await callRoute(resultsGet, { params })).json();
    expect(first.fit.status).toBe('ready');
    expect(first.counts.respondents.after).toBe(2);
    expect(first.weberPlan.status === 'pending' || first.weberPlan.status === 'ready').toBe(true);
    const rows = await (await em()).execute<{ cache_key: string; data_version: number }[]>(
      "select cache_key, data_version from analysis_result where study_id = ? and kind = 'weber-plan'", [studyId]);
    expect(rows).toHaveLength(1);
    const job = await (await em()).execute<{ data: Record<string, unknown> }[]>(
      "select data from pgboss.job where name = 'planner' and data->>'kind' = 'weber-plan' and data->>'studyId' = ? limit 1", [studyId]);
    await handleJob({ ...(job[0].data as object), studyId, kind: 'weber-plan', cacheKey: rows[0].cache_key, dataVersion: rows[0].data_version } as never, true);
    for (let i = 0; i < 600 && (await readCache(studyId, 'weber-plan', rows[0].cache_key))?.status !== 'done'; i++) await new Promise((r) => setTimeout(r, 100));
    const done = await (await callRoute(resultsGet, { params })).json();
    expect(done.weberPlan.status).toBe('ready');
    const completes = done.weberPlan.completes as number | null;
    expect(completes === null || completes >= MIN_SHOPPERS_TO_TELL).toBe(true);
    const v = weberVerdict(done.fit.report as AnalysisReport, { shoppers: 2, completesToTell: completes ?? Infinity }, (x) => x.toFixed(2));
    expect(v.kind).toBe('undecided');
    expect(v.sentence).toMatch(/^The data cannot tell yet whether one percentage rule fits/);
  }, 180_000);

  it('sixty respondents of a clear category: a verdict, nothing queued', async () => {
    const studyId = await study(ws.slug, 60);
    signInAs(ws.owner);
    const res = await (await callRoute(resultsGet, { params: { workspace: ws.slug, study: studyId } })).json();
    expect(res.fit.status).toBe('ready');
    expect(res.weberPlan.status).toBe('none');
    const rows = await (await em()).execute("select 1 from analysis_result where study_id = ? and kind = 'weber-plan'", [studyId]);
    expect(rows).toHaveLength(0);
  }, 180_000);
});
