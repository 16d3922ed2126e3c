import { beforeAll, describe, expect, it } from 'vitest';
import { GET, PUT } from '@/app/api/w/[workspace]/studies/[study]/exclusions/route';
import { GET as resultsGet } from '@/app/api/w/[workspace]/studies/[study]/results/route';
import { DEFAULT_EXCLUSION_RULES, type ExclusionRules } from '@/lib/schemas/exclusions.schema';
import { callRoute, makeMember, makeWorkspace, signInAs } from '../support/factories';
import { makeSimulatedStudy } from '../support/studies';
import { DEMO_SIM } from '@/scripts/seed/demo-study';

const off: ExclusionRules = {
  falseAlarms: { enabled: false, maxRate: 0.5 }, attention: { enabled: false },
  speeders: { enabled: false, minMedianMs: 400 }, straightLining: { enabled: false },
};
// 40 simulated respondents: 4 fail the attention check, 3 speed (median < 400 ms), 3 press "yes" throughout.
// Each answers the demo design's test trials (base prices × rungs × repetitions) and its catch trials.
const TRIALS_EACH = DEMO_SIM.basePrices.length * DEMO_SIM.ladder.length * DEMO_SIM.repetitions + DEMO_SIM.catchPerRespondent;

describe('exclusion rules change the counts as stated', () => {
  let ws: Awaited<ReturnType<typeof makeWorkspace>>;
  let studyId: string;
  beforeAll(async () => {
    ws = await makeWorkspace();
    ({ studyId } = await makeSimulatedStudy(ws.slug, { sim: { respondents: 40, careless: { inattentive: 4, speeders: 3, straightLiners: 3 } } }));
  });
  const put = (rules: unknown) => callRoute(PUT, { method: 'PUT', params: { workspace: ws.slug, study: studyId }, body: rules });

  it('defaults apply when the study has no saved rules', async () => {
    signInAs(ws.owner);
    const body = await (await callRoute(GET, { params: { workspace: ws.slug, study: studyId } })).json();
    expect(body.rules).toEqual(DEFAULT_EXCLUSION_RULES);
    expect(body.counts.respondents.before).toBe(40);
    expect(body.counts.trials.before).toBe(40 * TRIALS_EACH);
  });

  it('each rule removes the respondents it names, and the trials with them', async () => {
    signInAs(ws.owner);
    const cases: [Partial<ExclusionRules>, number][] = [
      [{}, 40],
      [{ attention: { enabled: true } }, 36],
      [{ speeders: { enabled: true, minMedianMs: 400 } }, 37],
      [{ straightLining: { enabled: true } }, 37],
      [{ attention: { enabled: true }, speeders: { enabled: true, minMedianMs: 400 }, straightLining: { enabled: true } }, 30],
    ];
    for (const [change, after] of cases) {
      const res = await put({ ...off, ...change });
      expect(res.status).toBe(200);
      const { counts } = await res.json();
      expect(counts.respondents).toEqual({ before: 40, after });
      expect(counts.trials).toEqual({ before: 40 * TRIALS_EACH, after: after * TRIALS_EACH });
      expect(counts.byRule).toMatchObject({ attention: 4, speeders: 3 });
    }
    // Straight-liners also say "yes" on every one of their 9 catch trials: the false-alarm rule
    // catches them too (9 of 9 is clearly above a 50 % limit: P = 0.5^9 < 5 %). A 90 % limit
    // cannot be shown to be exceeded on 9 catch trials (0.9^9 = 0.39), so it excludes nobody.
    const fa = await (await put({ ...off, falseAlarms: { enabled: true, maxRate: 0.5 } })).json();
    expect(fa.counts.respondents.after).toBeLessThanOrEqual(37);
    const fa90 = await (await put({ ...off, falseAlarms: { enabled: true, maxRate: 0.9 } })).json();
    expect(fa90.counts.respondents.after).toBe(40);
  });

  it('saved rules change the fit key: the results ask for a new fit', async () => {
    signInAs(ws.owner);
    await put(off);
    const a = await (await callRoute(resultsGet, { params: { workspace: ws.slug, study: studyId } })).json();
    expect(a.fit.status).toBe('pending');
    expect(a.study.exclusionRules).toEqual(off);
  });

  it('bad thresholds are a 422 naming the field; viewers may read but not change (403)', async () => {
    signInAs(ws.owner);
    const bad = await put({ ...off, speeders: { enabled: true, minMedianMs: 5 } });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.issues[0].path).toBe('speeders.minMedianMs');
    signInAs(await makeMember(ws.slug, 'viewer'));
    expect((await callRoute(GET, { params: { workspace: ws.slug, study: studyId } })).status).toBe(200);
    expect((await put(DEFAULT_EXCLUSION_RULES)).status).toBe(403);
    const other = await makeWorkspace();
    signInAs(other.owner);
    expect((await callRoute(GET, { params: { workspace: other.slug, study: studyId } })).status).toBe(404);
  });
});
