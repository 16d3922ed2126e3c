import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { ChildProcess } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import type pg from 'pg';
import { trialsPerRespondent } from '@/lib/schemas/study.schema';
import { startApp, stopApp } from '../../scripts/load/app';
import { request, respondentPaths } from '../../scripts/load/respondent-client';
import { createLoadStudy, loadDesign, type LoadStudy } from '../../scripts/load/study';
import { crowd, expectNothingLost, faultsPool } from './support/respondents';

const bases = inject('appPorts').map((p) => `http://127.0.0.1:${p}`);

describe('two `next start` instances against one database, respondents alternating between them per request', () => {
  let apps: ChildProcess[] = [];
  let pool: pg.Pool;
  let study: LoadStudy;
  beforeAll(async () => {
    // The same environment (one AUTH_SECRET, one DATABASE_URL) on both, as behind a load balancer.
    apps = await Promise.all(inject('appPorts').map((p) => startApp(inject('faultsEnv'), p)));
    pool = faultsPool();
    study = await createLoadStudy(pool, { design: loadDesign(1), seats: 300, name: 'Faults: two instances (simulated)' });
  });
  afterAll(async () => {
    await pool?.end();
    await Promise.all(apps.map((a) => stopApp(a)));
  });

  it('stores every answer once and uses one seat per complete', async () => {
    const { stats, done } = crowd(study, bases);
    const { failures } = await done;
    await expectNothingLost(pool, study, stats, failures, { respondents: 200, trialsEach: trialsPerRespondent(study.design).total });
  });

  it('a retried batch that lands on the other instance is the same batch, and a close is seen by both at once', async () => {
    const [a, b] = bases;
    const paths = respondentPaths(study.linkToken);
    const s = (await request(a, 'POST', paths.start, { consent: true, segmentAnswers: { household: '1' } })).body as { resumeToken: string; upcoming: { idx: number; kind: string }[] };
    const h = { 'x-resume-token': s.resumeToken };
    const batch = [0, 1].map((idx) => ({ clientId: randomUUID(), idx, answer: 1, responseMs: 700 }));
    const ids = batch.map((x) => x.clientId);
    const first = await request(a, 'POST', paths.answers, { answers: batch }, h);
    expect(first.status).toBe(200);
    expect((first.body as { acknowledged: string[] }).acknowledged.sort()).toEqual([...ids].sort());
    // Both instances now hold this respondent in their plan cache; B acknowledges A's rows.
    const retried = await request(b, 'POST', paths.answers, { answers: batch }, h);
    expect((retried.body as { acknowledged: string[] }).acknowledged.sort()).toEqual([...ids].sort());
    // Another answer for trial 1 is a conflict (dropped by the phone), the next trial is stored.
    const other = { clientId: randomUUID(), idx: 1, answer: 0, responseMs: 700 };
    const next = { clientId: randomUUID(), idx: 2, answer: 1, responseMs: 700 };
    const mixed = await request(b, 'POST', paths.answers, { answers: [other, next] }, h);
    expect(mixed.status).toBe(200);
    expect(mixed.body).toMatchObject({ acknowledged: [next.clientId], conflicts: [other.clientId], answered: 3 });
    const stored = await pool.query('select idx, client_id from trial t join respondent r on r.id = t.respondent_id where r.resume_token = $1 order by idx', [s.resumeToken]);
    expect(stored.rows.map((r) => r.client_id)).toEqual([...ids, next.clientId]);

    await pool.query(`update study set state = 'closed', closed_at = now() where id = $1`, [study.studyId]);
    for (const base of bases) {
      const r = await request(base, 'POST', paths.answers, { answers: [{ clientId: randomUUID(), idx: 3, answer: 1, responseMs: 700 }] }, h);
      expect(r.status).toBe(410);
      expect((await request(base, 'POST', paths.complete, {}, h)).status).toBe(410);
      expect((await request(base, 'POST', paths.start, { consent: true, segmentAnswers: { household: '1' } })).status).toBe(410);
    }
  });
});
