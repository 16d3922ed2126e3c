import { describe, expect, it } from 'vitest';
import { GET } from '@/app/api/w/[workspace]/studies/[study]/exclusions/route';
import { Study } from '@/entities/study';
import { em } from '@/lib/server/db/orm';
import { DEMO_DESIGN } from '@/scripts/seed/demo-study';
import { callRoute, makeWorkspace, signInAs } from '../support/factories';
import { makeSimulatedStudy } from '../support/studies';

// The same 40 simulated respondents (4 miss the attention check, 3 tap fast at random, 3 say
// "yes" throughout) judged as a spot study and as a pick study: in pick the speed and
// false-alarm rules have no meaning and exclude nobody, and the panel is told why.

describe('exclusion rules by task, through the exclusions route', () => {
  it('spot: every default rule judges; pick: only the attention check (sides were not recorded here)', async () => {
    const ws = await makeWorkspace();
    const sim = { respondents: 40, careless: { inattentive: 4, speeders: 3, straightLiners: 3 } };
    const spot = await makeSimulatedStudy(ws.slug, { sim, name: 'As spot' });
    const pick = await makeSimulatedStudy(ws.slug, { sim, name: 'As pick' });
    const db = await em();
    await db.nativeUpdate(Study, { id: pick.studyId }, { design: { ...DEMO_DESIGN, name: 'As pick', task: 'pick' } });
    signInAs(ws.owner);
    const read = async (study: string) => (await callRoute(GET, { params: { workspace: ws.slug, study } })).json();
    const s = await read(spot.studyId);
    expect(s.notForTask).toEqual({});
    expect(s.counts.byRule).toMatchObject({ attention: 4, speeders: 3 });
    expect(s.counts.byRule.straightLining).toBeGreaterThanOrEqual(3);
    expect(s.counts.respondents.after).toBeLessThanOrEqual(30);
    const p = await read(pick.studyId);
    expect(Object.keys(p.notForTask).sort()).toEqual(['falseAlarms', 'speeders']);
    expect(p.notForTask.falseAlarms).toMatch(/no catch trials/);
    expect(p.counts.byRule).toEqual({ attention: 4, falseAlarms: 0, speeders: 0, straightLining: 0 });
    expect(p.counts.respondents.after).toBe(36);
  });
});
