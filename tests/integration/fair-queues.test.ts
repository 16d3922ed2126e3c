import { beforeAll, describe, expect, it } from 'vitest';
import { GET as plannerGet } from '@/app/api/w/[workspace]/studies/[study]/planner/route';
import { em } from '@/lib/server/db/orm';
import { MAX_WAITING_PER_WORKSPACE } from '@/lib/server/platform/jobs';
import { PLANNER_WIDTHS } from '@/lib/schemas/results.schema';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { fitNow, makeSimulatedStudy } from '../support/studies';

// Issue 13, finding 11: any viewer could queue a planner simulation per typed width on the queue
// every workspace shares (one workspace's planner went from 3.6 s to 21 s for the others).
// Widths now come from a fixed set, repeats of one computation are one job, and a workspace may
// have only MAX_WAITING_PER_WORKSPACE computations waiting at once.

const plannerRows = async (studyId: string) =>
  (await (await em()).fork().getConnection().execute<{ n: number }[]>("select count(*)::int as n from analysis_result where study_id = ? and kind = 'planner'", [studyId]))[0].n;
const plannerJobs = async (studyId: string, state?: string) =>
  (await (await em()).fork().getConnection().execute<{ n: number }[]>(
    `select count(*)::int as n from pgboss.job where name = 'planner' and data->>'studyId' = ?${state ? ' and state = ?' : ''}`,
    state ? [studyId, state] : [studyId],
  ))[0].n;

describe('fair queues', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug, { sim: { respondents: 40 } }));
    await fitNow(studyId);
  }, 120_000);

  const plan = (width: string) => callRoute(plannerGet, { params: { workspace: ws.slug, study: studyId }, url: `http://127.0.0.1/x?width=${width}` });

  it('a width outside the fixed set is a 422 naming the choices, and queues nothing', async () => {
    signInAs(await makeMember(ws.slug, 'viewer'));
    for (const w of ['2.01', '2.02', '7', '49.9']) {
      const res = await plan(w);
      expect(res.status, w).toBe(422);
      expect((await res.json()).error.message).toMatch(/Choose one of 0\.5, 1, 1\.5, 2/);
    }
    expect(await plannerRows(studyId)).toBe(0);
    expect(PLANNER_WIDTHS).toContain(2);
  });

  it('the same width asked many times at once is one computation and one job', async () => {
    signInAs(ws.owner);
    const answers = await Promise.all(Array.from({ length: 6 }, () => plan('2')));
    for (const a of answers) expect(a.status).toBe(200);
    expect(await plannerRows(studyId)).toBe(1);
    // One job waits at most. Under `npm test` the test app's own worker may take the first job
    // while the other asks arrive; the queue's singleton rule then lets one more wait (pg-boss
    // 'short' collapses only jobs not yet started) — never one per ask.
    expect(await plannerJobs(studyId, 'created')).toBeLessThanOrEqual(1);
    const jobs = await plannerJobs(studyId);
    expect(jobs).toBeGreaterThanOrEqual(1);
    expect(jobs).toBeLessThanOrEqual(2);
  });

  it(`a workspace with ${MAX_WAITING_PER_WORKSPACE} computations waiting gets 429 for a new one; another workspace is not held up`, async () => {
    signInAs(ws.owner);
    const widths = PLANNER_WIDTHS.filter((w) => w !== 2);
    const statuses: number[] = [];
    for (const w of widths) statuses.push((await plan(String(w))).status);
    // The fit row is done; the first planner row (width 2) and the ones here wait: 8 in all.
    expect(statuses.filter((s) => s === 200)).toHaveLength(MAX_WAITING_PER_WORKSPACE - 1);
    expect(statuses.slice(MAX_WAITING_PER_WORKSPACE - 1).every((s) => s === 429)).toBe(true);
    const refused = await plan(String(widths.at(-1)));
    expect(refused.status).toBe(429);
    expect(refused.headers.get('retry-after')).toBeTruthy();
    expect((await refused.json()).error.message).toMatch(/computations waiting/);
    // Asking again for one already waiting is not refused (it is the same job).
    expect((await plan('2')).status).toBe(200);

    const other = await makeWorkspace();
    const o = await makeSimulatedStudy(other.slug, { sim: { respondents: 40 } });
    await fitNow(o.studyId);
    signInAs(other.owner);
    const res = await callRoute(plannerGet, { params: { workspace: other.slug, study: o.studyId }, url: 'http://127.0.0.1/x?width=2' });
    expect(res.status).toBe(200);
  });
});
